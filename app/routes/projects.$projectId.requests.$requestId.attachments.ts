// POST /projects/:projectId/requests/:requestId/attachments[?for=comment] — one photo or document per request
// (multipart, streamed), answered as JSON for the upload progress bar: 201 stored, 4xx with the reason.
import type { Route } from "./+types/projects.$projectId.requests.$requestId.attachments";
import { receiveAttachment } from "~/requests/attachments.server";
import { forApi } from "~/requests/http.server";
import { apiError } from "~/platform/http.server";
import { requireProjectAction } from "~/projects/projects.server";

export async function action({ context, request, params }: Route.ActionArgs) {
  const { project, role, user } = requireProjectAction(context, request, "requests.view");
  return forApi(async () => Response.json({ attachment: await receiveAttachment(request, { ...user, role }, project.id, params.requestId) }, { status: 201 }));
}

export async function loader() {
  return apiError(405, "Upload with POST.");
}
