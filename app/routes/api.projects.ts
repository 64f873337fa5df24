// GET /api/projects — the signed-in user's projects with their role on each.
import type { Route } from "./+types/api.projects";
import { requireApiUser } from "~/accounts/auth.server";
import { listMyProjects } from "~/projects/projects.server";

export async function loader({ context }: Route.LoaderArgs) {
  const user = requireApiUser(context);
  return Response.json({ projects: await listMyProjects(user.id) });
}
