// DELETE /api/projects/:projectId/requests/:requestId/pins/:pinId — the requester removes a pin while editable.
import type { Route } from "./+types/api.projects.$projectId.requests.$requestId.pins.$pinId";
import { forApi } from "~/requests/http.server";
import { removePin } from "~/requests/pins.server";
import { requireApiProjectAction } from "~/projects/projects.server";

export async function action({ context, params, request }: Route.ActionArgs) {
  if (request.method !== "DELETE") return Response.json({ status: 405, message: "Use DELETE to remove a pin." }, { status: 405 });
  const { project, role, user } = await requireApiProjectAction(context, params.projectId, "requests.raise");
  return forApi(async () => Response.json({ deleted: await removePin({ ...user, role }, project.id, params.requestId, params.pinId) }));
}
