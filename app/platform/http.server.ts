// Small helpers that end a request early with the right status: the route's error boundary renders them.
import { data } from "react-router";

export function notFound(message = "Not found"): never {
  throw data({ message }, { status: 404 });
}

export function forbidden(message = "You do not have access to this."): never {
  throw data({ message }, { status: 403 });
}

export function invariantFound<T>(value: T | null | undefined, message?: string): asserts value is T {
  if (value === null || value === undefined) notFound(message);
}

/** JSON error for /api/ callers: always `{ status, message }` (plus `issues` for validation). */
export function apiError(status: number, message: string, extra: Record<string, unknown> = {}) {
  return Response.json({ status, message, ...extra }, { status });
}

export function clientIp(request: Request): string | null {
  return request.headers.get("x-forwarded-for")?.split(",")[0]?.trim() || null;
}

/** Only same-site paths are allowed as a post-sign-in destination. */
export function safeRedirect(to: FormDataEntryValue | string | null | undefined, fallback = "/projects"): string {
  if (!to || typeof to !== "string") return fallback;
  if (!to.startsWith("/") || to.startsWith("//") || to.startsWith("/\\")) return fallback;
  return to;
}

/** Deepest nesting a JSON body may have; no input of ours comes near it. */
const MAX_JSON_DEPTH = 32;
const LONE_SURROGATE = /[\uD800-\uDBFF](?![\uDC00-\uDFFF])|(?<![\uD800-\uDBFF])[\uDC00-\uDFFF]/;

/** Text PostgreSQL cannot store as sent: a NUL character, or half of a surrogate pair (a broken character). */
export const isUnstorableText = (s: string) => s.includes("\u0000") || LONE_SURROGATE.test(s);

/**
 * Where a parsed body holds text that cannot be stored, or nests deeper than any input of ours (walked without
 * recursion, so a hostile depth cannot exhaust the stack). Null when the value is fine.
 */
export function findUnstorable(value: unknown): { path: string; message: string } | null {
  const stack: [unknown, string, number][] = [[value, "", 0]];
  while (stack.length) {
    const [v, path, depth] = stack.pop()!;
    if (typeof v === "string") {
      if (isUnstorableText(v)) return { path, message: "This text holds a NUL or broken character that cannot be stored. Remove it and send again." };
    } else if (v && typeof v === "object") {
      if (depth >= MAX_JSON_DEPTH) return { path, message: `The body nests deeper than ${MAX_JSON_DEPTH} levels.` };
      for (const [key, child] of Object.entries(v)) {
        const at = path ? `${path}.${key}` : key;
        if (isUnstorableText(key)) return { path: at, message: "A field name holds a NUL or broken character." };
        stack.push([child, at, depth + 1]);
      }
    }
  }
  return null;
}

/** Thrown by `readJsonBody` with the status and message the caller should answer. */
export class BodyError extends Error {
  constructor(
    message: string,
    readonly status: number,
    readonly issues: { path: string; message: string }[] = [],
  ) {
    super(message);
  }
}

/** The JSON body of an /api/ call, refused with a plain message when it is not JSON or cannot be stored. */
export async function readJsonBody(request: Request): Promise<unknown> {
  const type = request.headers.get("content-type") ?? "";
  if (!/^application\/([\w.+-]+\+)?json\b/i.test(type)) throw new BodyError("Send the body as JSON (Content-Type: application/json).", 415);
  let value: unknown;
  try {
    value = await request.json();
  } catch {
    throw new BodyError("The request body must be JSON.", 400);
  }
  const bad = findUnstorable(value);
  if (bad) throw new BodyError(bad.message, 422, [bad]);
  return value;
}
