// Deviation requests over real HTTP against the built app, PostgreSQL, the S3 fake and the mail fake: a request
// with a photo (and every refused upload leaving nothing behind), numbering under concurrency, the workflow with
// its refusals (wrong state, wrong role, stale lock version), versions and what changed, the decision rules
// enforced by the server, comments with mention mail, mutes, and mail that waits while the mail fake is down.
import { createHash } from "node:crypto";
import { execFileSync } from "node:child_process";
import { readFileSync } from "node:fs";
import { beforeAll, describe, expect, it } from "vitest";
import { Op } from "sequelize";
import { AssessmentRow, Attachment, AuditEvent, Decision, DeviationRequest, Project, ProjectMember, RequestVersion, sequelize } from "../../db/models";
import { objectKeys, until } from "../support/drawings";
import { makeProjectTeam, makeUser, PASSWORD } from "../support/factory";
import { Client, pageText } from "../support/http";
import { mailsTo, waitForMail } from "../support/mail";
import { api, attach, CONTENT, makePhoto, principles } from "../support/requests";

type Who = "manager" | "architect" | "engineer" | "site_plumber" | "outsider";
let team: Awaited<ReturnType<typeof makeProjectTeam>>;
const as = {} as Record<Who, Client>;
const pid = () => team.project.id;
const base = () => `/api/projects/${pid()}/requests`;

beforeAll(async () => {
  team = await makeProjectTeam();
  for (const role of ["manager", "architect", "engineer", "site_plumber"] as const) {
    as[role] = new Client();
    await as[role].signIn(team.users[role].email, PASSWORD);
  }
  as.outsider = new Client();
  await as.outsider.signIn(team.outsider.email, PASSWORD);
});

async function create(content: Record<string, unknown> = CONTENT, who: Client = as.site_plumber, projectId = pid()) {
  const res = await api(who, "POST", `/api/projects/${projectId}/requests`, content);
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  return res.body.request as { id: string; code: string; number: number; state: string; lockVersion: number; latest: any };
}

async function move(who: Who, id: string, action: string, extra: Record<string, unknown> = {}) {
  const current = (await DeviationRequest.findByPk(id))!;
  return api(as[who], "POST", `${base()}/${id}/transitions`, { action, lockVersion: current.lockVersion, ...extra });
}

async function moveOk(who: Who, id: string, action: string, extra: Record<string, unknown> = {}) {
  const res = await move(who, id, action, extra);
  expect(res.status, JSON.stringify(res.body)).toBe(200);
  return res.body as { from: string; to: string; lockVersion: number };
}

async function inReview() {
  const r = await create();
  await moveOk("site_plumber", r.id, "submit");
  await moveOk("engineer", r.id, "start_review");
  return r;
}

const audits = (id: string) => AuditEvent.findAll({ where: { subjectId: id }, order: [["createdAt", "ASC"]] });

describe("raising a request", () => {
  it("creates a numbered draft with typed measurements and a photo stored by its SHA-256, with a thumbnail", async () => {
    const r = await create();
    expect(r.code).toMatch(/^DR-\d{3}$/);
    expect(r.state).toBe("draft");
    expect(r.latest.measurements).toEqual([
      { kind: "lengthM", name: "Discharge run", value: 6, unit: "m" },
      { kind: "bendCount", name: "Bends", value: 2, unit: "bends" },
      { kind: "staticPressureKpa", name: "Static pressure at meter", value: 550, unit: "kPa" },
    ]);

    const photo = await makePhoto();
    const sha = createHash("sha256").update(photo).digest("hex");
    const up = await attach(as.site_plumber, pid(), r.id, photo, "roof.jpg");
    expect(up.status, JSON.stringify(up.body)).toBe(201);
    expect(up.body.attachment).toMatchObject({ filename: "roof.jpg", contentType: "image/jpeg", isImage: true, versionN: 1 });
    expect(await objectKeys(`projects/${pid()}/attachments/${sha}`)).toHaveLength(1);
    expect(await objectKeys(`projects/${pid()}/thumbs/${sha}-p1.webp`)).toHaveLength(1);

    const own = await as.site_plumber.get(up.body.attachment.url);
    expect(own.status).toBe(200);
    expect(own.headers.get("content-type")).toBe("image/jpeg");
    expect(createHash("sha256").update(new Uint8Array(await own.arrayBuffer())).digest("hex")).toBe(sha);
    const thumb = await as.site_plumber.get(up.body.attachment.thumbUrl);
    expect(thumb.headers.get("content-type")).toBe("image/webp");
    // A draft and its files are the author's own until submitted; other projects never see them.
    expect((await as.engineer.get(up.body.attachment.url)).status).toBe(404);
    expect((await api(as.engineer, "GET", `${base()}/${r.id}`)).status).toBe(404);
    expect((await as.outsider.get(up.body.attachment.url)).status).toBe(403);
  });

  it("refuses a file that is not a photo or PDF, one too large, and one from someone else — leaving nothing behind", async () => {
    const r = await create();
    const before = { rows: await Attachment.count({ where: { projectId: pid() } }), objects: (await objectKeys(`projects/${pid()}/`)).length };
    const fake = await attach(as.site_plumber, pid(), r.id, new TextEncoder().encode("#!/bin/sh\necho not a photo\n"), "photo.jpg", "image/jpeg");
    expect(fake.status).toBe(415);
    expect(fake.body.message).toMatch(/not a photo or a PDF/);
    const big = new Uint8Array(16 * 1024 * 1024);
    big.set(await makePhoto(8, 8));
    const huge = await attach(as.site_plumber, pid(), r.id, big, "huge.jpg");
    expect(huge.status).toBe(413);
    expect(huge.body.message).toMatch(/larger than 15 MB/);
    const broken = new Uint8Array([0xff, 0xd8, 0xff, 0xe0, 1, 2, 3, 4, 5, 6, 7, 8, 9]);
    expect((await attach(as.site_plumber, pid(), r.id, broken, "broken.jpg")).status).toBe(422);
    await moveOk("site_plumber", r.id, "submit");
    const engineer = await attach(as.engineer, pid(), r.id, await makePhoto(10, 10, "#123456"), "mine.jpg");
    expect(engineer.status).toBe(403);
    const late = await attach(as.site_plumber, pid(), r.id, await makePhoto(10, 10, "#654321"), "late.jpg");
    expect(late.status).toBe(409);
    expect(await Attachment.count({ where: { projectId: pid() } })).toBe(before.rows);
    expect((await objectKeys(`projects/${pid()}/`)).length).toBe(before.objects);
  });

  it("starts a draft from the page and autosaves it; other roles cannot raise one", async () => {
    const started = await as.site_plumber.post(`/projects/${pid()}/requests/new`, { title: "Vacuum breaker on unit 6", provision: "vacuum_breakers", clauseRef: "" });
    expect(started.status).toBe(302);
    const edit = started.headers.get("location")!;
    expect(edit).toMatch(/\/requests\/[0-9a-f-]{36}\/edit$/);
    const id = edit.split("/").at(-2)!;
    const saved = await as.site_plumber.post(edit, {
      intent: "save", title: "Vacuum breaker on unit 6", provision: "vacuum_breakers", clauseRef: "", siteConstraint: "No riser space.", proposal: "",
      "measurements[0].kind": "distanceMm", "measurements[0].name": "Breaker from outlet", "measurements[0].value": "450",
      "measurements[1].kind": "lengthM", "measurements[1].name": "", "measurements[1].value": "",
    });
    expect(saved.status).toBe(200);
    const v = (await RequestVersion.findOne({ where: { requestId: id, n: 1 } }))!;
    expect(v.siteConstraint).toBe("No riser space.");
    expect(v.measurements).toEqual([{ kind: "distanceMm", name: "Breaker from outlet", value: 450, unit: "mm" }]);
    const bad = await as.site_plumber.post(edit, { intent: "save", title: "x", provision: "vacuum_breakers", "measurements[0].kind": "lengthM", "measurements[0].value": "six" });
    expect(bad.status).toBe(422);
    expect(await pageText(bad)).toMatch(/Use at least 3 characters/);
    expect((await RequestVersion.findOne({ where: { requestId: id, n: 1 } }))!.title).toBe("Vacuum breaker on unit 6");
    expect((await as.engineer.post(`/projects/${pid()}/requests/new`, { title: "Not mine to raise", provision: "other" })).status).toBe(403);
    expect((await api(as.manager, "POST", base(), CONTENT)).status).toBe(403);
  });

  it("numbers requests per project without gaps or duplicates under concurrency", async () => {
    const fresh = await makeProjectTeam();
    const plumber = new Client();
    await plumber.signIn(fresh.users.site_plumber.email, PASSWORD);
    const made = await Promise.all(Array.from({ length: 6 }, (_, i) => create({ title: `Concurrent ${i}`, provision: "other" }, plumber, fresh.project.id)));
    expect(made.map((r) => r.number).sort((a, b) => a - b)).toEqual([1, 2, 3, 4, 5, 6]);
    expect(made.map((r) => r.code).sort()).toEqual(["DR-001", "DR-002", "DR-003", "DR-004", "DR-005", "DR-006"]);
  });
});

describe("workflow", () => {
  it("submits to the project's engineer with a due date, audits the move and mails the engineer", async () => {
    const r = await create();
    const done = await moveOk("site_plumber", r.id, "submit");
    expect(done).toMatchObject({ from: "draft", to: "submitted", lockVersion: 1 });
    const row = (await DeviationRequest.findByPk(r.id))!;
    expect(row.assigneeId).toBe(team.users.engineer.id);
    const days = (row.dueAt!.getTime() - row.submittedAt!.getTime()) / 86_400_000;
    expect(days).toBeGreaterThanOrEqual(5);
    expect(days).toBeLessThanOrEqual(7);
    expect((await RequestVersion.findOne({ where: { requestId: r.id, n: 1 } }))!.submittedAt).not.toBeNull();
    const events = await audits(r.id);
    expect(events.map((e) => e.action)).toEqual(["request.created", "request.submit"]);
    expect(events[1]!.actorId).toBe(team.users.site_plumber.id);
    expect(events[1]!.data).toMatchObject({ from: "draft", to: "submitted", note: "", assigneeId: team.users.engineer.id });
    const mail = await waitForMail(team.users.engineer.email, new RegExp(`${r.code} submitted for your review`));
    expect(mail.text).toContain(`/projects/${pid()}/requests/${r.id}`);
  });

  it("refuses a move in the wrong state, by the wrong role, on a stale version, or before the request is complete — changing nothing", async () => {
    const incomplete = await create({ title: "Incomplete one", provision: "balance" });
    const notReady = await move("site_plumber", incomplete.id, "submit");
    expect(notReady.status).toBe(422);
    expect(notReady.body.issues.map((i: { path: string }) => i.path)).toEqual(["siteConstraint", "proposal"]);
    expect((await DeviationRequest.findByPk(incomplete.id))!.state).toBe("draft");

    const r = await create();
    await moveOk("site_plumber", r.id, "submit");
    const before = { row: (await DeviationRequest.findByPk(r.id))!.get({ plain: true }), events: (await audits(r.id)).length };

    const wrongState = await move("engineer", r.id, "request_info", { note: "Photos please" });
    expect(wrongState.status).toBe(409);
    expect(wrongState.body.message).toMatch(/submitted, so “Ask for more information” is not possible now/);
    const wrongRole = await move("site_plumber", r.id, "start_review");
    expect(wrongRole.status).toBe(403);
    expect(wrongRole.body.message).toMatch(/Your role cannot/);
    expect((await move("architect", r.id, "withdraw")).status).toBe(403);
    const stale = await api(as.engineer, "POST", `${base()}/${r.id}/transitions`, { action: "start_review", lockVersion: 0 });
    expect(stale.status).toBe(409);
    expect(stale.body.message).toMatch(/Someone else moved this request first/);
    const unknown = await api(as.engineer, "POST", `${base()}/${r.id}/transitions`, { action: "approve_everything", lockVersion: 1 });
    expect(unknown.status).toBe(422);
    const decideHere = await move("engineer", r.id, "decide");
    expect(decideHere.status).toBe(409);

    const after = (await DeviationRequest.findByPk(r.id))!.get({ plain: true });
    expect(after).toEqual(before.row);
    expect((await audits(r.id)).length).toBe(before.events);
  });

  it("lets only one of two simultaneous moves through", async () => {
    const r = await create();
    await moveOk("site_plumber", r.id, "submit");
    const [a, b] = await Promise.all([
      api(as.engineer, "POST", `${base()}/${r.id}/transitions`, { action: "start_review", lockVersion: 1 }),
      api(as.manager, "POST", `${base()}/${r.id}/transitions`, { action: "withdraw", lockVersion: 1 }),
    ]);
    expect([a.status, b.status].sort()).toEqual([200, 409]);
    expect((await DeviationRequest.findByPk(r.id))!.lockVersion).toBe(2);
  });

  it("shows a refused page move as a message, not an error page", async () => {
    const r = await create();
    await moveOk("site_plumber", r.id, "submit");
    const res = await as.engineer.post(`/projects/${pid()}/requests/${r.id}?index`, { intent: "move", move: "start_review", lockVersion: "0" });
    expect(res.status).toBe(409);
    expect(await pageText(res)).toContain("Someone else moved this request first");
  });

  it("assigns the engineer with the fewest open requests, and lets a manager reassign", async () => {
    const fresh = await makeProjectTeam();
    const second = await makeUser({ name: "Aaa Second Engineer" });
    await ProjectMember.create({ projectId: fresh.project.id, userId: second.id, role: "engineer" });
    const plumber = new Client();
    await plumber.signIn(fresh.users.site_plumber.email, PASSWORD);
    const manager = new Client();
    await manager.signIn(fresh.users.manager.email, PASSWORD);
    const submit = async () => {
      const r = await create(CONTENT, plumber, fresh.project.id);
      const res = await api(plumber, "POST", `/api/projects/${fresh.project.id}/requests/${r.id}/transitions`, { action: "submit", lockVersion: 0 });
      expect(res.status).toBe(200);
      return (await DeviationRequest.findByPk(r.id))!;
    };
    const first = await submit();
    const next = await submit();
    expect(first.assigneeId).toBe(second.id); // tie: by name
    expect(next.assigneeId).toBe(fresh.users.engineer.id); // fewest open
    const page = `/projects/${fresh.project.id}/requests/${next.id}?index`;
    const reassigned = await manager.post(page, { intent: "assign", assigneeId: second.id, lockVersion: "1" });
    expect(reassigned.status).toBe(200);
    expect((await DeviationRequest.findByPk(next.id))!.assigneeId).toBe(second.id);
    await waitForMail(second.email, /assigned to you/);
    expect((await manager.post(page, { intent: "assign", assigneeId: fresh.users.architect.id, lockVersion: "2" })).status).toBe(422);
    expect((await plumber.post(page, { intent: "assign", assigneeId: second.id, lockVersion: "2" })).status).toBe(403);
    const due = await manager.post(page, { intent: "due", dueOn: "2031-05-06", lockVersion: "2" });
    expect(due.status).toBe(200);
    expect((await DeviationRequest.findByPk(next.id))!.dueAt!.toISOString()).toBe("2031-05-06T15:00:00.000Z");
    // The other engineer may not act on it now.
    const engineer = new Client();
    await engineer.signIn(fresh.users.engineer.email, PASSWORD);
    const res = await api(engineer, "POST", `/api/projects/${fresh.project.id}/requests/${next.id}/transitions`, { action: "start_review", lockVersion: 3 });
    expect(res.status).toBe(403);
    expect(res.body.message).toMatch(/assigned to another engineer/);
  });
});

describe("versions", () => {
  it("keeps the version the engineer saw, starts a new one on resubmission, and shows what changed", async () => {
    const r = await inReview();
    await moveOk("engineer", r.id, "request_info", { note: "Which pipe size, and how long is the run really?" });
    const asked = await waitForMail(team.users.site_plumber.email, new RegExp(`${r.code}: more information needed`));
    expect(asked.text).toContain("Which pipe size");
    expect((await move("engineer", r.id, "request_info", { note: "" })).status).toBe(409);

    const changed = {
      ...CONTENT,
      proposal: "Run a 28 mm discharge pipe, enlarged from the valve outlet, 7.5 m along the parapet to the gutter outlet, with two 45° bends.",
      measurements: [
        { kind: "lengthM", name: "Discharge run", value: 7.5 },
        { kind: "bendCount", name: "Bends", value: 2 },
        { kind: "pipeSizeMm", name: "Discharge pipe", value: 28 },
      ],
    };
    const save = await api(as.site_plumber, "POST", `${base()}/${r.id}`, changed);
    expect(save.status, JSON.stringify(save.body)).toBe(200);
    expect(save.body.saved.versionN).toBe(2);
    const photo2 = await attach(as.site_plumber, pid(), r.id, await makePhoto(320, 240, "#2f6b3a"), "measured.jpg");
    expect(photo2.body.attachment.versionN).toBe(2);
    const v1 = (await RequestVersion.findOne({ where: { requestId: r.id, n: 1 } }))!;
    expect(v1.proposal).toBe(CONTENT.proposal);

    await moveOk("site_plumber", r.id, "resubmit");
    await waitForMail(team.users.engineer.email, new RegExp(`${r.code} resubmitted`));
    const detail = await api(as.engineer, "GET", `${base()}/${r.id}`);
    expect(detail.body.request.sent.n).toBe(2);
    const diff = detail.body.request.diff;
    expect(diff).toMatchObject({ from: 1, to: 2, unchanged: false });
    const proposal = diff.fields.find((f: { field: string }) => f.field === "proposal");
    expect(proposal.parts.filter((p: any) => p.removed).map((p: any) => p.value).join(" ")).toMatch(/22/);
    expect(proposal.parts.filter((p: any) => p.added).map((p: any) => p.value).join(" ")).toMatch(/28[\s\S]*enlarged from the valve outlet/);
    expect(diff.measurements).toEqual([
      { change: "changed", name: "Discharge run", before: "6 m", after: "7.5 m" },
      { change: "added", name: "Discharge pipe", after: "28 mm" },
      { change: "removed", name: "Static pressure at meter", before: "550 kPa" },
    ]);
    const versions = await api(as.engineer, "GET", `${base()}/${r.id}/versions`);
    expect(versions.body.versions.map((v: { n: number }) => v.n)).toEqual([1, 2]);
    expect(versions.body.versions[1].changes.fields.map((f: { field: string }) => f.field)).toEqual(["proposal"]);
    const page = await pageText(await as.engineer.get(`/projects/${pid()}/requests/${r.id}/review`));
    expect(page).toContain("What changed from version 1 to 2");
    expect(page).toContain("Discharge run: 6 m → 7.5 m");
    // Content is frozen while the engineer has it.
    expect((await api(as.site_plumber, "POST", `${base()}/${r.id}`, changed)).status).toBe(409);
  });

  it("gives an unedited resubmission its own version", async () => {
    const r = await inReview();
    await moveOk("engineer", r.id, "request_info", { note: "Confirm, please." });
    await moveOk("site_plumber", r.id, "resubmit");
    const versions = await RequestVersion.findAll({ where: { requestId: r.id }, order: [["n", "ASC"]] });
    expect(versions.map((v) => [v.n, !!v.submittedAt])).toEqual([[1, true], [2, true]]);
    expect((await api(as.engineer, "GET", `${base()}/${r.id}`)).body.request.diff.unchanged).toBe(true);
  });
});

describe("decision", () => {
  const decide = (who: Who, id: string, decision: Record<string, unknown>) => move(who, id, "decide", decision);

  it("enforces the rules on the server: nothing is recorded while they are not met", async () => {
    const r = await inReview();
    const compromised = principles();
    compromised[2] = { principleId: "safe_discharge", outcome: "compromised", reasoning: "Run too long" };
    const cases: [Record<string, unknown>, RegExp][] = [
      [{ outcome: "approved", principles: compromised }, /is compromised, so the design cannot be approved/],
      [{ outcome: "approved", principles: principles("maintained", "") }, /is maintained: say how/],
      [{ outcome: "approved", principles: principles().slice(0, 10) }, /Record an outcome for “Electrical safety”/],
      [{ outcome: "approved_with_conditions", principles: principles(), conditions: ["  "] }, /needs at least one condition/],
      [{ outcome: "refused", principles: compromised, reasons: "" }, /A refusal needs its reasons/],
      [{ outcome: "approved", principles: principles(), restsOn: ["6f1c1c1e-7b8a-4c52-9a51-3f9b0f6f0d11"] }, /current drawing revisions/],
      [{ outcome: "approved", principles: [{ ...principles()[0], evidence: ["6f1c1c1e-7b8a-4c52-9a51-3f9b0f6f0d11"] }, ...principles().slice(1)] }, /files attached to this request/],
    ];
    for (const [body, message] of cases) {
      const res = await decide("engineer", r.id, body);
      expect(res.status, JSON.stringify(body)).toBe(422);
      expect(res.body.message).toMatch(message);
      expect(res.body.issues.length).toBeGreaterThan(0);
    }
    expect((await decide("site_plumber", r.id, { outcome: "approved", principles: principles() })).status).toBe(403);
    expect((await decide("manager", r.id, { outcome: "approved", principles: principles() })).status).toBe(403);
    expect((await DeviationRequest.findByPk(r.id))!.state).toBe("in_review");
    expect(await Decision.count({ where: { requestId: r.id, recordedAt: { [Op.ne]: null } } })).toBe(0);
  });

  it("records an approval with numbered conditions, its assessments and the revisions it rests on, unsigned", async () => {
    const r = await inReview();
    // A current drawing revision of this project, put straight in the database (the register is tested elsewhere).
    const [[drawing]] = (await sequelize.query(
      `INSERT INTO drawings (id, project_id, sheet_number, title, discipline, created_by_id, created_at, updated_at)
       VALUES (gen_random_uuid(), :p, :n, 'Roof plumbing', 'Plumbing', :u, now(), now()) RETURNING id`,
      { replacements: { p: pid(), n: `R-${Date.now()}`, u: team.users.architect.id } },
    )) as [{ id: string }[], unknown];
    const [[revision]] = (await sequelize.query(
      `INSERT INTO drawing_revisions (id, project_id, drawing_id, label, status, object_key, sha256, byte_size, page_count, uploaded_by_id, created_at, updated_at)
       VALUES (gen_random_uuid(), :p, :d, 'C1', 'accepted', 'k', :sha, 1, 1, :u, now(), now()) RETURNING id`,
      { replacements: { p: pid(), d: drawing!.id, sha: `sha-${Date.now()}`, u: team.users.architect.id } },
    )) as [{ id: string }[], unknown];
    const judged = principles();
    judged[2] = { principleId: "safe_discharge", outcome: "maintained", reasoning: "28 mm from the valve outlet keeps the run within its limit." };
    const ok = await decide("engineer", r.id, { outcome: "approved_with_conditions", principles: judged, conditions: ["Fit a tundish at the gutter outlet.", "", "Label the discharge pipe."], restsOn: [revision!.id] });
    expect(ok.status, JSON.stringify(ok.body)).toBe(200);
    expect(ok.body.to).toBe("decided");
    const decision = (await Decision.findOne({ where: { requestId: r.id } }))!;
    expect(decision).toMatchObject({ outcome: "approved_with_conditions", conditions: [{ n: 1, text: "Fit a tundish at the gutter outlet." }, { n: 2, text: "Label the discharge pipe." }], restsOn: [revision!.id] });
    expect(decision.recordedAt).not.toBeNull();
    const assessments = await AssessmentRow.findAll({ where: { decisionId: decision.id } });
    expect(assessments).toHaveLength(11);
    expect(assessments.find((a) => a.principle === "safe_discharge")).toMatchObject({ outcome: "maintained", reasoning: expect.stringContaining("28 mm") });
    const event = (await audits(r.id)).at(-1)!;
    expect(event.action).toBe("request.decide");
    expect(event.data).toMatchObject({ from: "in_review", to: "decided", decisionId: decision.id, outcome: "approved_with_conditions" });
    await waitForMail(team.users.site_plumber.email, new RegExp(`${r.code} decided`));
    const desk = await pageText(await as.site_plumber.get(`/projects/${pid()}/requests/${r.id}/review`));
    expect(desk).toContain("Approved with conditions");
    expect(desk).toContain("recorded, not yet signed");
    expect(desk).toContain("supports the registered engineer");
  });

  it("saves the engineer's work in progress from the review desk without recording anything", async () => {
    const r = await inReview();
    const row = (await DeviationRequest.findByPk(r.id))!;
    const res = await as.engineer.post(`/projects/${pid()}/requests/${r.id}/review`, {
      intent: "save", lockVersion: String(row.lockVersion), outcome: "approved",
      "principles[0].principleId": "pressure_containment", "principles[0].outcome": "maintained", "principles[0].reasoning": "",
    });
    expect(res.status).toBe(200);
    const draft = (await Decision.findOne({ where: { requestId: r.id } }))!;
    expect(draft.recordedAt).toBeNull();
    expect(draft.outcome).toBeNull();
    const record = await as.engineer.post(`/projects/${pid()}/requests/${r.id}/review`, {
      intent: "record", lockVersion: String(row.lockVersion), outcome: "approved",
      "principles[0].principleId": "pressure_containment", "principles[0].outcome": "maintained", "principles[0].reasoning": "",
    });
    expect(record.status).toBe(422);
    expect(await pageText(record)).toContain("The decision cannot be recorded yet");
    expect((await DeviationRequest.findByPk(r.id))!.state).toBe("in_review");
  });
});

describe("conversation and notifications", () => {
  it("mails the members a comment mentions, with its attachment, and not those who muted the project", async () => {
    const r = await create();
    await moveOk("site_plumber", r.id, "submit");
    const file = await attach(as.architect, pid(), r.id, await makePhoto(200, 150, "#444444"), "sketch.jpg", "image/jpeg", true);
    expect(file.status).toBe(201);
    expect((await as.manager.post(`/projects/${pid()}/requests?index`, { muted: "1" })).status).toBe(200);
    const res = await api(as.architect, "POST", `${base()}/${r.id}/comments`, {
      body: `@${team.users.engineer.name} and @${team.users.manager.name}: the parapet is 600 mm high, see sketch.`,
      attachmentIds: [file.body.attachment.id],
    });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    expect(res.body.comment.mentions.sort()).toEqual([team.users.engineer.id, team.users.manager.id].sort());
    const mail = await waitForMail(team.users.engineer.email, new RegExp(`You were mentioned on ${r.code}`));
    expect(mail.text).toContain("the parapet is 600 mm high");
    const thread = await api(as.engineer, "GET", `${base()}/${r.id}/comments`);
    expect(thread.body.comments.at(-1).attachments.map((a: { filename: string }) => a.filename)).toEqual(["sketch.jpg"]);
    // Someone else's upload cannot be slipped into a comment.
    const foreign = await attach(as.engineer, pid(), r.id, await makePhoto(20, 20, "#777777"), "e.jpg", "image/jpeg", true);
    expect((await api(as.architect, "POST", `${base()}/${r.id}/comments`, { body: "mine now", attachmentIds: [foreign.body.attachment.id] })).status).toBe(422);
    expect((await api(as.architect, "POST", `${base()}/${r.id}/comments`, { body: "  " })).status).toBe(422);
    const queued = await sequelize.query(`SELECT count(*)::int AS n FROM pgboss.job WHERE name = 'mail.send' AND data->>'to' = :to`, { replacements: { to: team.users.manager.email }, plain: true });
    expect(queued!.n).toBe(0);
    expect(await mailsTo(team.users.manager.email)).toEqual([]);
    await as.manager.post(`/projects/${pid()}/requests?index`, { muted: "0" });
  });

  it("keeps mail in the queue while the mail server is down and delivers it once it is back", async () => {
    const run = process.env.COUNTERSIGN_RUN ?? "test";
    const pidFile = new URL(`../../.run/${run}/mail.pid`, import.meta.url);
    const r = await create();
    const mailPid = Number(readFileSync(pidFile, "utf8"));
    process.kill(mailPid);
    // Gone, not merely deaf: a new fake cannot take the ports while the old process still holds one of them.
    const gone = () => { try { process.kill(mailPid, 0); return false; } catch { return true; } };
    await until(async () => gone(), 10_000, "mail fake to stop");
    try {
      await moveOk("site_plumber", r.id, "submit");
      const job = await until(async () => {
        const row = (await sequelize.query(`SELECT state, retry_count FROM pgboss.job WHERE name = 'mail.send' AND data->>'subject' LIKE :s`, { replacements: { s: `${r.code} submitted%` }, plain: true })) as { state: string; retry_count: number } | null;
        return row && row.retry_count >= 1 ? row : null;
      }, 15_000, "a failed delivery attempt");
      expect(["retry", "created", "active"]).toContain(job.state);
    } finally {
      execFileSync("bash", ["storage/fakes.sh", "up", run], { cwd: new URL("../..", import.meta.url).pathname, env: process.env, stdio: "ignore" });
    }
    const mail = await waitForMail(team.users.engineer.email, new RegExp(`${r.code} submitted for your review`), 60_000);
    expect(mail.subject).toContain(r.code);
  }, 90_000);
});

describe("lists", () => {
  it("counts per state, filters, and puts what needs my action first", async () => {
    const list = await api(as.engineer, "GET", base());
    expect(list.status).toBe(200);
    expect(list.body.counts.draft).toBeUndefined(); // others' drafts are not listed
    expect(list.body.counts.in_review).toBeGreaterThan(0);
    const flags = list.body.rows.map((r: { needsMe: boolean }) => r.needsMe);
    expect(flags.indexOf(false)).toBeGreaterThan(0);
    expect(flags.slice(flags.indexOf(false))).not.toContain(true);
    const decided = await api(as.engineer, "GET", `${base()}?state=decided`);
    expect(decided.body.rows.every((r: { state: string }) => r.state === "decided")).toBe(true);
    expect(decided.body.rows.length).toBe(list.body.counts.decided);
    const discharge = await api(as.engineer, "GET", `${base()}?provision=balance`);
    expect(discharge.body.rows.every((r: { provision: string }) => r.provision === "balance")).toBe(true);
    const mine = await api(as.site_plumber, "GET", `${base()}?assignee=none`);
    expect(mine.body.rows.every((r: { assigneeId: string | null }) => r.assigneeId === null)).toBe(true);
    await DeviationRequest.update({ dueAt: new Date(Date.now() - 86_400_000) }, { where: { projectId: pid(), state: "in_review" } });
    const overdue = await api(as.engineer, "GET", `${base()}?overdue=1`);
    expect(overdue.body.rows.length).toBeGreaterThanOrEqual(list.body.counts.in_review);
    expect(overdue.body.rows.every((r: { overdue: boolean }) => r.overdue)).toBe(true);

    const page = await pageText(await as.engineer.get(`/projects/${pid()}/requests?state=in_review`));
    expect(page).toContain("Needs your action");
    expect(page).toContain("(overdue)");
    const across = await pageText(await as.site_plumber.get("/requests"));
    expect(across).toContain(team.project.name);
    expect(across).toContain("Unit 5 discharge run on the flat roof");
    const other = await pageText(await as.outsider.get("/requests"));
    expect(other).not.toContain("Unit 5 discharge run on the flat roof");
    expect((await Project.findByPk(pid()))!.id).toBe(pid());
  });
});
