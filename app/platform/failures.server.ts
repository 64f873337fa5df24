// How a domain's failures leave a route, once for every domain: pages throw `data({ message }, { status })` for
// the error boundary, page actions answer the form (`{ ok: false, message, issues }`) so nothing typed is lost,
// /api/ callers get `{ status, message, code?, issues? }` JSON. Storage and database outages say so plainly.
import { data } from "react-router";
import { isDatabaseUnavailable } from "../../db/connection";
import { apiError } from "./http.server";
import { StorageUnavailableError } from "./storage.server";

export interface Issue {
  path: string;
  message: string;
}

/** A failure meant for people: a message, the HTTP status that goes with it, and for 422 the field issues. */
export class DomainError extends Error {
  constructor(
    message: string,
    readonly status: number,
    readonly code?: string,
    readonly issues?: Issue[],
  ) {
    super(message);
  }
}

export const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;
export const STORAGE_DOWN = "The file store is not answering, so nothing was stored or recorded. Try again in a few minutes.";

export interface Failure {
  status: number;
  message: string;
  code?: string;
  issues?: Issue[];
}

export function describeFailure(error: unknown): Failure | null {
  if (error instanceof DomainError) return { status: error.status, message: error.message, code: error.code, issues: error.issues };
  if (error instanceof StorageUnavailableError) return { status: 503, message: STORAGE_DOWN, code: "storage_unavailable" };
  if (isDatabaseUnavailable(error)) return { status: 503, message: "Countersign cannot reach its database right now. Nothing was saved.", code: "database_unavailable" };
  return null;
}

/** Runs a page loader/action body; known failures become error responses for the boundary. */
export async function forPage<T>(work: () => Promise<T>): Promise<T> {
  try {
    return await work();
  } catch (error) {
    const known = describeFailure(error);
    if (known) throw data({ message: known.message }, { status: known.status });
    throw error;
  }
}

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

/** Runs an /api/ (or resource route) body; known failures become `{ status, message }` JSON. */
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
