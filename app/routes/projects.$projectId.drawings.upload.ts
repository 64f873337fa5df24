// POST /projects/:projectId/drawings/upload — one PDF per request (multipart, streamed), answered as JSON
// for the upload panel: 201 stored, 409 already there, 4xx with the reason, 503 when storage is down.
import type { Route } from "./+types/projects.$projectId.drawings.upload";
import { forApi } from "~/drawings/http.server";
import { receiveUpload } from "~/drawings/uploads.server";
import { apiError } from "~/platform/http.server";
import { can } from "~/projects/permissions";
import { requireProjectAction } from "~/projects/projects.server";

export async function action({ context, request }: Route.ActionArgs) {
  const { user, project, role } = requireProjectAction(context, request, "drawings.view");
  if (!can(role, "drawings.upload")) return apiError(403, "Your role on this project does not allow uploading sheets.");
  return forApi(async () => {
    const outcome = await receiveUpload(request, user, project.id, role);
    return Response.json(outcome, { status: outcome.status });
  });
}

export async function loader() {
  return apiError(405, "Upload with POST.");
}
