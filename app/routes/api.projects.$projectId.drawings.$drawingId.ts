// GET /api/projects/:projectId/drawings/:drawingId — one sheet and all its revisions.
import type { Route } from "./+types/api.projects.$projectId.drawings.$drawingId";
import { forApi } from "~/drawings/http.server";
import { getDrawing } from "~/drawings/register.server";
import { requireApiProjectAction } from "~/projects/projects.server";

export async function loader({ context, params }: Route.LoaderArgs) {
  const { project } = await requireApiProjectAction(context, params.projectId, "drawings.view");
  return forApi(async () => Response.json({ drawing: await getDrawing(project.id, params.drawingId) }));
}
