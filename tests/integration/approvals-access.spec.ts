// Who may reach the approval routes: every route × each role on the project, a member of another project, and a
// signed-out visitor. The public verification page is the only one open to all, and shows nothing beyond itself.
import { beforeAll, describe, expect, it } from "vitest";
import { can, ROLES, type Action, type Role } from "../../app/projects/permissions";
import { Approval, Decision, DeviationRequest, RequestVersion } from "../../db/models";
import { makeProjectTeam, PASSWORD } from "../support/factory";
import { Client } from "../support/http";

type Caller = Role | "outsider" | "signed_out";
let team: Awaited<ReturnType<typeof makeProjectTeam>>;
let ids: { approval: string; request: string; code: string };
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
  // A signed approval row as the signing flow leaves it (the flow itself is tested in approvals.spec.ts).
  const request = await DeviationRequest.create({ projectId: team.project.id, number: 1, title: "Access test", provision: "discharge", state: "decided", createdById: team.users.site_plumber.id });
  const version = await RequestVersion.create({ requestId: request.id, n: 1, title: "Access test", provision: "discharge", createdById: team.users.site_plumber.id });
  const decision = await Decision.create({ requestId: request.id, requestVersionId: version.id, outcome: "approved", decidedById: team.users.engineer.id, recordedAt: new Date() });
  const approval = await Approval.create({
    projectId: team.project.id, requestId: request.id, decisionId: decision.id, n: 1, reference: "DR-001", outcome: "approved",
    snapshot: { request: { title: "Access test", provision: "Discharge", version: 1 }, decision: { conditions: [] }, drawings: [], principles: [], calculations: [], engineer: { name: "E", registrationNumber: "R", registrationBody: "B" } },
    snapshotSha256: "0".repeat(64), packKey: `projects/${team.project.id}/approvals/missing.pdf`, packSha256: "1".repeat(64), packBytes: 1, restsOn: [],
    signerId: team.users.engineer.id, signingKeyId: await signingKeyId(), certificateSha256: "2".repeat(64), signedAt: new Date(), verifyCode: `access-code-${Date.now()}-abcdef`, stateReason: null, stateChangedAt: null,
  });
  ids = { approval: approval.id, request: request.id, code: approval.verifyCode };
});

async function signingKeyId() {
  const { SigningKey } = await import("../../db/models");
  const key = await SigningKey.create({ userId: team.users.engineer.id, certificatePem: "x", certificateSha256: `c-${Date.now()}`, encryptedPrivateKey: "x", registrationNumber: "R", revokedAt: null });
  return key.id;
}

interface Case { name: string; method: "GET" | "POST"; path: () => string; needs: Action | "public"; fields?: Record<string, string> }
const CASES: Case[] = [
  { name: "site page", method: "GET", path: () => `/projects/${team.project.id}/site`, needs: "approvals.view" },
  { name: "site zip", method: "GET", path: () => `/projects/${team.project.id}/site/packs.zip`, needs: "approvals.view" },
  { name: "approval page", method: "GET", path: () => `/projects/${team.project.id}/approvals/${ids.approval}`, needs: "approvals.view" },
  { name: "record installation", method: "POST", path: () => `/projects/${team.project.id}/approvals/${ids.approval}`, needs: "installations.record", fields: { installedOn: "not a date" } },
  { name: "pack download", method: "GET", path: () => `/projects/${team.project.id}/approvals/${ids.approval}/pack`, needs: "approvals.view" },
  { name: "signing desk", method: "GET", path: () => `/projects/${team.project.id}/requests/${ids.request}/sign`, needs: "approvals.sign" },
  { name: "sign", method: "POST", path: () => `/projects/${team.project.id}/requests/${ids.request}/sign`, needs: "approvals.sign", fields: {} },
  { name: "public verification", method: "GET", path: () => `/verify/${ids.code}`, needs: "public" },
  { name: "compliance record", method: "GET", path: () => `/projects/${team.project.id}/approvals/${ids.approval}/compliance-record.pdf`, needs: "approvals.view" },
  { name: "notices", method: "GET", path: () => `/projects/${team.project.id}/notices`, needs: "approvals.view" },
  { name: "send notice", method: "POST", path: () => `/projects/${team.project.id}/notices`, needs: "installations.record", fields: {} },
  { name: "API: approvals", method: "GET", path: () => `/api/projects/${team.project.id}/approvals`, needs: "approvals.view" },
  { name: "API: one approval", method: "GET", path: () => `/api/projects/${team.project.id}/approvals/${ids.approval}`, needs: "approvals.view" },
];

function expected(c: Case, caller: Caller) {
  if (c.needs === "public") return "ok";
  if (caller === "signed_out") return "sign-in";
  if (caller === "outsider") return "forbidden";
  return can(caller, c.needs) ? "ok" : "forbidden";
}

function outcome(res: Response) {
  if (res.status === 403) return "forbidden";
  if (res.status === 401) return "sign-in";
  if (res.status === 302 && res.headers.get("location")?.startsWith("/sign-in")) return "sign-in";
  // Allowed: the page, a redirect to storage, or the route's own answer to this test's thin data.
  if ([200, 302, 400, 404, 409, 422].includes(res.status)) return "ok";
  return `status ${res.status}`;
}

describe.each(CASES.map((c) => [c.name, c] as const))("%s", (_n, c) => {
  it.each([...ROLES, "outsider", "signed_out"] as Caller[])("as %s", async (caller) => {
    const client = clients.get(caller)!;
    const res = c.method === "GET" ? await client.get(c.path()) : await client.post(c.path(), c.fields ?? {});
    expect(outcome(res)).toBe(expected(c, caller));
  });
});

describe("guessing", () => {
  it("finds no approval of this project by another id, and no approval by a guessed code", async () => {
    const manager = clients.get("manager")!;
    expect((await manager.get(`/projects/${team.project.id}/approvals/00000000-0000-4000-8000-000000000000`)).status).toBe(404);
    expect((await manager.get(`/projects/${team.project.id}/approvals/not-an-id/pack`)).status).toBe(404);
    expect((await new Client().get(`/verify/${"A".repeat(24)}`)).status).toBe(404);
    expect((await new Client().get("/verify/short")).status).toBe(404);
    const outsider = clients.get("outsider")!;
    expect((await outsider.get(`/projects/${team.otherProject.id}/approvals/${ids.approval}`)).status).toBe(404);
  });
});
