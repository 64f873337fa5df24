// GET /api/projects/:projectId/requests/:requestId — one request (current content, what changed, the moves open
// to me). POST (JSON content) — the requester saves the draft (a new version once the engineer has seen one).
import type { Route } from "./+types/api.projects.$projectId.requests.$requestId";
import { forApi, readBody } from "~/requests/http.server";
import { getRequest, saveContent } from "~/requests/requests.server";
import { requireApiProjectAction } from "~/projects/projects.server";

export async function loader({ context, params }: Route.LoaderArgs) {
  const { project, role, user } = await requireApiProjectAction(context, params.projectId, "requests.view");
  return forApi(async () => Response.json({ request: await getRequest(project.id, params.requestId, { id: user.id, role }) }));
}

export async function action({ context, params, request }: Route.ActionArgs) {
  const { project, role, user } = await requireApiProjectAction(context, params.projectId, "requests.raise");
  return forApi(async () => {
    const saved = await saveContent({ ...user, role }, project.id, params.requestId, await readBody(request));
    return Response.json({ saved, request: await getRequest(project.id, params.requestId, { id: user.id, role }) });
  });
}
