// How calculation failures leave a route: /api/ callers get `{ status, message, issues? }` JSON, pages get
// `data({ message, issues }, { status })` for the error boundary or the form.
import { data } from "react-router";
import { isDatabaseUnavailable } from "../../db/connection";
import { DomainError } from "../platform/failures.server";
import { apiError } from "../platform/http.server";
import { CalculationError } from "./calculations.server";

const DB_DOWN = "Countersign cannot reach its database right now. Nothing was saved.";

export async function forApi(work: () => Promise<Response>): Promise<Response> {
  try {
    return await work();
  } catch (error) {
    if (error instanceof Response) throw error;
    // The platform's refusals too (a body that is not JSON, text that cannot be stored), in the same shape.
    if (error instanceof CalculationError || error instanceof DomainError) return apiError(error.status, error.message, error.issues?.length ? { issues: error.issues } : {});
    if (isDatabaseUnavailable(error)) return apiError(503, DB_DOWN);
    throw error;
  }
}

export async function forPage<T>(work: () => Promise<T>): Promise<T> {
  try {
    return await work();
  } catch (error) {
    if (error instanceof CalculationError || error instanceof DomainError) throw data({ message: error.message }, { status: error.status });
    if (isDatabaseUnavailable(error)) throw data({ message: DB_DOWN }, { status: 503 });
    throw error;
  }
}
