// How request and review failures leave a route: loaders throw to the error boundary, page actions answer the
// form with the message (and field issues) so nothing typed is lost, /api/ callers get `{ status, message }`.
import { data } from "react-router";
import { isDatabaseUnavailable } from "../../db/connection";
import { apiError } from "../platform/http.server";
import { StorageUnavailableError } from "../platform/storage.server";
import { RequestError } from "./errors";

export interface Failure {
  status: number;
  message: string;
  code?: string;
  issues?: { path: string; message: string }[];
}

export function describeFailure(error: unknown): Failure | null {
  if (error instanceof RequestError) return { status: error.status, message: error.message, code: error.code, issues: error.issues };
  if (error instanceof StorageUnavailableError) return { status: 503, message: "The file store is not answering, so nothing was stored. Try again in a few minutes.", code: "storage_unavailable" };
  if (isDatabaseUnavailable(error)) return { status: 503, message: "Countersign cannot reach its database right now. Nothing was saved.", code: "database_unavailable" };
  return null;
}

export async function forPage<T>(work: () => Promise<T>): Promise<T> {
  try {
    return await work();
  } catch (error) {
    const known = describeFailure(error);
    if (known) throw data({ message: known.message }, { status: known.status });
    throw error;
  }
}

export type ActionOutcome<T = unknown> = { ok: true; intent: string; message?: string; value?: T } | { ok: false; intent: string; message: string; issues: { path: string; message: string }[] };

/** Runs a page action; a known failure becomes `{ ok: false, message, issues }` with its status. */
export async function forAction<T>(intent: string, work: () => Promise<{ message?: string; value?: T } | void>) {
  try {
    const out = (await work()) ?? {};
    return { ok: true as const, intent, message: out.message, value: out.value };
  } catch (error) {
    const known = describeFailure(error);
    if (!known) throw error;
    return data({ ok: false as const, intent, message: known.message, issues: known.issues ?? [] }, { status: known.status });
  }
}

export async function forApi(work: () => Promise<Response>): Promise<Response> {
  try {
    return await work();
  } catch (error) {
    if (error instanceof Response) throw error;
    const known = describeFailure(error);
    if (known) return apiError(known.status, known.message, { ...(known.code ? { code: known.code } : {}), ...(known.issues ? { issues: known.issues } : {}) });
    throw error;
  }
}

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
