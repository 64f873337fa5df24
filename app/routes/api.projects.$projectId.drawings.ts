// GET /api/projects/:projectId/drawings — the register: every sheet with its current revision and history.
import type { Route } from "./+types/api.projects.$projectId.drawings";
import { forApi } from "~/drawings/http.server";
import { listRegister } from "~/drawings/register.server";
import { requireApiProjectAction } from "~/projects/projects.server";

export async function loader({ context, params }: Route.LoaderArgs) {
  const { project } = await requireApiProjectAction(context, params.projectId, "drawings.view");
  return forApi(async () => Response.json({ drawings: await listRegister(project.id) }));
}
