// Root middleware, run before any loader or action: refuse cross-site writes and oversized bodies, load the
// signed-in user once (answering 503 when the database is down), and set security headers on the way out.
import { data, type MiddlewareFunction } from "react-router";
import { isDatabaseUnavailable } from "../../db/connection";
import { userContext } from "../accounts/context";
import { sessionUser } from "../accounts/session.server";
import { env } from "./env.server";
import { FORM_TYPES } from "./body.server";
import { drainBody } from "./multipart.server";
import { applySecurityHeaders } from "./security.server";

const SAFE_METHODS = new Set(["GET", "HEAD", "OPTIONS"]);
const appOrigin = new URL(env.APP_URL).origin;

function refuse(request: Request, status: number, message: string, headers: HeadersInit = {}): never {
  const isApi = new URL(request.url).pathname.startsWith("/api/");
  if (isApi) throw Response.json({ status, message }, { status, headers });
  throw data({ message }, { status, headers });
}

/** How much of a refused body is read and dropped before answering. */
const DRAIN_LIMIT_BYTES = 16 * 1024 * 1024;

export const requestGuard: MiddlewareFunction<Response> = async ({ request }, next) => {
  if (!SAFE_METHODS.has(request.method)) {
    const origin = request.headers.get("origin");
    const own = new URL(request.url).origin;
    if (!origin || (origin !== own && origin !== appOrigin)) {
      refuse(request, 403, "This form was sent from another site, or without an origin, so it was refused. Reload the page and try again.");
    }
    const length = Number(request.headers.get("content-length") ?? 0);
    const type = request.headers.get("content-type") ?? "";
    // Uploads stream straight to object storage and carry their own limits; everything else is small.
    if (!type.startsWith("multipart/form-data") && length > env.MAX_FORM_BYTES) {
      // Read and drop a moderately large body first, so the client gets this answer rather than a reset
      // connection; beyond that the connection is simply closed.
      await drainBody(request.body, DRAIN_LIMIT_BYTES);
      refuse(request, 413, `That submission is too large (over ${Math.round(env.MAX_FORM_BYTES / 1024)} KB).`, { connection: "close" });
    }
    const { pathname } = new URL(request.url);
    const hasBody = length > 0 || request.headers.has("transfer-encoding");
    if (!pathname.startsWith("/api/") && hasBody && !FORM_TYPES.test(type)) {
      refuse(request, 415, "Send this form as a web form (application/x-www-form-urlencoded or multipart/form-data).");
    }
  }
  const response = await next();
  applySecurityHeaders(response.headers);
  return response;
};

export const loadUser: MiddlewareFunction<Response> = async ({ request, context }, next) => {
  try {
    context.set(userContext, await sessionUser(request));
  } catch (error) {
    if (isDatabaseUnavailable(error)) {
      console.error("database unavailable:", (error as Error).message);
      refuse(request, 503, "Countersign cannot reach its database right now. Nothing you sent was saved. Try again in a minute.");
    }
    throw error;
  }
  return next();
};
