// Platform behaviour: cross-site and origin-less writes refused, oversized bodies refused, JSON errors for the
// API, security headers, and a clear 503 while PostgreSQL is unreachable — recovering by itself afterwards.
import { spawn, type ChildProcess } from "node:child_process";
import http from "node:http";
import net from "node:net";
import { afterAll, describe, expect, it } from "vitest";
import { Project } from "../../db/models";
import { makeUser, PASSWORD } from "../support/factory";
import { Client } from "../support/http";

describe("write protection", () => {
  it("refuses a POST from another origin, and one without an origin, changing nothing", async () => {
    const user = await makeUser();
    const c = new Client();
    await c.signIn(user.email, PASSWORD);
    const before = await Project.count();
    // The framework itself already answers a foreign Origin with 400; ours adds the origin-less case and a message.
    const foreign = await c.post("/projects/new", { name: "Sneaky project", siteAddress: "1 Nowhere Street" }, { origin: "https://evil.example" });
    expect([400, 403]).toContain(foreign.status);
    const none = await c.post("/projects/new", { name: "Sneaky project", siteAddress: "1 Nowhere Street" }, { origin: null });
    expect(none.status).toBe(403);
    expect(await none.text()).toContain("sent from another site, or without an origin");
    expect(await Project.count()).toBe(before);
  });

  it("refuses an oversized form body with 413", async () => {
    // On its own connection: the server does not read the refused body, so that socket is not reused.
    const body = new URLSearchParams({ email: "a@b.example", password: "x".repeat(1_200_000) }).toString();
    const url = new URL("/sign-in", new Client().base);
    const { status, text } = await new Promise<{ status: number; text: string }>((resolve, reject) => {
      const req = http.request(url, { method: "POST", agent: false, headers: { origin: url.origin, "content-type": "application/x-www-form-urlencoded", "content-length": Buffer.byteLength(body) } }, (res) => {
        let text = "";
        res.on("data", (d) => (text += d)).on("end", () => resolve({ status: res.statusCode!, text }));
      });
      req.on("error", reject);
      req.end(body);
    });
    expect(status).toBe(413);
    expect(text).toContain("too large");
  });

  it("answers unknown API paths and unauthenticated API calls with JSON", async () => {
    const c = new Client();
    const missing = await c.json("/api/nothing-here");
    expect(missing).toEqual({ status: 404, body: { status: 404, message: "No such API endpoint." } });
    const anon = await c.json("/api/projects");
    expect(anon.status).toBe(401);
    expect(anon.body.message).toMatch(/Sign in/);
  });

  it("sends security headers and a nonce-based CSP on documents", async () => {
    const res = await new Client().get("/sign-in");
    const csp = res.headers.get("content-security-policy")!;
    expect(csp).toMatch(/script-src 'self' 'nonce-[A-Za-z0-9+/=]+'/);
    expect(csp).toContain("frame-ancestors 'none'");
    expect(res.headers.get("x-content-type-options")).toBe("nosniff");
    const nonce = csp.match(/'nonce-([^']+)'/)![1];
    const html = await res.text();
    for (const tag of html.match(/<script\b[^>]*>/g) ?? []) expect(tag).toContain(`nonce="${nonce}"`);
  });
});

// A TCP relay in front of PostgreSQL that the test can cut and restore, and a second app server that uses it.
function relay(targetPort: number) {
  const sockets = new Set<net.Socket>();
  const server = net.createServer((client) => {
    const upstream = net.connect(targetPort, "127.0.0.1");
    sockets.add(client).add(upstream);
    client.pipe(upstream).pipe(client);
    const drop = () => { client.destroy(); upstream.destroy(); };
    client.on("error", drop).on("close", drop);
    upstream.on("error", drop).on("close", drop);
  });
  return {
    listen: (port: number) => new Promise<void>((r) => server.listen(port, "127.0.0.1", () => r())),
    cut: () => new Promise<void>((r) => { for (const s of sockets) s.destroy(); sockets.clear(); server.close(() => r()); }),
  };
}

describe("database outage", () => {
  let app: ChildProcess | undefined;
  afterAll(() => app?.kill());

  it("answers 503 with a clear page while PostgreSQL is unreachable and recovers by itself", async () => {
    const dbUrl = new URL(process.env.DATABASE_URL!);
    const relayPort = 45000 + Math.floor(Math.random() * 1000);
    const appPort = 46000 + Math.floor(Math.random() * 1000);
    const pg = relay(Number(dbUrl.port));
    await pg.listen(relayPort);
    dbUrl.port = String(relayPort);
    const user = await makeUser();
    app = spawn(process.execPath, ["node_modules/@react-router/serve/bin.js", `${process.env.COUNTERSIGN_BUILD_DIR ?? "build"}/server/index.js`], {
      env: { ...process.env, DATABASE_URL: dbUrl.toString(), PORT: String(appPort), HOST: "127.0.0.1", APP_URL: `http://127.0.0.1:${appPort}` },
      stdio: "ignore",
    });
    const base = `http://127.0.0.1:${appPort}`;
    for (let i = 0; i < 100; i++) {
      try { await fetch(`${base}/healthz`); break; } catch { await new Promise((r) => setTimeout(r, 100)); }
    }
    const c = new Client(base);
    await c.signIn(user.email, PASSWORD);
    expect((await c.get("/projects")).status).toBe(200);

    await pg.cut();
    const down = await c.get("/projects");
    expect(down.status).toBe(503);
    expect(await down.text()).toContain("cannot reach its database");
    expect((await c.json("/api/projects")).status).toBe(503);
    expect((await fetch(`${base}/healthz`)).status).toBe(503);

    const back = relay(Number(new URL(process.env.DATABASE_URL!).port));
    await back.listen(relayPort);
    let status = 0;
    for (let i = 0; i < 50 && status !== 200; i++) {
      status = (await c.get("/projects")).status;
      if (status !== 200) await new Promise((r) => setTimeout(r, 200));
    }
    expect(status).toBe(200);
    await back.cut();
  });
});

describe("the production server (storage/serve.mjs)", () => {
  const launch = (port: number, concurrency: number) =>
    spawn(process.execPath, ["storage/serve.mjs", `${process.env.COUNTERSIGN_BUILD_DIR ?? "build"}/server/index.js`], {
      // As in production: without VITEST, the built app stops its job queue and leaves on SIGTERM.
      env: { ...process.env, VITEST: undefined, PORT: String(port), HOST: "127.0.0.1", APP_URL: `http://127.0.0.1:${port}`, WEB_CONCURRENCY: String(concurrency) },
      stdio: "ignore",
    });
  const exited = (child: ChildProcess) => new Promise<number | null>((r) => (child.exitCode !== null ? r(child.exitCode) : child.once("exit", (code) => r(code))));
  const children = async (pid: number) => {
    const { readFileSync } = await import("node:fs");
    try {
      return readFileSync(`/proc/${pid}/task/${pid}/children`, "utf8").trim().split(/\s+/).filter(Boolean).map(Number);
    } catch {
      return [];
    }
  };
  const alive = (pid: number) => { try { process.kill(pid, 0); return true; } catch { return false; } };

  it("serves from one process per WEB_CONCURRENCY, sessions good in any of them, and stops them all on SIGTERM", async () => {
    const port = 47000 + Math.floor(Math.random() * 1000);
    const app = launch(port, 2);
    try {
      const base = `http://127.0.0.1:${port}`;
      for (let i = 0; i < 150; i++) {
        try { if ((await fetch(`${base}/healthz`)).ok) break; } catch { await new Promise((r) => setTimeout(r, 100)); }
      }
      const workers = await children(app.pid!);
      expect(workers).toHaveLength(2);
      const user = await makeUser();
      const c = new Client(base);
      await c.signIn(user.email, PASSWORD);
      // New connections are shared out between the processes; every one of them knows the session.
      const statuses = await Promise.all(Array.from({ length: 12 }, () => fetch(`${base}/api/me`, { headers: { cookie: c.cookieHeader(), connection: "close" } }).then((r) => r.status)));
      expect(statuses).toEqual(Array(12).fill(200));
      app.kill("SIGTERM");
      expect(await exited(app)).toBe(0);
      expect(workers.filter(alive)).toEqual([]);
    } finally {
      if (app.exitCode === null) app.kill("SIGKILL");
    }
  }, 60_000);

  it("gives up, with a failing exit code, when its processes die during start-up (a port in use)", async () => {
    const port = 48000 + Math.floor(Math.random() * 1000);
    const blocker = net.createServer();
    await new Promise<void>((r) => blocker.listen(port, "127.0.0.1", () => r()));
    const app = launch(port, 2);
    try {
      expect(await exited(app)).not.toBe(0);
    } finally {
      if (app.exitCode === null) app.kill("SIGKILL");
      blocker.close();
    }
  }, 60_000);
});

describe("secrets", () => {
  // What must never reach a browser or a log line: the session and key-encryption secrets, the store's secret key,
  // and a password someone typed.
  const secrets = () => {
    const out = [...(process.env.SESSION_SECRET ?? "test-secret-rotated").split(","), process.env.SIGNING_KEY_SECRET ?? "dev-only-signing-key-secret", PASSWORD];
    if (process.env.S3_SECRET_ACCESS_KEY) out.push(process.env.S3_SECRET_ACCESS_KEY);
    return out.filter((s) => s.length >= 8);
  };

  it("keeps secrets and server-only modules out of the client bundles", async () => {
    const { readdirSync, readFileSync } = await import("node:fs");
    const dir = `${process.env.COUNTERSIGN_BUILD_DIR ?? "build"}/client/assets`;
    const files = readdirSync(dir).filter((f) => f.endsWith(".js"));
    expect(files.length).toBeGreaterThan(5);
    for (const f of files) {
      const js = readFileSync(`${dir}/${f}`, "utf8");
      for (const s of secrets()) expect(js.includes(s), `${f} contains a secret`).toBe(false);
      for (const marker of ["DATABASE_URL", "SESSION_SECRET", "SIGNING_KEY_SECRET", "S3_SECRET_ACCESS_KEY", "pg-boss", "sequelize", "passwordHash"]) {
        expect(js.includes(marker), `${f} contains ${marker}`).toBe(false);
      }
    }
  });

  it("writes no secret or typed password to the app's log, even after failures", async () => {
    const { readFileSync } = await import("node:fs");
    const user = await makeUser();
    const c = new Client();
    await c.post("/sign-in", { email: user.email, password: `${PASSWORD} wrong` });
    await c.post("/sign-up", { name: "Log Check", email: user.email, password: PASSWORD, profession: "other" });
    await c.signIn(user.email, PASSWORD);
    await c.post("/reset-password", { email: user.email });
    const log = readFileSync(`.run/${process.env.COUNTERSIGN_RUN ?? "test"}/app.log`, "utf8");
    for (const s of secrets()) expect(log.includes(s), "the app log contains a secret").toBe(false);
    expect(log).not.toMatch(/password["']?\s*[:=]\s*["'][^"']+/i);
  });
});
