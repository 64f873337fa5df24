// Sessions: the cookie carries only a random id (signed with the rotating secret list); the data lives in
// PostgreSQL, keyed by the id's hash, so any app server can read it and a session can be revoked.
import { randomBytes } from "node:crypto";
import { createCookie, createSessionStorage, redirect } from "react-router";
import { Op } from "sequelize";
import { Session } from "../../db/models";
import { env } from "../platform/env.server";
import { clientIp } from "../platform/http.server";
import { hashToken } from "../platform/tokens.server";

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
