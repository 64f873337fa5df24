// The register's role matrix over real HTTP: every drawings and transmittals route file × each role on the
// project, a member of another project, and a signed-out visitor. A new route file must be added here.
import { readdirSync } from "node:fs";
import { beforeAll, describe, expect, it } from "vitest";
import { can, ROLES, type Action, type Role } from "../../app/projects/permissions";
import { presignDownload } from "../../app/platform/storage.server";
import { DrawingRevision, ProjectMember } from "../../db/models";
import { makeSheet, upload } from "../support/drawings";
import { makeProjectTeam, PASSWORD } from "../support/factory";
import { Client } from "../support/http";

type Caller = Role | "outsider" | "signed_out";
interface Ids { p: string; d: string; r: string; t: string }
interface Case { file: string; path: (ids: Ids) => string; method: "GET" | "POST"; needs: Action; fields?: Record<string, string>; api?: boolean }
const NO_SUCH = "00000000-0000-4000-8000-000000000000";

const CASES: Case[] = [
  { file: "projects.$projectId.drawings._index.tsx", path: (i) => `/projects/${i.p}/drawings`, method: "GET", needs: "drawings.view" },
  { file: "projects.$projectId.drawings.csv.ts", path: (i) => `/projects/${i.p}/drawings/csv`, method: "GET", needs: "drawings.view" },
  { file: "projects.$projectId.drawings.upload.ts", path: (i) => `/projects/${i.p}/drawings/upload`, method: "POST", needs: "drawings.upload", fields: { sheetNumber: "X" } },
  { file: "projects.$projectId.drawings.$drawingId._index.tsx", path: (i) => `/projects/${i.p}/drawings/${i.d}`, method: "GET", needs: "drawings.view" },
  { file: "projects.$projectId.drawings.$drawingId._index.tsx", path: (i) => `/projects/${i.p}/drawings/${i.d}`, method: "POST", needs: "drawings.upload", fields: { intent: "retry", revisionId: NO_SUCH } },
  { file: "projects.$projectId.drawings.$drawingId._index.tsx", path: (i) => `/projects/${i.p}/drawings/${i.d}`, method: "POST", needs: "drawings.issue", fields: { intent: "withdraw", revisionId: NO_SUCH, reason: "matrix" } },
  { file: "projects.$projectId.drawings.$drawingId.compare.tsx", path: (i) => `/projects/${i.p}/drawings/${i.d}/compare`, method: "GET", needs: "drawings.view" },
  { file: "projects.$projectId.drawings.$drawingId.overlay.ts", path: (i) => `/projects/${i.p}/drawings/${i.d}/overlay`, method: "GET", needs: "drawings.view" },
  { file: "projects.$projectId.drawings.$drawingId.revisions.$revisionId.file.ts", path: (i) => `/projects/${i.p}/drawings/${i.d}/revisions/${i.r}/file`, method: "GET", needs: "drawings.view" },
  { file: "projects.$projectId.drawings.$drawingId.revisions.$revisionId.thumbs.$page.ts", path: (i) => `/projects/${i.p}/drawings/${i.d}/revisions/${i.r}/thumbs/1`, method: "GET", needs: "drawings.view" },
  { file: "projects.$projectId.transmittals._index.tsx", path: (i) => `/projects/${i.p}/transmittals`, method: "GET", needs: "drawings.view" },
  { file: "projects.$projectId.transmittals._index.tsx", path: (i) => `/projects/${i.p}/transmittals`, method: "POST", needs: "drawings.issue", fields: { intent: "issue" } },
  { file: "projects.$projectId.transmittals.$transmittalId.tsx", path: (i) => `/projects/${i.p}/transmittals/${i.t}`, method: "GET", needs: "drawings.view" },
  { file: "api.projects.$projectId.drawings.ts", path: (i) => `/api/projects/${i.p}/drawings`, method: "GET", needs: "drawings.view", api: true },
  { file: "api.projects.$projectId.drawings.$drawingId.ts", path: (i) => `/api/projects/${i.p}/drawings/${i.d}`, method: "GET", needs: "drawings.view", api: true },
  { file: "api.projects.$projectId.drawings.$drawingId.revisions.$revisionId.ts", path: (i) => `/api/projects/${i.p}/drawings/${i.d}/revisions/${i.r}`, method: "GET", needs: "drawings.view", api: true },
  { file: "api.projects.$projectId.drawings.$drawingId.revisions.$revisionId.download.ts", path: (i) => `/api/projects/${i.p}/drawings/${i.d}/revisions/${i.r}/download`, method: "GET", needs: "drawings.view", api: true },
  { file: "api.projects.$projectId.drawings.$drawingId.compare.ts", path: (i) => `/api/projects/${i.p}/drawings/${i.d}/compare?from=${i.r}&to=${NO_SUCH}`, method: "GET", needs: "drawings.view", api: true },
];

function expected(c: Case, caller: Caller) {
  if (caller === "signed_out") return "sign-in";
  if (caller === "outsider") return "forbidden";
  return can(caller, c.needs) ? "ok" : "forbidden";
}

function outcome(c: Case, res: Response) {
  if (res.status === 403) return "forbidden";
  if (c.api && res.status === 401) return "sign-in";
  if (res.status === 302 && res.headers.get("location")?.startsWith("/sign-in")) return "sign-in";
  // Access granted, then the (deliberately empty or unknown) input was refused.
  if ([200, 206, 302, 400, 404, 409, 415, 422].includes(res.status)) return "ok";
  return `status ${res.status}`;
}

let ids: Ids;
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
  const up = await upload(clients.get("architect")!, team.project.id, await makeSheet({ tag: `matrix-${Date.now()}` }), { sheetNumber: "M-1", title: "Matrix" });
  const stored = up.body.stored[0];
  const issued = await clients.get("architect")!.request(`/projects/${team.project.id}/transmittals`, {
    method: "POST",
    body: new URLSearchParams([["intent", "issue"], ["revisionIds", stored.revisionId], ["status", "for_review"], ...ROLES.map((r) => ["recipientIds", team.users[r].id] as [string, string]), ["reason", "Matrix"]]),
  });
  ids = { p: team.project.id, d: stored.drawingId, r: stored.revisionId, t: issued.headers.get("location")!.split("/").pop()! };
});

it("lists every drawings and transmittals route file", () => {
  const files = readdirSync(new URL("../../app/routes", import.meta.url)).filter((f) => /^(projects\.\$projectId\.(drawings|transmittals)|api\.projects\.\$projectId\.drawings)/.test(f));
  const listed = new Set(CASES.map((c) => c.file));
  expect(files.filter((f) => !listed.has(f))).toEqual([]);
});

describe.each(CASES.map((c) => [`${c.method} ${c.file}${c.fields?.intent ? ` (${c.fields.intent})` : ""}`, c] as const))("%s", (_n, c) => {
  it.each([...ROLES, "outsider", "signed_out"] as Caller[])("as %s", async (caller) => {
    const client = clients.get(caller)!;
    const res = c.method === "GET" ? await client.get(c.path(ids)) : await client.post(c.path(ids), c.fields ?? {});
    expect(outcome(c, res)).toBe(expected(c, caller));
  });
});

describe("presigned download links", () => {
  const download = (i: Ids) => `/api/projects/${i.p}/drawings/${i.d}/revisions/${i.r}/download`;

  // The store checks the signature itself (a changed key or lifetime no longer matches it). The local fake does
  // not verify version-4 signatures, so that part belongs to the real store; what the app controls is tested here:
  // links expire, are short-lived, and are not issued once membership ends.
  it("are refused by the store once expired", async () => {
    const rev = (await DrawingRevision.findByPk(ids.r))!;
    const url = new URL((await presignDownload(rev.objectKey, "short.pdf", 1)).url);
    expect((await fetch(url)).status).toBe(200);
    await new Promise((r) => setTimeout(r, 2_100));
    expect((await fetch(url)).status).toBe(403);
  });

  it("are issued for at most the configured minutes, and never again once membership ends", async () => {
    const plumber = clients.get("site_plumber")!;
    const dl = await plumber.json(download(ids));
    expect(dl.status).toBe(200);
    const ttl = Number(new URL(dl.body.url).searchParams.get("X-Amz-Expires"));
    expect(ttl).toBeGreaterThan(0);
    expect(ttl).toBeLessThanOrEqual(300);
    await ProjectMember.destroy({ where: { projectId: ids.p, userId: team.users.site_plumber.id } });
    try {
      expect((await plumber.json(download(ids))).status).toBe(403);
      expect((await plumber.get(`/projects/${ids.p}/drawings/${ids.d}/revisions/${ids.r}/file`)).status).toBe(403);
    } finally {
      await ProjectMember.create({ projectId: ids.p, userId: team.users.site_plumber.id, role: "site_plumber" });
    }
  });
});
