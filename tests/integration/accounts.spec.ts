// Sign-up, sign-in, sign-out, sessions, the sign-in rate limit and password reset by e-mail, over real HTTP
// against the built app, PostgreSQL and the mail fake.
import { describe, expect, it } from "vitest";
import { PasswordReset, Session, SignInAttempt, User } from "../../db/models";
import { hashToken } from "../../app/platform/tokens.server";
import { makeUser, PASSWORD } from "../support/factory";
import { Client, uniqueEmail } from "../support/http";
import { linkIn, waitForMail } from "../support/mail";

const signUpFields = (email: string) => ({
  name: "Nomsa Testperson",
  email,
  password: "a long enough password",
  profession: "plumber",
  phone: "+27 82 000 0000",
});

describe("sign-up", () => {
  it("creates the account and signs in", async () => {
    const c = new Client();
    const email = uniqueEmail("signup");
    const res = await c.post("/sign-up", signUpFields(email));
    expect(res.status).toBe(302);
    expect(res.headers.get("location")).toBe("/projects");
    const me = await c.json("/api/me");
    expect(me.status).toBe(200);
    expect(me.body.user.email).toBe(email);
    expect(me.body.user).not.toHaveProperty("passwordHash");
  });

  it("refuses a duplicate e-mail (any case) with a clear message and changes nothing", async () => {
    const existing = await makeUser();
    const before = await User.count();
    const res = await new Client().post("/sign-up", signUpFields(existing.email.toUpperCase()));
    expect(res.status).toBe(409);
    expect(await res.text()).toContain("already exists");
    expect(await User.count()).toBe(before);
  });

  it("asks engineers for their registration number, stored unverified", async () => {
    const c = new Client();
    const email = uniqueEmail("eng");
    const missing = await c.post("/sign-up", { ...signUpFields(email), profession: "engineer" });
    expect(missing.status).toBe(400);
    expect(await missing.text()).toContain("registration number");
    const ok = await c.post("/sign-up", { ...signUpFields(email), profession: "engineer", registrationNumber: "T-123", registrationBody: "Test board" });
    expect(ok.status).toBe(302);
    const user = await User.findOne({ where: { email } });
    expect(user?.registrationState).toBe("unverified");
  });

  it("rejects a weak password beside the field", async () => {
    const res = await new Client().post("/sign-up", { ...signUpFields(uniqueEmail()), password: "short" });
    expect(res.status).toBe(400);
    expect(await res.text()).toContain("at least 10 characters");
  });
});

describe("sign-in and sessions", () => {
  it("signs in with a fresh, httpOnly, SameSite=Lax session cookie that holds only an id", async () => {
    const user = await makeUser();
    const c = new Client();
    await c.get("/sign-in");
    const res = await c.post("/sign-in", { email: user.email, password: PASSWORD });
    expect(res.status).toBe(302);
    const cookie = res.headers.getSetCookie().find((l) => l.startsWith("countersign_session="))!;
    expect(cookie).toMatch(/HttpOnly/i);
    expect(cookie).toMatch(/SameSite=Lax/i);
    expect(cookie).not.toContain(user.id);
    expect(await Session.count({ where: { userId: user.id } })).toBe(1);
  });

  it("gives a new session id at every sign-in (no fixation)", async () => {
    const user = await makeUser();
    const c = new Client();
    await c.signIn(user.email, PASSWORD);
    const first = c.sessionCookie;
    await c.signIn(user.email, PASSWORD);
    expect(c.sessionCookie).not.toBe(first);
    const stale = new Client();
    (stale as any).cookies.set("countersign_session", first);
    expect((await stale.json("/api/me")).status).toBe(401);
  });

  it("says so plainly for an unknown e-mail or a wrong password", async () => {
    const user = await makeUser();
    for (const [email, password] of [[uniqueEmail("nobody"), PASSWORD], [user.email, "wrong password!"]]) {
      const res = await new Client().post("/sign-in", { email: email!, password: password! });
      expect(res.status).toBe(401);
      expect(await res.text()).toContain("do not match an account");
    }
  });

  it("signs out and the old cookie no longer works", async () => {
    const user = await makeUser();
    const c = new Client();
    await c.signIn(user.email, PASSWORD);
    const cookie = c.cookieHeader();
    const out = await c.post("/sign-out", {});
    expect(out.status).toBe(302);
    expect(await Session.count({ where: { userId: user.id } })).toBe(0);
    const res = await fetch(new URL("/api/me", c.base), { headers: { cookie } });
    expect(res.status).toBe(401);
  });

  it("treats an expired session, or a cookie with a forged signature, as signed out", async () => {
    const user = await makeUser();
    const c = new Client();
    await c.signIn(user.email, PASSWORD);
    const cookie = c.cookieHeader();
    const me = async (header: string) => (await fetch(new URL("/api/me", c.base), { headers: { cookie: header } })).status;
    expect(await me(cookie)).toBe(200);
    // The same id with its signature changed.
    expect(await me(cookie.replace(/\.([^.;]+)(;|$)/, (_m, sig: string, end: string) => `.${sig.slice(0, -2)}${sig.endsWith("AA") ? "BB" : "AA"}${end}`))).toBe(401);
    await Session.update({ expiresAt: new Date(Date.now() - 1000) }, { where: { userId: user.id } });
    expect(await me(cookie)).toBe(401);
  });

  it("redirects to sign-in with a safe return path, and never off-site", async () => {
    const res = await new Client().get("/profile");
    expect(res.status).toBe(302);
    expect(res.headers.get("location")).toBe("/sign-in?redirectTo=%2Fprofile");
    const user = await makeUser();
    const c = new Client();
    const evil = await c.post("/sign-in", { email: user.email, password: PASSWORD, redirectTo: "//evil.example/x" });
    expect(evil.headers.get("location")).toBe("/projects");
  });

  it("rate-limits failed sign-ins per address, even when the right password follows", async () => {
    const user = await makeUser();
    const c = new Client();
    for (let i = 0; i < 5; i++) expect((await c.post("/sign-in", { email: user.email, password: "not it at all" })).status).toBe(401);
    const blocked = await c.post("/sign-in", { email: user.email, password: PASSWORD });
    expect(blocked.status).toBe(429);
    expect(await blocked.text()).toContain("Too many failed sign-ins");
    expect(await SignInAttempt.count({ where: { email: user.email, succeeded: true } })).toBe(0);
  });
});

describe("password reset by e-mail", () => {
  it("mails a single-use link that sets a new password and ends every session", async () => {
    const user = await makeUser();
    const other = new Client();
    await other.signIn(user.email, PASSWORD);

    const c = new Client();
    const asked = await c.post("/reset-password", { email: user.email });
    expect(asked.status).toBe(200);
    expect(await asked.text()).toContain("If an account exists");
    const mail = await waitForMail(user.email, /Reset your Countersign password/);
    const link = linkIn(mail, "/reset-password/");

    expect((await c.get(link)).status).toBe(200);
    const done = await c.post(link, { password: "a brand new password", confirm: "a brand new password" });
    expect(done.status).toBe(302);
    expect(done.headers.get("location")).toBe("/sign-in?notice=password-reset");
    expect((await other.json("/api/me")).status).toBe(401);
    await new Client().signIn(user.email, "a brand new password");

    const again = await c.post(link, { password: "yet another password", confirm: "yet another password" });
    expect(again.status).toBe(410);
    expect(await again.text()).toContain("already been used");
  });

  it("refuses an expired token with a clear message", async () => {
    const user = await makeUser();
    await PasswordReset.create({ userId: user.id, tokenHash: hashToken("expired-token-123"), expiresAt: new Date(Date.now() - 1000), usedAt: null });
    const page = await new Client().get("/reset-password/expired-token-123");
    expect(await page.text()).toContain("has expired");
    const res = await new Client().post("/reset-password/expired-token-123", { password: "whatever password", confirm: "whatever password" });
    expect(res.status).toBe(410);
  });

  it("answers the same for an unknown address, and sends nothing", async () => {
    const res = await new Client().post("/reset-password", { email: uniqueEmail("ghost") });
    expect(res.status).toBe(200);
    expect(await res.text()).toContain("If an account exists");
  });
});
