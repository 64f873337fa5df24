// GET: the signed pack, after the access check, through a short-lived link straight to storage.
import { data, redirect } from "react-router";
import type { Route } from "./+types/projects.$projectId.approvals.$approvalId.pack";
import { packLink, SiteError } from "~/approvals/site.server";
import { requireProjectAction } from "~/projects/projects.server";

export async function loader({ context, request, params }: Route.LoaderArgs) {
  const { project } = requireProjectAction(context, request, "approvals.view");
  try {
    const { url } = await packLink(project.id, params.approvalId);
    return redirect(url, { headers: { "Cache-Control": "private, no-store" } });
  } catch (error) {
    if (error instanceof SiteError) throw data({ message: error.message }, { status: error.status });
    throw error;
  }
}
