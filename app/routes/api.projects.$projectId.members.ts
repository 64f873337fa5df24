// GET /api/projects/:projectId/members?q= — a project's members, searchable by name or e-mail.
import type { Route } from "./+types/api.projects.$projectId.members";
import { listMembers } from "~/projects/members.server";
import { requireApiProjectAction } from "~/projects/projects.server";

export async function loader({ context, params, request }: Route.LoaderArgs) {
  const { project } = await requireApiProjectAction(context, params.projectId, "members.view");
  const q = new URL(request.url).searchParams.get("q")?.slice(0, 100) ?? "";
  const members = await listMembers(project.id, { q, limit: 50 });
  return Response.json({ members: members.map(({ id, userId, name, email, role }) => ({ id, userId, name, email, role })) });
}
