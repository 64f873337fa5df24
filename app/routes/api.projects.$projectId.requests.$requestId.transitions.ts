// POST /api/projects/:projectId/requests/:requestId/transitions — JSON { action, lockVersion, note }; for
// "decide" also the decision (outcome, principles, conditions, reasons, restsOn). 409 when someone moved it first.
import type { Route } from "./+types/api.projects.$projectId.requests.$requestId.transitions";
import { forApi, readBody } from "~/requests/http.server";
import { parseInput } from "~/requests/requests.server";
import { moveSchema } from "~/requests/schemas";
import { moveRequest } from "~/requests/transitions.server";
import { recordDecision } from "~/review/decisions.server";
import { apiError } from "~/platform/http.server";
import { requireApiProjectAction } from "~/projects/projects.server";

export async function action({ context, params, request }: Route.ActionArgs) {
  const { project, role, user } = await requireApiProjectAction(context, params.projectId, "requests.view");
  return forApi(async () => {
    const body = await readBody(request);
    const move = parseInput(moveSchema, body);
    const actor = { ...user, role };
    const done = move.action === "decide" ? await recordDecision(actor, project.id, params.requestId, body) : await moveRequest(actor, project.id, params.requestId, move);
    return Response.json({ from: done.from, to: done.to, lockVersion: done.lockVersion });
  });
}

export async function loader() {
  return apiError(405, "Move a request with POST.");
}
