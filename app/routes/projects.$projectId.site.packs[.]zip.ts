// GET: every current signed pack of the project in one zip, for use on site without a connection.
import type { Route } from "./+types/projects.$projectId.site.packs[.]zip";
import { currentPacksZip } from "~/approvals/site.server";
import { requireProjectAction } from "~/projects/projects.server";

export async function loader({ context, request }: Route.LoaderArgs) {
  const { project } = requireProjectAction(context, request, "approvals.view");
  const { stream } = await currentPacksZip(project.id);
  const name = `${project.name.replace(/[^\w]+/g, "-").toLowerCase()}-approvals-${new Date().toISOString().slice(0, 10)}.zip`;
  return new Response(stream, { headers: { "Content-Type": "application/zip", "Content-Disposition": `attachment; filename="${name}"`, "Cache-Control": "private, no-store" } });
}
