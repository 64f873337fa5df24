// GET …/revisions/:revisionId/download — a short-lived presigned URL for the PDF, after the access check.
import type { Route } from "./+types/api.projects.$projectId.drawings.$drawingId.revisions.$revisionId.download";
import { revisionDownloadUrl } from "~/drawings/files.server";
import { forApi } from "~/drawings/http.server";
import { requireApiProjectAction } from "~/projects/projects.server";

export async function loader({ context, params }: Route.LoaderArgs) {
  const { project } = await requireApiProjectAction(context, params.projectId, "drawings.view");
  return forApi(async () => Response.json(await revisionDownloadUrl(project.id, params.drawingId, params.revisionId), { headers: { "Cache-Control": "no-store" } }));
}
