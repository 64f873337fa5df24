// Request and review routes leave through the shared failure handling (app/platform/failures.server.ts); this
// module adds reading an /api/ body.
import { RequestError } from "./errors";

export { describeFailure, forAction, forApi, forPage, type Failure } from "../platform/failures.server";

/** The JSON body of an /api/ call (or a form body, for simple clients). */
export async function readBody(request: Request): Promise<Record<string, unknown>> {
  const type = request.headers.get("content-type") ?? "";
  if (type.includes("application/json")) {
    try {
      const body = await request.json();
      if (body && typeof body === "object" && !Array.isArray(body)) return body as Record<string, unknown>;
    } catch {
      // answered below
    }
    throw new RequestError("The body is not a JSON object.", 400, "bad_json");
  }
  return Object.fromEntries(await request.formData());
}
