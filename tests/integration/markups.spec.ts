// Markups and pins over real HTTP against the built app and PostgreSQL: engineers draw, change and remove markups
// (with the version check, the page check, the project scope and every refusal named), every member reads them,
// and the plumber's numbered pins while the request is editable.
import { beforeAll, describe, expect, it } from "vitest";
import { AuditEvent, DeviationRequest, Markup } from "../../db/models";
import { signingPreview } from "../../app/approvals/approvals.server";
import { decidedRequest } from "../support/approvals";
import { makeSheet, upload } from "../support/drawings";
import { makeProjectTeam, PASSWORD } from "../support/factory";
import { Client } from "../support/http";
import { api, CONTENT } from "../support/requests";

type Who = "manager" | "architect" | "engineer" | "site_plumber" | "outsider";
let team: Awaited<ReturnType<typeof makeProjectTeam>>;
const as = {} as Record<Who, Client>;
const pid = () => team.project.id;
let revisionId: string;
let otherRevisionId: string;

async function call(who: Client, method: string, path: string, body?: unknown) {
  const res = await who.request(path, {
    method,
    headers: { accept: "application/json", ...(body !== undefined ? { "content-type": "application/json" } : {}) },
    body: body !== undefined ? JSON.stringify(body) : undefined,
  });
  return { status: res.status, body: (await res.json()) as any };
}

const cloud = { kind: "cloud", points: [100, 100, 300, 200], color: "#9a4a20", strokeWidthPt: 1.5 };

async function requestInReview() {
  const created = await api(as.site_plumber, "POST", `/api/projects/${pid()}/requests`, CONTENT);
  expect(created.status).toBe(201);
  const id = created.body.request.id as string;
  for (const [who, action] of [["site_plumber", "submit"], ["engineer", "start_review"]] as const) {
    const current = (await DeviationRequest.findByPk(id))!;
    const res = await api(as[who], "POST", `/api/projects/${pid()}/requests/${id}/transitions`, { action, lockVersion: current.lockVersion });
    expect(res.status, JSON.stringify(res.body)).toBe(200);
  }
  return id;
}

beforeAll(async () => {
  team = await makeProjectTeam();
  for (const role of ["manager", "architect", "engineer", "site_plumber"] as const) {
    as[role] = new Client();
    await as[role].signIn(team.users[role].email, PASSWORD);
  }
  as.outsider = new Client();
  await as.outsider.signIn(team.outsider.email, PASSWORD);
  const up = await upload(as.architect, pid(), await makeSheet({ tag: "markups" }), { sheetNumber: `MK-${Date.now().toString(36)}`, title: "Roof plumbing", scaleText: "1:50" });
  expect(up.status, JSON.stringify(up.body)).toBe(201);
  revisionId = up.body.stored[0].revisionId;
  const other = await upload(as.outsider, team.otherProject.id, await makeSheet({ tag: "elsewhere" }), { sheetNumber: "EL-1", title: "Elsewhere" });
  expect(other.status, JSON.stringify(other.body)).toBe(201);
  otherRevisionId = other.body.stored[0].revisionId;
});

describe("markups", () => {
  it("an engineer adds, changes and removes a markup; every member reads it; each write is audited", async () => {
    const id = await requestInReview();
    const base = `/api/projects/${pid()}/requests/${id}/markups`;
    const made = await call(as.engineer, "POST", base, { revisionId, page: 1, shape: cloud });
    expect(made.status, JSON.stringify(made.body)).toBe(201);
    expect(made.body.markup).toMatchObject({ revisionId, page: 1, kind: "cloud", version: 1, shape: cloud, author: { id: team.users.engineer.id } });
    const markupId = made.body.markup.id;

    for (const who of ["site_plumber", "architect", "manager", "engineer"] as const) {
      const list = await call(as[who], "GET", `${base}?revisionId=${revisionId}&page=1`);
      expect(list.status).toBe(200);
      expect(list.body.markups.map((m: any) => m.id)).toEqual([markupId]);
    }
    expect((await call(as.engineer, "GET", `${base}?revisionId=${revisionId}&page=2`)).body.markups).toEqual([]);

    const moved = await call(as.engineer, "PATCH", `${base}/${markupId}`, { version: 1, shape: { ...cloud, points: [110, 110, 310, 210] } });
    expect(moved.status, JSON.stringify(moved.body)).toBe(200);
    expect(moved.body.markup).toMatchObject({ version: 2, shape: { points: [110, 110, 310, 210] } });

    const gone = await call(as.engineer, "DELETE", `${base}/${markupId}?version=2`);
    expect(gone.status, JSON.stringify(gone.body)).toBe(200);
    expect((await call(as.engineer, "GET", base)).body.markups).toEqual([]);
    const row = await Markup.findByPk(markupId);
    expect(row?.deletedAt).toBeTruthy();
    const actions = (await AuditEvent.findAll({ where: { subjectId: markupId }, order: [["createdAt", "ASC"]] })).map((e) => e.action);
    expect(actions).toEqual(["markup.created", "markup.updated", "markup.deleted"]);
  });

  it("refuses invalid geometry with field paths, shapes off the page, a page the sheet lacks and another project's revision", async () => {
    const id = await requestInReview();
    const base = `/api/projects/${pid()}/requests/${id}/markups`;
    const bad = await call(as.engineer, "POST", base, { revisionId, page: 1, shape: { kind: "line", points: [1, 2, 3], color: "red", strokeWidthPt: 0 } });
    expect(bad.status).toBe(422);
    expect(bad.body.status).toBe(422);
    expect(bad.body.issues.map((i: any) => i.path)).toEqual(expect.arrayContaining(["shape.points", "shape.color", "shape.strokeWidthPt"]));
    const noText = await call(as.engineer, "POST", base, { revisionId, page: 1, shape: { kind: "callout", points: [10, 10, 50, 50], color: "#000000", strokeWidthPt: 1 } });
    expect(noText.status).toBe(422);
    expect(noText.body.issues.map((i: any) => i.path)).toContain("shape.text");

    const off = await call(as.engineer, "POST", base, { revisionId, page: 1, shape: { ...cloud, points: [100, 100, 1300, 200] } });
    expect(off.status).toBe(422);
    expect(off.body.message).toContain("lies off the 1191 × 842 pt page");
    expect(off.body.issues[0].path).toBe("shape.points");

    const noPage = await call(as.engineer, "POST", base, { revisionId, page: 3, shape: cloud });
    expect(noPage.status).toBe(422);
    expect(noPage.body.issues[0].path).toBe("page");

    const elsewhere = await call(as.engineer, "POST", base, { revisionId: otherRevisionId, page: 1, shape: cloud });
    expect(elsewhere.status).toBe(404);
    expect(elsewhere.body.message).toBe("That drawing revision is not on this project.");

    const notJson = await as.engineer.request(base, { method: "POST", headers: { "content-type": "application/json", accept: "application/json" }, body: "{" });
    expect(notJson.status).toBe(400);
    expect(await Markup.count({ where: { requestId: id } })).toBe(0);
  });

  it("answers a stale change with 409 and keeps the other engineer's version", async () => {
    const id = await requestInReview();
    const base = `/api/projects/${pid()}/requests/${id}/markups`;
    const made = await call(as.engineer, "POST", base, { revisionId, page: 1, shape: cloud });
    const markupId = made.body.markup.id;
    const first = await call(as.engineer, "PATCH", `${base}/${markupId}`, { version: 1, shape: { ...cloud, color: "#203040" } });
    expect(first.status).toBe(200);
    const stale = await call(as.engineer, "PATCH", `${base}/${markupId}`, { version: 1, shape: { ...cloud, color: "#000000" } });
    expect(stale.status).toBe(409);
    expect(stale.body.message).toContain("Someone else changed this markup");
    const staleDelete = await call(as.engineer, "DELETE", `${base}/${markupId}`, { version: 1 });
    expect(staleDelete.status).toBe(409);
    const kindChange = await call(as.engineer, "PATCH", `${base}/${markupId}`, { version: 2, shape: { ...cloud, kind: "rectangle" } });
    expect(kindChange.status).toBe(422);
    expect((await Markup.findByPk(markupId))!.shape.color).toBe("#203040");
  });

  it("lets only engineers write, and no one outside the project read", async () => {
    const id = await requestInReview();
    const base = `/api/projects/${pid()}/requests/${id}/markups`;
    for (const who of ["site_plumber", "architect", "manager"] as const) {
      const res = await call(as[who], "POST", base, { revisionId, page: 1, shape: cloud });
      expect(res.status, who).toBe(403);
      expect(res.body.message).toBe("Your role on this project does not allow this.");
    }
    const made = await call(as.engineer, "POST", base, { revisionId, page: 1, shape: cloud });
    const patch = await call(as.site_plumber, "PATCH", `${base}/${made.body.markup.id}`, { version: 1, shape: cloud });
    expect(patch.status).toBe(403);
    expect((await call(as.outsider, "GET", base)).status).toBe(403);
    expect((await call(as.outsider, "POST", base, { revisionId, page: 1, shape: cloud })).status).toBe(403);
    const anonymous = await call(new Client(), "GET", base);
    expect(anonymous.status).toBe(401);
  });

  it("hides a plumber's draft from the engineer", async () => {
    const created = await api(as.site_plumber, "POST", `/api/projects/${pid()}/requests`, CONTENT);
    const res = await call(as.engineer, "POST", `/api/projects/${pid()}/requests/${created.body.request.id}/markups`, { revisionId, page: 1, shape: cloud });
    expect(res.status).toBe(404);
  });
});

describe("pins", () => {
  it("the requester places numbered pins while editable and removes them; others see them but cannot place any", async () => {
    const created = await api(as.site_plumber, "POST", `/api/projects/${pid()}/requests`, CONTENT);
    const id = created.body.request.id as string;
    const base = `/api/projects/${pid()}/requests/${id}/pins`;
    const one = await call(as.site_plumber, "POST", base, { revisionId, page: 1, xPt: 200, yPt: 150 });
    expect(one.status, JSON.stringify(one.body)).toBe(201);
    expect(one.body.pin).toMatchObject({ n: 1, page: 1, xPt: 200, yPt: 150 });
    const two = await call(as.site_plumber, "POST", base, { revisionId, page: 1, xPt: 400, yPt: 300 });
    expect(two.body.pin.n).toBe(2);

    const off = await call(as.site_plumber, "POST", base, { revisionId, page: 1, xPt: 5000, yPt: 10 });
    expect(off.status).toBe(422);
    expect(off.body.issues[0].path).toBe("xPt");
    expect((await call(as.site_plumber, "POST", base, { revisionId: otherRevisionId, page: 1, xPt: 10, yPt: 10 })).status).toBe(404);

    expect((await call(as.site_plumber, "DELETE", `${base}/${one.body.pin.id}`)).status).toBe(200);
    const three = await call(as.site_plumber, "POST", base, { revisionId, page: 1, xPt: 50, yPt: 50 });
    expect(three.body.pin.n).toBe(3);

    const current = (await DeviationRequest.findByPk(id))!;
    expect((await api(as.site_plumber, "POST", `/api/projects/${pid()}/requests/${id}/transitions`, { action: "submit", lockVersion: current.lockVersion })).status).toBe(200);
    const seen = await call(as.engineer, "GET", base);
    expect(seen.status).toBe(200);
    expect(seen.body.pins.map((p: any) => p.n)).toEqual([2, 3]);
    expect((await call(as.engineer, "POST", base, { revisionId, page: 1, xPt: 10, yPt: 10 })).status).toBe(403);
    const locked = await call(as.site_plumber, "POST", base, { revisionId, page: 1, xPt: 10, yPt: 10 });
    expect(locked.status).toBe(409);
    expect((await call(as.site_plumber, "DELETE", `${base}/${two.body.pin.id}`)).status).toBe(409);
  });
});

describe("markups in the signed record", () => {
  it("puts the request's live markups on the decided sheets into the record the engineer signs", async () => {
    const decided = await decidedRequest(pid(), as);
    const base = `/api/projects/${pid()}/requests/${decided.id}/markups`;
    const kept = await call(as.engineer, "POST", base, { revisionId: decided.revisionId, page: 1, shape: cloud });
    const dropped = await call(as.engineer, "POST", base, { revisionId: decided.revisionId, page: 1, shape: { ...cloud, kind: "rectangle" } });
    expect((await call(as.engineer, "DELETE", `${base}/${dropped.body.markup.id}?version=1`)).status).toBe(200);
    const before = await signingPreview(pid(), decided.id);
    expect(before.record.markups).toEqual([{ id: kept.body.markup.id, revisionId: decided.revisionId, page: 1, kind: "cloud", version: 1, shape: cloud }]);
    await call(as.engineer, "PATCH", `${base}/${kept.body.markup.id}`, { version: 1, shape: { ...cloud, points: [120, 120, 320, 220] } });
    expect((await signingPreview(pid(), decided.id)).digest).not.toBe(before.digest);
  });
});
