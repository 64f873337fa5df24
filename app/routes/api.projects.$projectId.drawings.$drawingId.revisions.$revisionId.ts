// GET /api/projects/:projectId/drawings/:drawingId/revisions/:revisionId — a revision's metadata.
import type { Route } from "./+types/api.projects.$projectId.drawings.$drawingId.revisions.$revisionId";
import { forApi } from "~/drawings/http.server";
import { getRevision } from "~/drawings/register.server";
import { requireApiProjectAction } from "~/projects/projects.server";

export async function loader({ context, params }: Route.LoaderArgs) {
  const { project } = await requireApiProjectAction(context, params.projectId, "drawings.view");
  return forApi(async () => Response.json({ revision: await getRevision(project.id, params.drawingId, params.revisionId) }));
}
