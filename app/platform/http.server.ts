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

