// PATCH /api/projects/:projectId/requests/:requestId/markups/:markupId JSON { version, shape } — an engineer changes
// a markup; 409 when someone else changed it first. DELETE (JSON { version } or ?version=) — removes it from view
// (kept on the record).
import type { Route } from "./+types/api.projects.$projectId.requests.$requestId.markups.$markupId";
import { forApi, readBody } from "~/requests/http.server";
import { deleteMarkup, updateMarkup } from "~/review/markups.server";
import { requireApiProjectAction } from "~/projects/projects.server";

export async function action({ context, params, request }: Route.ActionArgs) {
  const { project, role, user } = await requireApiProjectAction(context, params.projectId, "requests.review");
  const actor = { id: user.id, role };
  return forApi(async () => {
    if (request.method === "PATCH") return Response.json({ markup: await updateMarkup(actor, project.id, params.requestId, params.markupId, await readBody(request)) });
    if (request.method === "DELETE") {
      const version = new URL(request.url).searchParams.get("version");
      const body = version !== null || !request.headers.get("content-type") ? { version } : await readBody(request);
      return Response.json({ deleted: await deleteMarkup(actor, project.id, params.requestId, params.markupId, body) });
    }
    return Response.json({ status: 405, message: "Use PATCH to change a markup or DELETE to remove it." }, { status: 405 });
  });
}
