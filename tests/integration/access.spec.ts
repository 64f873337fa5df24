// The role matrix over real HTTP: every protected route × each role on the project, a member of another
// project, and a signed-out visitor. Every route file must appear here, so a new route cannot be forgotten.
import { readdirSync } from "node:fs";
import { beforeAll, describe, expect, it } from "vitest";
import { can, ROLES, type Action, type Role } from "../../app/projects/permissions";
import { makeProjectTeam, PASSWORD } from "../support/factory";
import { Client } from "../support/http";

type Caller = Role | "outsider" | "signed_out";
interface Case {
  file: string;
  path: (projectId: string) => string;
  method: "GET" | "POST";
  /** The project action required; `signedIn` = any signed-in user; `public` = anyone. */
  needs: Action | "signedIn" | "public";
  fields?: Record<string, string>;
  api?: boolean;
}

const CASES: Case[] = [
  { file: "_index.tsx", path: () => "/", method: "GET", needs: "public" },
  { file: "sign-in.tsx", path: () => "/sign-in", method: "GET", needs: "public" },
  { file: "sign-up.tsx", path: () => "/sign-up", method: "GET", needs: "public" },
  { file: "sign-out.tsx", path: () => "/sign-out", method: "GET", needs: "public" },
  { file: "reset-password._index.tsx", path: () => "/reset-password", method: "GET", needs: "public" },
  { file: "reset-password.$token.tsx", path: () => "/reset-password/not-a-token", method: "GET", needs: "public" },
  { file: "invitations.$token.tsx", path: () => "/invitations/not-a-token", method: "GET", needs: "public" },
  { file: "healthz.ts", path: () => "/healthz", method: "GET", needs: "public" },
  { file: "$.tsx", path: () => "/no/such/page", method: "GET", needs: "public" },
  { file: "api.$.ts", path: () => "/api/no-such-endpoint", method: "GET", needs: "public", api: true },
  { file: "profile.tsx", path: () => "/profile", method: "GET", needs: "signedIn" },
  { file: "projects._index.tsx", path: () => "/projects", method: "GET", needs: "signedIn" },
  { file: "projects.new.tsx", path: () => "/projects/new", method: "GET", needs: "signedIn" },
  { file: "api.me.ts", path: () => "/api/me", method: "GET", needs: "signedIn", api: true },
  { file: "api.projects.ts", path: () => "/api/projects", method: "GET", needs: "signedIn", api: true },
  { file: "requests._index.tsx", path: () => "/requests", method: "GET", needs: "signedIn" },
  { file: "projects.$projectId.tsx", path: (p) => `/projects/${p}`, method: "GET", needs: "project.view" },
  { file: "projects.$projectId._index.tsx", path: (p) => `/projects/${p}`, method: "GET", needs: "project.view" },
  { file: "projects.$projectId.members._index.tsx", path: (p) => `/projects/${p}/members`, method: "GET", needs: "members.view" },
  { file: "projects.$projectId.members._index.tsx", path: (p) => `/projects/${p}/members`, method: "POST", needs: "members.manage", fields: { intent: "invite", email: "", role: "engineer" } },
  { file: "projects.$projectId.settings.tsx", path: (p) => `/projects/${p}/settings`, method: "GET", needs: "project.edit" },
  { file: "projects.$projectId.members.$memberId.verify.tsx", path: (p) => `/projects/${p}/members/00000000-0000-4000-8000-000000000000/verify`, method: "GET", needs: "members.manage" },
  { file: "projects.$projectId.members.$memberId.verify.tsx", path: (p) => `/projects/${p}/members/00000000-0000-4000-8000-000000000000/verify`, method: "POST", needs: "members.manage", fields: { intent: "verify" } },
  { file: "projects.$projectId.settings.tsx", path: (p) => `/projects/${p}/settings`, method: "POST", needs: "project.edit", fields: { name: "", siteAddress: "" } },
  { file: "api.projects.$projectId.members.ts", path: (p) => `/api/projects/${p}/members`, method: "GET", needs: "members.view", api: true },
];

/** Route files other parts of the product own, with their own matrices in their own specs. */
const COVERED_ELSEWHERE = /^(projects\.\$projectId\.(drawings|transmittals|requests|calculations|approvals|site|notices)|api\.projects\.\$projectId\.(drawings|transmittals|requests|calculations|approvals)|api\.calculations|api\.requests|requests\.|verify)/;

function expected(c: Case, caller: Caller): "ok" | "sign-in" | "forbidden" {
  if (c.needs === "public") return "ok";
  if (caller === "signed_out") return "sign-in";
  if (c.needs === "signedIn") return "ok";
  if (caller === "outsider") return "forbidden";
  return can(caller, c.needs) ? "ok" : "forbidden";
}

function outcome(c: Case, res: Response): "ok" | "sign-in" | "forbidden" | string {
  if (res.status === 403) return "forbidden";
  if (c.api && res.status === 401) return "sign-in";
  if (res.status === 302 && res.headers.get("location")?.startsWith("/sign-in")) return "sign-in";
  // A permitted POST with empty fields answers 400 (validation), which still proves access was granted.
  if ([200, 302, 400, 404, 410, 422].includes(res.status)) return "ok";
  return `status ${res.status}`;
}

let team: Awaited<ReturnType<typeof makeProjectTeam>>;
const clients = new Map<Caller, Client>();

beforeAll(async () => {
  team = await makeProjectTeam();
  for (const role of ROLES) {
    const c = new Client();
    await c.signIn(team.users[role].email, PASSWORD);
    clients.set(role, c);
  }
  const outsider = new Client();
  await outsider.signIn(team.outsider.email, PASSWORD);
  clients.set("outsider", outsider);
  clients.set("signed_out", new Client());
});

describe("every route file is in the matrix", () => {
  it("lists each file under app/routes", () => {
    const files = readdirSync(new URL("../../app/routes", import.meta.url)).filter((f) => /\.(tsx?|ts)$/.test(f) && !/\.(server|test)\./.test(f));
    const listed = new Set(CASES.map((c) => c.file));
    const missing = files.filter((f) => !listed.has(f) && !COVERED_ELSEWHERE.test(f));
    expect(missing, "route files with no access expectation").toEqual([]);
  });
});

const CALLERS: Caller[] = [...ROLES, "outsider", "signed_out"];
describe.each(CASES.map((c) => [`${c.method} ${c.path(":projectId")}`, c] as const))("%s", (_name, c) => {
  it.each(CALLERS)("as %s", async (caller) => {
    const client = clients.get(caller)!;
    const path = c.path(team.project.id);
    const res = c.method === "GET" ? await client.get(path) : await client.post(path, c.fields ?? {});
    expect(outcome(c, res)).toBe(expected(c, caller));
  });
});

describe("guessing", () => {
  it("answers a malformed or unknown project id like a project you are not on", async () => {
    const c = clients.get("manager")!;
    expect((await c.get("/projects/not-a-uuid")).status).toBe(403);
    expect((await c.get("/projects/00000000-0000-4000-8000-000000000000")).status).toBe(403);
    expect((await c.json(`/api/projects/${team.otherProject.id}/members`)).status).toBe(403);
  });
});
