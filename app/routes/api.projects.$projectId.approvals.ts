// GET /api/projects/:projectId/approvals — every approval version of the project with its state and conditions.
import type { Route } from "./+types/api.projects.$projectId.approvals";
import { listApprovals } from "~/approvals/site.server";
import { requireApiProjectAction } from "~/projects/projects.server";

export async function loader({ context, params, request }: Route.LoaderArgs) {
  const { project } = await requireApiProjectAction(context, params.projectId, "approvals.view");
  const currentOnly = new URL(request.url).searchParams.get("state") === "current";
  return Response.json({ approvals: await listApprovals(project.id, { currentOnly }) });
}
