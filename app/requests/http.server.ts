// Request and review routes leave through the shared failure handling (app/platform/failures.server.ts); this
// module adds reading an /api/ body.
import { BodyError, findUnstorable, readJsonBody } from "../platform/http.server";
import { RequestError } from "./errors";

export { describeFailure, forAction, forApi, forPage, type Failure } from "../platform/failures.server";

/** The JSON body of an /api/ call (or a form body, for simple clients), checked for text that cannot be stored. */
export async function readBody(request: Request): Promise<Record<string, unknown>> {
  const type = request.headers.get("content-type") ?? "";
  if (/^(application\/x-www-form-urlencoded|multipart\/form-data)\b/i.test(type)) {
    const fields = Object.fromEntries(await request.formData().catch(() => {
      throw new RequestError("The form body could not be read.", 400, "bad_form");
    }));
    const bad = findUnstorable(Object.fromEntries(Object.entries(fields).filter(([, v]) => typeof v === "string")));
    if (bad) throw new RequestError(bad.message, 422, "invalid", [bad]);
    return fields;
  }
  try {
    const body = await readJsonBody(request);
    if (body && typeof body === "object" && !Array.isArray(body)) return body as Record<string, unknown>;
  } catch (error) {
    if (error instanceof BodyError) throw new RequestError(error.message, error.status, error.status === 422 ? "invalid" : "bad_json", error.issues.length ? error.issues : undefined);
    throw error;
  }
  throw new RequestError("The body is not a JSON object.", 400, "bad_json");
}
