// GET /projects/:projectId/requests/:requestId/attachments/:attachmentId[?size=thumb] — the file, to members only.
import type { Route } from "./+types/projects.$projectId.requests.$requestId.attachments.$attachmentId";
import { attachmentResponse } from "~/requests/attachments.server";
import { forPage } from "~/requests/http.server";
import { requireProjectAction } from "~/projects/projects.server";

export async function loader({ context, request, params }: Route.LoaderArgs) {
  const { project, user } = requireProjectAction(context, request, "requests.view");
  const thumb = new URL(request.url).searchParams.get("size") === "thumb";
  return forPage(() => attachmentResponse(project.id, params.requestId, params.attachmentId, thumb, user.id));
}
