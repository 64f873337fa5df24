// GET /api/projects/:projectId/requests/:requestId/markups[?revisionId=&page=] — the request's markups (any member).
// POST JSON { revisionId, page, shape } — an engineer adds a markup (shape in PDF points, origin top-left).
import type { Route } from "./+types/api.projects.$projectId.requests.$requestId.markups";
import { forApi, readBody } from "~/requests/http.server";
import { createMarkup, listMarkups } from "~/review/markups.server";
import { requireApiProjectAction } from "~/projects/projects.server";

export async function loader({ context, params, request }: Route.LoaderArgs) {
  const { project, role, user } = await requireApiProjectAction(context, params.projectId, "requests.view");
  const q = new URL(request.url).searchParams;
  return forApi(async () =>
    Response.json({ markups: await listMarkups(project.id, params.requestId, { id: user.id, role }, { revisionId: q.get("revisionId"), page: Number(q.get("page")) || null }) }),
  );
}

export async function action({ context, params, request }: Route.ActionArgs) {
  if (request.method !== "POST") return Response.json({ status: 405, message: "Use POST to add a markup." }, { status: 405 });
  const { project, role, user } = await requireApiProjectAction(context, params.projectId, "requests.review");
  return forApi(async () => Response.json({ markup: await createMarkup({ id: user.id, role }, project.id, params.requestId, await readBody(request)) }, { status: 201 }));
}
