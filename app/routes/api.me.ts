// GET /api/me — the signed-in user.
import type { Route } from "./+types/api.me";
import { getProfile } from "~/accounts/accounts.server";
import { requireApiUser } from "~/accounts/auth.server";

export async function loader({ context }: Route.LoaderArgs) {
  const user = requireApiUser(context);
  return Response.json({ user: await getProfile(user.id) });
}
