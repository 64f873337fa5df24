// Who is signed in: the password strategy (remix-auth), the sign-in rate limit, and the guards every loader and
// action calls. The guards throw: a redirect to sign-in for pages, a JSON 401 for the API.
import { redirect, type RouterContextProvider } from "react-router";
import { Authenticator } from "remix-auth";
import { FormStrategy } from "remix-auth-form";
import { Op } from "sequelize";
import { SignInAttempt, User } from "../../db/models";
import { apiError, clientIp } from "../platform/http.server";
import { userContext, type CurrentUser } from "./context";
import { burnPasswordCheck, verifyPassword } from "./password.server";

/** Failed attempts allowed per e-mail address (and, more loosely, per client address) in the window. */
export const SIGN_IN_LIMIT = { perEmail: 5, perIp: 30, windowMinutes: 15 } as const;

export class SignInError extends Error {
  constructor(
    message: string,
    readonly status: 401 | 429,
  ) {
    super(message);
  }
}

async function checkRateLimit(email: string, ip: string | null) {
  const since = new Date(Date.now() - SIGN_IN_LIMIT.windowMinutes * 60_000);
  const [byEmail, byIp] = await Promise.all([
    SignInAttempt.count({ where: { email, succeeded: false, createdAt: { [Op.gt]: since } } }),
    ip ? SignInAttempt.count({ where: { ip, succeeded: false, createdAt: { [Op.gt]: since } } }) : 0,
  ]);
  if (byEmail >= SIGN_IN_LIMIT.perEmail || byIp >= SIGN_IN_LIMIT.perIp) {
    throw new SignInError(
      `Too many failed sign-ins. For your security, wait ${SIGN_IN_LIMIT.windowMinutes} minutes or reset your password.`,
      429,
    );
  }
}

export const authenticator = new Authenticator<string>();

authenticator.use(
  new FormStrategy(async ({ form, request }) => {
    const email = String(form.get("email") ?? "").trim().toLowerCase();
    const password = String(form.get("password") ?? "");
    const ip = clientIp(request);
    await checkRateLimit(email, ip);
    const user = await User.findOne({ where: { email }, attributes: ["id", "passwordHash"] });
    const ok = user ? await verifyPassword(password, user.passwordHash) : (await burnPasswordCheck(password), false);
    await SignInAttempt.create({ email, ip, succeeded: ok });
    if (!user || !ok) throw new SignInError("That e-mail address and password do not match an account.", 401);
    return user.id;
  }),
  "password",
);

/** The signed-in user the root middleware loaded (sessionUser), or null. */
export function optionalUser(context: Readonly<RouterContextProvider>) {
  return context.get(userContext);
}

export function requireUser(context: Readonly<RouterContextProvider>, request: Request): CurrentUser {
  const user = context.get(userContext);
  if (user) return user;
  const url = new URL(request.url);
  const back = url.pathname.startsWith("/api/") ? "/projects" : url.pathname + url.search;
  throw redirect(`/sign-in?redirectTo=${encodeURIComponent(back)}`);
}

export function requireApiUser(context: Readonly<RouterContextProvider>): CurrentUser {
  const user = context.get(userContext);
  if (user) return user;
  throw apiError(401, "Sign in to use the Countersign API.");
}
