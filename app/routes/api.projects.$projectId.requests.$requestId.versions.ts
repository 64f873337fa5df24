// GET /api/projects/:projectId/requests/:requestId/versions — every version, each with what changed from the last.
import type { Route } from "./+types/api.projects.$projectId.requests.$requestId.versions";
import { forApi } from "~/requests/http.server";
import { getRequest, listVersions } from "~/requests/requests.server";
import { requireApiProjectAction } from "~/projects/projects.server";

export async function loader({ context, params }: Route.LoaderArgs) {
  const { project, role, user } = await requireApiProjectAction(context, params.projectId, "requests.view");
  return forApi(async () => {
    await getRequest(project.id, params.requestId, { id: user.id, role }); // drafts stay their author's
    return Response.json({ versions: await listVersions(project.id, params.requestId) });
  });
}
