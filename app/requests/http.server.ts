// Request and review routes leave through the shared failure handling (app/platform/failures.server.ts); this
// module adds reading an /api/ body.
import { assertStorable, FORM_TYPES, readJsonBody } from "../platform/body.server";
import { RequestError } from "./errors";

export { describeFailure, forAction, forApi, forPage, type Failure } from "../platform/failures.server";

/** The JSON body of an /api/ call (or a form body, for simple clients), checked for text that cannot be stored. */
export async function readBody(request: Request): Promise<Record<string, unknown>> {
  if (FORM_TYPES.test(request.headers.get("content-type") ?? "")) {
    const form = await request.formData().catch(() => {
      throw new RequestError("The form body could not be read.", 400, "bad_form");
    });
    const fields = Object.fromEntries(form);
    assertStorable(fields);
    return fields;
  }
  const body = await readJsonBody(request);
  if (body && typeof body === "object" && !Array.isArray(body)) return body as Record<string, unknown>;
  throw new RequestError("The body is not a JSON object.", 400, "bad_json");
}
