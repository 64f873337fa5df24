// GET /api/projects/:projectId/calculations — the project's saved calculations (optionally ?kind=).
// POST — save one: `{ kind, title, inputs }`; the server recomputes the outputs (any sent are ignored).
import type { Route } from "./+types/api.projects.$projectId.calculations";
import { listCalculations, saveCalculation } from "~/calculations/calculations.server";
import { forApi } from "~/calculations/http.server";
import { readJsonBody } from "~/platform/body.server";
import { isKind } from "~/calculations/kinds";
import { requireApiProjectAction } from "~/projects/projects.server";

export async function loader({ context, params, request }: Route.LoaderArgs) {
  const { project } = await requireApiProjectAction(context, params.projectId, "calculations.run");
  const kind = new URL(request.url).searchParams.get("kind");
  return forApi(async () => Response.json({ calculations: await listCalculations(project.id, isKind(kind) ? kind : undefined) }));
}

export async function action({ context, params, request }: Route.ActionArgs) {
  const { project, user } = await requireApiProjectAction(context, params.projectId, "calculations.save");
  return forApi(async () => {
    const body = (await readJsonBody(request)) as Record<string, unknown> | null;
    const calculation = await saveCalculation(project.id, user.id, { kind: body?.kind, title: body?.title, inputs: body?.inputs });
    return Response.json({ calculation }, { status: 201 });
  });
}
