// Sessions: the cookie carries only a random id (signed with the rotating secret list); the data lives in
// PostgreSQL, keyed by the id's hash, so any app server can read it and a session can be revoked.
import { randomBytes } from "node:crypto";
import { createCookie, createSessionStorage, redirect } from "react-router";
import { Op, QueryTypes } from "sequelize";
import { Session, sequelize } from "../../db/models";
import { env } from "../platform/env.server";
import { clientIp } from "../platform/http.server";
import { hashToken } from "../platform/tokens.server";
import type { CurrentUser } from "./context";

const MAX_AGE_S = 60 * 60 * 24 * 14;

export interface SessionData {
  userId?: string;
  userAgent?: string;
  ip?: string;
}

export const sessionCookie = createCookie("countersign_session", {
  httpOnly: true,
  sameSite: "lax",
  secure: env.APP_URL.startsWith("https:"),
  path: "/",
  maxAge: MAX_AGE_S,
  secrets: env.SESSION_SECRET,
});

const storage = createSessionStorage<SessionData>({
  cookie: sessionCookie,
  async createData(data, expires) {
    const id = randomBytes(32).toString("base64url");
    await Session.create({
      idHash: hashToken(id),
      userId: data.userId ?? null,
      data,
      expiresAt: expires ?? new Date(Date.now() + MAX_AGE_S * 1000),
      userAgent: data.userAgent?.slice(0, 300) ?? null,
      ip: data.ip ?? null,
    });
    return id;
  },
  async readData(id) {
    const row = await Session.findOne({
      where: { idHash: hashToken(id), expiresAt: { [Op.gt]: new Date() } },
      attributes: ["data"],
    });
    return (row?.data as SessionData) ?? null;
  },
  async updateData(id, data, expires) {
    await Session.update(
      { data, userId: data.userId ?? null, ...(expires ? { expiresAt: expires } : {}) },
      { where: { idHash: hashToken(id) } },
    );
  },
  async deleteData(id) {
    await Session.destroy({ where: { idHash: hashToken(id) } });
  },
});

export function getSession(request: Request) {
  return storage.getSession(request.headers.get("Cookie"));
}

/**
 * The signed-in user behind the request's cookie, session and user read in one query: the middleware asks on
 * every request. Null without a cookie, with a bad signature, or when the session expired, was revoked or names
 * no user.
 */
export async function sessionUser(request: Request): Promise<CurrentUser | null> {
  const id: unknown = await sessionCookie.parse(request.headers.get("Cookie"));
  if (typeof id !== "string" || !id) return null;
  const [user] = await sequelize.query<CurrentUser>(
    `SELECT u.id, u.email, u.name, u.profession, u.registration_state AS "registrationState"
     FROM sessions s JOIN users u ON u.id = s.user_id
     WHERE s.id_hash = :idHash AND s.expires_at > now()`,
    { replacements: { idHash: hashToken(id) }, type: QueryTypes.SELECT },
  );
  return user ?? null;
}

/** Starts a fresh session for the user (a new id, so a planted session cannot be taken over). */
export async function startSession(request: Request, userId: string, redirectTo: string) {
  const old = await getSession(request);
  if (old.id) await storage.destroySession(old);
  const session = await storage.getSession();
  session.set("userId", userId);
  session.set("userAgent", request.headers.get("user-agent") ?? undefined);
  session.set("ip", clientIp(request) ?? undefined);
  return redirect(redirectTo, { headers: { "Set-Cookie": await storage.commitSession(session) } });
}

export async function endSession(request: Request, redirectTo = "/") {
  const session = await getSession(request);
  return redirect(redirectTo, { headers: { "Set-Cookie": await storage.destroySession(session) } });
}

export async function revokeAllSessions(userId: string) {
  await Session.destroy({ where: { userId } });
}
