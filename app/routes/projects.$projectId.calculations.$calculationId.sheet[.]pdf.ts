// GET /projects/:projectId/calculations/:calculationId/sheet.pdf — the one-page calculation sheet.
import type { Route } from "./+types/projects.$projectId.calculations.$calculationId.sheet[.]pdf";
import { getCalculation } from "~/calculations/calculations.server";
import { forPage } from "~/calculations/http.server";
import { calculationSheet } from "~/calculations/sheet.server";
import { requireProjectAction } from "~/projects/projects.server";

export async function loader({ context, request, params }: Route.LoaderArgs) {
  const { project } = requireProjectAction(context, request, "calculations.run");
  const calculation = await forPage(() => getCalculation(project.id, params.calculationId));
  const bytes = await calculationSheet(calculation, { projectName: project.name, siteAddress: project.siteAddress });
  const name = calculation.title.replace(/[^A-Za-z0-9._-]+/g, "-").replace(/^-+|-+$/g, "").slice(0, 80) || "calculation";
  return new Response(Buffer.from(bytes), {
    headers: {
      "content-type": "application/pdf",
      "content-disposition": `attachment; filename="${name}.pdf"`,
      "cache-control": "private, no-store",
    },
  });
}
