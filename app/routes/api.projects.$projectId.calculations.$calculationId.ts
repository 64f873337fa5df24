// GET /api/projects/:projectId/calculations/:calculationId — one saved calculation with inputs and outputs.
import type { Route } from "./+types/api.projects.$projectId.calculations.$calculationId";
import { getCalculation } from "~/calculations/calculations.server";
import { forApi } from "~/calculations/http.server";
import { requireApiProjectAction } from "~/projects/projects.server";

export async function loader({ context, params }: Route.LoaderArgs) {
  const { project } = await requireApiProjectAction(context, params.projectId, "calculations.run");
  return forApi(async () => Response.json({ calculation: await getCalculation(project.id, params.calculationId) }));
}
