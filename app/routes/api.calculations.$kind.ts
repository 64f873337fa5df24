// POST /api/calculations/:kind — run one calculator: JSON in (the engine's input), JSON out (its result).
// Bad input answers 422 with `issues: [{ path, message }]`. Nothing is stored.
import type { Route } from "./+types/api.calculations.$kind";
import { requireApiUser } from "~/accounts/auth.server";
import { calculate } from "~/calculations/calculations.server";
import { forApi } from "~/calculations/http.server";
import { readJsonBody } from "~/platform/body.server";
import { apiError } from "~/platform/http.server";

export async function loader() {
  return apiError(405, "Send the input with POST.");
}

export async function action({ context, request, params }: Route.ActionArgs) {
  requireApiUser(context);
  if (request.method !== "POST") return apiError(405, "Send the input with POST.");
  return forApi(async () => {
    const { kind, input, output, engineVersion } = calculate(params.kind, await readJsonBody(request));
    return Response.json({ kind, engineVersion, input, output });
  });
}
