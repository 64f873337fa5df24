// The role matrix for the request and review routes over real HTTP: each role on the project, a member of
// another project, and a signed-out visitor. Every requests route file must appear here.
import { readdirSync } from "node:fs";
import { beforeAll, describe, expect, it } from "vitest";
import { can, ROLES, type Action, type Role } from "../../app/projects/permissions";
import { makeProjectTeam, PASSWORD } from "../support/factory";
import { Client } from "../support/http";
import { api, attach, CONTENT, makePhoto } from "../support/requests";

type Caller = Role | "outsider" | "signed_out";
interface Ids { p: string; r: string; a: string }
interface Case {
  file: string;
  path: (ids: Ids) => string;
  method: "GET" | "POST";
  needs: Action;
  fields?: Record<string, string>;
  json?: Record<string, unknown>;
  api?: boolean;
}

const R = (ids: Ids) => `/projects/${ids.p}/requests/${ids.r}`;
const A = (ids: Ids) => `/api/projects/${ids.p}/requests/${ids.r}`;
const CASES: Case[] = [
  { file: "projects.$projectId.requests._index.tsx", path: (i) => `/projects/${i.p}/requests`, method: "GET", needs: "requests.view" },
  { file: "projects.$projectId.requests._index.tsx", path: (i) => `/projects/${i.p}/requests?index`, method: "POST", needs: "requests.view", fields: { muted: "0" } },
  { file: "projects.$projectId.requests.new.tsx", path: (i) => `/projects/${i.p}/requests/new`, method: "GET", needs: "requests.raise" },
  { file: "projects.$projectId.requests.new.tsx", path: (i) => `/projects/${i.p}/requests/new`, method: "POST", needs: "requests.raise", fields: { title: "" } },
  { file: "projects.$projectId.requests.$requestId._index.tsx", path: R, method: "GET", needs: "requests.view" },
  { file: "projects.$projectId.requests.$requestId._index.tsx", path: (i) => `${R(i)}?index`, method: "POST", needs: "requests.view", fields: { intent: "comment", body: "" } },
  { file: "projects.$projectId.requests.$requestId.edit.tsx", path: (i) => `${R(i)}/edit`, method: "GET", needs: "requests.raise" },
  { file: "projects.$projectId.requests.$requestId.edit.tsx", path: (i) => `${R(i)}/edit`, method: "POST", needs: "requests.raise", fields: { intent: "save", title: "" } },
  { file: "projects.$projectId.requests.$requestId.review.tsx", path: (i) => `${R(i)}/review`, method: "GET", needs: "requests.view" },
  { file: "projects.$projectId.requests.$requestId.review.tsx", path: (i) => `${R(i)}/review`, method: "POST", needs: "requests.review", fields: { intent: "save", lockVersion: "0" } },
  { file: "projects.$projectId.requests.$requestId.attachments.ts", path: (i) => `${R(i)}/attachments?for=comment`, method: "POST", needs: "requests.view", api: true },
  { file: "projects.$projectId.requests.$requestId.attachments.$attachmentId.ts", path: (i) => `${R(i)}/attachments/${i.a}`, method: "GET", needs: "requests.view" },
  { file: "api.projects.$projectId.requests.ts", path: (i) => `/api/projects/${i.p}/requests`, method: "GET", needs: "requests.view", api: true },
  { file: "api.projects.$projectId.requests.ts", path: (i) => `/api/projects/${i.p}/requests`, method: "POST", needs: "requests.raise", api: true, json: {} },
  { file: "api.projects.$projectId.requests.$requestId.ts", path: A, method: "GET", needs: "requests.view", api: true },
  { file: "api.projects.$projectId.requests.$requestId.ts", path: A, method: "POST", needs: "requests.raise", api: true, json: {} },
  { file: "api.projects.$projectId.requests.$requestId.transitions.ts", path: (i) => `${A(i)}/transitions`, method: "POST", needs: "requests.view", api: true, json: {} },
  { file: "api.projects.$projectId.requests.$requestId.versions.ts", path: (i) => `${A(i)}/versions`, method: "GET", needs: "requests.view", api: true },
  { file: "api.projects.$projectId.requests.$requestId.comments.ts", path: (i) => `${A(i)}/comments`, method: "GET", needs: "requests.view", api: true },
  { file: "api.projects.$projectId.requests.$requestId.comments.ts", path: (i) => `${A(i)}/comments`, method: "POST", needs: "requests.view", api: true, json: {} },
  { file: "requests._index.tsx", path: () => "/requests", method: "GET", needs: "project.view" },
  { file: "projects.$projectId.requests.$requestId.sheet.tsx", path: (i) => `${R(i)}/sheet`, method: "GET", needs: "requests.view" },
  { file: "api.projects.$projectId.requests.$requestId.markups.ts", path: (i) => `${A(i)}/markups`, method: "GET", needs: "requests.view", api: true },
  { file: "api.projects.$projectId.requests.$requestId.markups.ts", path: (i) => `${A(i)}/markups`, method: "POST", needs: "requests.review", api: true, json: {} },
  { file: "api.projects.$projectId.requests.$requestId.pins.ts", path: (i) => `${A(i)}/pins`, method: "GET", needs: "requests.view", api: true },
];

function expected(c: Case, caller: Caller): "ok" | "sign-in" | "forbidden" {
  if (caller === "signed_out") return "sign-in";
  if (c.file === "requests._index.tsx") return "ok";
  if (caller === "outsider") return "forbidden";
  return can(caller, c.needs) ? "ok" : "forbidden";
}

function outcome(c: Case, res: Response) {
  if (res.status === 403) return "forbidden";
  if (res.status === 401) return "sign-in";
  if (res.status === 302 && res.headers.get("location")?.startsWith("/sign-in")) return "sign-in";
  // Access granted; the empty or out-of-turn submission is then refused on its merits.
  if ([200, 201, 302, 400, 409, 415, 422].includes(res.status)) return "ok";
  return `status ${res.status}`;
}

let ids: Ids;
const clients = new Map<Caller, Client>();

beforeAll(async () => {
  const team = await makeProjectTeam();
  for (const role of ROLES) {
    const c = new Client();
    await c.signIn(team.users[role].email, PASSWORD);
    clients.set(role, c);
  }
  const outsider = new Client();
  await outsider.signIn(team.outsider.email, PASSWORD);
  clients.set("outsider", outsider);
  clients.set("signed_out", new Client());
  const plumber = clients.get("site_plumber")!;
  const created = await api(plumber, "POST", `/api/projects/${team.project.id}/requests`, CONTENT);
  const r = created.body.request.id as string;
  const photo = await attach(plumber, team.project.id, r, await makePhoto(40, 30));
  await api(plumber, "POST", `/api/projects/${team.project.id}/requests/${r}/transitions`, { action: "submit", lockVersion: 0 });
  ids = { p: team.project.id, r, a: photo.body.attachment.id };
});

describe("every requests route file is in this matrix", () => {
  it("lists each", () => {
    // Signing a decision belongs to approvals, whose own spec holds its matrix.
    const files = readdirSync(new URL("../../app/routes", import.meta.url))
      .filter((f) => /^(projects\.\$projectId\.requests|api\.projects\.\$projectId\.requests|requests\.)/.test(f))
      .filter((f) => !/\.(sign|approvals?)\b/.test(f))
      // Changing or removing one markup or pin is write-only; markups.spec.ts holds who may do it.
      .filter((f) => !/\.(markups\.\$markupId|pins\.\$pinId)\.ts$/.test(f));
    const listed = new Set(CASES.map((c) => c.file));
    expect(files.filter((f) => !listed.has(f))).toEqual([]);
  });
});

const CALLERS: Caller[] = [...ROLES, "outsider", "signed_out"];
describe.each(CASES.map((c) => [`${c.method} ${c.path({ p: ":p", r: ":r", a: ":a" })}`, c] as const))("%s", (_name, c) => {
  it.each(CALLERS)("as %s", async (caller) => {
    const client = clients.get(caller)!;
    const path = c.path(ids);
    let res: Response;
    if (c.method === "GET") res = await client.get(path);
    else if (c.json) res = await client.request(path, { method: "POST", headers: { "content-type": "application/json", accept: "application/json" }, body: JSON.stringify(c.json) });
    else if (c.api) res = await client.request(path, { method: "POST", body: new FormData(), headers: { accept: "application/json" } });
    else res = await client.post(path, c.fields ?? {});
    expect(outcome(c, res)).toBe(expected(c, caller));
  });
});
