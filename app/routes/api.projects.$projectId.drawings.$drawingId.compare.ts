// GET /api/projects/:projectId/drawings/:drawingId/compare?from=&to=&page= — changed regions, text diff and
// descriptions of two revisions of a sheet.
import type { Route } from "./+types/api.projects.$projectId.drawings.$drawingId.compare";
import { compareRevisions } from "~/drawings/compare.server";
import { forApi } from "~/drawings/http.server";
import { compareQuerySchema } from "~/drawings/schemas";
import { apiError } from "~/platform/http.server";
import { requireApiProjectAction } from "~/projects/projects.server";

export async function loader({ context, params, request }: Route.LoaderArgs) {
  const { project } = await requireApiProjectAction(context, params.projectId, "drawings.view");
  const query = compareQuerySchema.safeParse(Object.fromEntries(new URL(request.url).searchParams));
  if (!query.success) return apiError(400, "Give two revision ids as from and to (and optionally page).");
  return forApi(async () => Response.json(await compareRevisions(project.id, params.drawingId, query.data.from, query.data.to, query.data.page)));
}
