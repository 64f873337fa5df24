// GET /projects/:projectId/drawings/csv — the register as CSV, one row per sheet with its current revision.
import type { Route } from "./+types/projects.$projectId.drawings.csv";
import { registerCsv } from "~/drawings/export.server";
import { requireProjectAction } from "~/projects/projects.server";

export async function loader({ context, request }: Route.LoaderArgs) {
  const { project } = requireProjectAction(context, request, "drawings.view");
  const csv = await registerCsv(project.id);
  const date = new Date().toISOString().slice(0, 10);
  return new Response(csv, {
    headers: {
      "Content-Type": "text/csv; charset=utf-8",
      "Content-Disposition": `attachment; filename="register-${date}.csv"`,
      "Cache-Control": "private, no-store",
    },
  });
}
