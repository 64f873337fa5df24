// GET /projects/:projectId/drawings/:drawingId/overlay?from=&to=&page= — the compare overlay image.
import type { Route } from "./+types/projects.$projectId.drawings.$drawingId.overlay";
import { compareOverlay } from "~/drawings/compare.server";
import { forApi } from "~/drawings/http.server";
import { compareQuerySchema } from "~/drawings/schemas";
import { apiError } from "~/platform/http.server";
import { requireProjectAction } from "~/projects/projects.server";

export async function loader({ context, request, params }: Route.LoaderArgs) {
  const { project } = requireProjectAction(context, request, "drawings.view");
  const query = compareQuerySchema.safeParse(Object.fromEntries(new URL(request.url).searchParams));
  if (!query.success) return apiError(400, "Give two revisions (from, to) and a page.");
  return forApi(() => compareOverlay(project.id, params.drawingId, query.data.from, query.data.to, query.data.page));
}
