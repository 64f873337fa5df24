// GET /projects/:projectId/drawings/:drawingId/revisions/:revisionId/file — the PDF, for members only,
// streamed from object storage with Range support (the viewer reads big sheets in pieces).
import type { Route } from "./+types/projects.$projectId.drawings.$drawingId.revisions.$revisionId.file";
import { serveRevisionFile } from "~/drawings/files.server";
import { forApi } from "~/drawings/http.server";
import { requireProjectAction } from "~/projects/projects.server";

export async function loader({ context, request, params }: Route.LoaderArgs) {
  const { project } = requireProjectAction(context, request, "drawings.view");
  return forApi(() => serveRevisionFile(request, project.id, params.drawingId, params.revisionId));
}
