// GET /api/projects/:projectId/requests/:requestId/pins — the request's numbered pins (any member who sees it).
// POST JSON { revisionId, page, xPt, yPt } — the requester places the next pin while the request is editable.
import type { Route } from "./+types/api.projects.$projectId.requests.$requestId.pins";
import { forApi, readBody } from "~/requests/http.server";
import { addPin, listPins } from "~/requests/pins.server";
import { requireApiProjectAction } from "~/projects/projects.server";

export async function loader({ context, params }: Route.LoaderArgs) {
  const { project, role, user } = await requireApiProjectAction(context, params.projectId, "requests.view");
  return forApi(async () => Response.json({ pins: await listPins(project.id, params.requestId, { id: user.id, role }) }));
}

export async function action({ context, params, request }: Route.ActionArgs) {
  if (request.method !== "POST") return Response.json({ status: 405, message: "Use POST to place a pin." }, { status: 405 });
  const { project, role, user } = await requireApiProjectAction(context, params.projectId, "requests.raise");
  return forApi(async () => Response.json({ pin: await addPin({ ...user, role }, project.id, params.requestId, await readBody(request)) }, { status: 201 }));
}
