// GET /api/projects/:projectId/drawings[?limit=&after=] — the register: sheets in sheet-number order with their
// current revision and history, a page at a time (limit 1–500, default 100). `next` is the cursor for the
// following page (pass it as `after`), null on the last page.
import type { Route } from "./+types/api.projects.$projectId.drawings";
import { forApi } from "~/drawings/http.server";
import { listRegister } from "~/drawings/register.server";
import { requireApiProjectAction } from "~/projects/projects.server";

export async function loader({ context, params, request }: Route.LoaderArgs) {
  const { project } = await requireApiProjectAction(context, params.projectId, "drawings.view");
  const q = new URL(request.url).searchParams;
  const limit = Math.min(500, Math.max(1, Math.trunc(Number(q.get("limit"))) || 100));
  return forApi(async () => {
    const drawings = await listRegister(project.id, { limit: limit + 1, after: q.get("after") });
    const page = drawings.slice(0, limit);
    return Response.json({ drawings: page, next: drawings.length > limit ? page.at(-1)!.sheetNumber : null });
  });
}
