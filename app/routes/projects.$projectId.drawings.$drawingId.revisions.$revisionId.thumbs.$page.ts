// GET …/revisions/:revisionId/thumbs/:page — a page thumbnail made by background processing, members only.
import type { Route } from "./+types/projects.$projectId.drawings.$drawingId.revisions.$revisionId.thumbs.$page";
import { serveThumbnail } from "~/drawings/files.server";
import { forApi } from "~/drawings/http.server";
import { requireProjectAction } from "~/projects/projects.server";

export async function loader({ context, request, params }: Route.LoaderArgs) {
  const { project } = requireProjectAction(context, request, "drawings.view");
  return forApi(() => serveThumbnail(project.id, params.drawingId, params.revisionId, Number(params.page)));
}
