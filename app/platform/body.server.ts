// Reading request bodies, once for every domain: the JSON of an /api/ call, and the form types a page action can
// read. Text PostgreSQL cannot store is refused here, with the field's path, before any domain sees it.
import { DomainError } from "./failures.server";

/** Bodies a form handler can read; anything else fails inside `request.formData()`. */
export const FORM_TYPES = /^(application\/x-www-form-urlencoded|multipart\/form-data)\b/i;

/** Deepest nesting a JSON body may have; no input of ours comes near it. */
const MAX_JSON_DEPTH = 32;
const LONE_SURROGATE = /[\uD800-\uDBFF](?![\uDC00-\uDFFF])|(?<![\uD800-\uDBFF])[\uDC00-\uDFFF]/;

/** Text PostgreSQL cannot store as sent: a NUL character, or half of a surrogate pair (a broken character). */
const isUnstorableText = (s: string) => s.includes("\u0000") || LONE_SURROGATE.test(s);

/**
 * Refuses (422, with the field's path) a parsed body that holds text that cannot be stored, or nests deeper than
 * any input of ours. Walked without recursion, so a hostile depth cannot exhaust the stack.
 */
export function assertStorable(value: unknown) {
  const stack: [unknown, string, number][] = [[value, "", 0]];
  while (stack.length) {
    const [v, path, depth] = stack.pop()!;
    let message: string | undefined;
    if (typeof v === "string") {
      if (isUnstorableText(v)) message = "This text holds a NUL or broken character that cannot be stored. Remove it and send again.";
    } else if (v && typeof v === "object") {
      if (depth >= MAX_JSON_DEPTH) message = `The body nests deeper than ${MAX_JSON_DEPTH} levels.`;
      else {
        for (const [key, child] of Object.entries(v)) {
          const at = path ? `${path}.${key}` : key;
          if (isUnstorableText(key)) throw new DomainError("A field name holds a NUL or broken character.", 422, "invalid", [{ path: at, message: "A field name holds a NUL or broken character." }]);
          stack.push([child, at, depth + 1]);
        }
      }
    }
    if (message) throw new DomainError(message, 422, "invalid", [{ path, message }]);
  }
}

/** The JSON body of an /api/ call: 415 when it is not sent as JSON, 400 when it does not parse, 422 as above. */
export async function readJsonBody(request: Request): Promise<unknown> {
  const type = request.headers.get("content-type") ?? "";
  if (!/^application\/([\w.+-]+\+)?json\b/i.test(type)) throw new DomainError("Send the body as JSON (Content-Type: application/json).", 415, "bad_json");
  let value: unknown;
  try {
    value = await request.json();
  } catch {
    throw new DomainError("The request body must be JSON.", 400, "bad_json");
  }
  assertStorable(value);
  return value;
}
