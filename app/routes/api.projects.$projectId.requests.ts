// GET /api/projects/:projectId/requests?state=&provision=&assignee=&overdue=1&page=&limit= — the project's requests,
// counts per state, what needs my action first; a page at a time (limit 1–200, default 50; `matching` says how many).
// POST (JSON: title, provision, clauseRef, …) — a site plumber starts one.
import type { Route } from "./+types/api.projects.$projectId.requests";
import { forApi, readBody } from "~/requests/http.server";
import { listRequests, readFilter } from "~/requests/lists.server";
import { createDraft, getRequest, saveContent } from "~/requests/requests.server";
import { requireApiProjectAction } from "~/projects/projects.server";

export async function loader({ context, params, request }: Route.LoaderArgs) {
  const { project, user } = await requireApiProjectAction(context, params.projectId, "requests.view");
  return forApi(async () => Response.json(await listRequests(user, readFilter(new URL(request.url)), project.id)));
}

export async function action({ context, params, request }: Route.ActionArgs) {
  const { project, role, user } = await requireApiProjectAction(context, params.projectId, "requests.raise");
  return forApi(async () => {
    const body = await readBody(request);
    const actor = { ...user, role };
    const created = await createDraft(actor, project.id, body);
    // Anything beyond the opening fields (constraint, proposal, measurements) goes into the first version.
    if (body.siteConstraint || body.proposal || body.measurements) await saveContent(actor, project.id, created.id, body);
    return Response.json({ request: await getRequest(project.id, created.id, { id: user.id, role }) }, { status: 201 });
  });
}
