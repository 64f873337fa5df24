// GET /api/projects/:projectId/approvals/:approvalId — one approval, its state, and a short-lived pack URL.
import type { Route } from "./+types/api.projects.$projectId.approvals.$approvalId";
import { getApproval, packLink, SiteError } from "~/approvals/site.server";
import { apiError } from "~/platform/http.server";
import { requireApiProjectAction } from "~/projects/projects.server";

export async function loader({ context, params }: Route.LoaderArgs) {
  const { project } = await requireApiProjectAction(context, params.projectId, "approvals.view");
  try {
    const view = await getApproval(project.id, params.approvalId);
    const pack = await packLink(project.id, params.approvalId);
    return Response.json({ approval: view.approval, packSha256: view.packSha256, packBytes: view.packBytes, versions: view.versions, installations: view.installations, pack });
  } catch (error) {
    if (error instanceof SiteError) return apiError(error.status, error.message);
    throw error;
  }
}
