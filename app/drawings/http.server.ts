// How drawing-register failures leave a route: pages throw `data({ message }, { status })` for the error
// boundary, /api/ callers get `{ status, message }` JSON. Storage and database outages say so plainly.
import { data } from "react-router";
import { isDatabaseUnavailable } from "../../db/connection";
import { apiError } from "../platform/http.server";
import { StorageUnavailableError } from "../platform/storage.server";
import { DrawingError } from "./errors";

export const STORAGE_DOWN = "The file store is not answering, so nothing was stored or recorded. Try again in a few minutes.";

export function describeFailure(error: unknown): { status: number; message: string; code?: string } | null {
  if (error instanceof DrawingError) return { status: error.status, message: error.message, code: error.code };
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

/** Runs an /api/ (or resource route) body; known failures become `{ status, message }` JSON. */
export async function forApi(work: () => Promise<Response>): Promise<Response> {
  try {
    return await work();
  } catch (error) {
    if (error instanceof Response) throw error;
    const known = describeFailure(error);
    if (known) return apiError(known.status, known.message, known.code ? { code: known.code } : {});
    throw error;
  }
}
