// GET: the compliance record of an approval, as PDF, for the plumber's certificate of compliance.
import { data } from "react-router";
import type { Route } from "./+types/projects.$projectId.approvals.$approvalId.compliance-record[.]pdf";
import { complianceRecordPdf } from "~/approvals/records.server";
import { SiteError } from "~/approvals/site.server";
import { requireProjectAction } from "~/projects/projects.server";

export async function loader({ context, request, params }: Route.LoaderArgs) {
  const { project } = requireProjectAction(context, request, "approvals.view");
  try {
    const { bytes, filename } = await complianceRecordPdf(project.id, params.approvalId);
    return new Response(Buffer.from(bytes), { headers: { "Content-Type": "application/pdf", "Content-Disposition": `attachment; filename="${filename}"`, "Cache-Control": "private, no-store" } });
  } catch (error) {
    if (error instanceof SiteError) throw data({ message: error.message }, { status: error.status });
    throw error;
  }
}
