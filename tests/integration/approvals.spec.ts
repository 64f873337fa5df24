// Signed approvals end to end over HTTP: an engineer verified by a manager signs a decided request; the pack
// is checked by poppler's pdfsig (read from its output) and by our own verifier; the refusals (wrong password,
// unverified, stale record, a calculation that no longer reproduces, a race, storage down) leave nothing behind;
// supersession, site retrieval, installation and public verification work.
import { execFileSync } from "node:child_process";
import { mkdtempSync, readFileSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { beforeAll, describe, expect, it } from "vitest";
import { verifyRegistration } from "../../app/approvals/verification.server";
import { calculate } from "../../app/calculations/calculations.server";
import { EXAMPLES } from "../../app/calculations/examples";
import { getObjectBytes } from "../../app/platform/storage.server";
import { Approval, AuditEvent, Calculation, Decision, DeviationRequest, InstallationRecord, ProjectMember, RequestVersion, sequelize } from "../../db/models";
import { makeSheet, upload, until } from "../support/drawings";
import { makeProjectTeam, PASSWORD } from "../support/factory";
import { Client, pageText } from "../support/http";
import { decidedRequest as decidedRequestFor } from "../support/approvals";
import { waitForMail } from "../support/mail";
import { makePhoto } from "../support/requests";

type Team = Awaited<ReturnType<typeof makeProjectTeam>>;
const dir = mkdtempSync(path.join(tmpdir(), "approvals-"));
const as: Record<string, Client> = {};
let team: Team;
let n = 0;

function pdfsig(bytes: Uint8Array) {
  const file = path.join(dir, `p${n++}.pdf`);
  writeFileSync(file, bytes);
  try {
    return execFileSync("pdfsig", [file], { encoding: "utf8" });
  } catch (e) {
    return String((e as { stdout?: string }).stdout ?? e);
  }
}

const decidedRequest = (title?: string) => decidedRequestFor(team.project.id, as as never, title);

async function signPage(requestId: string, who = "engineer") {
  const res = await as[who]!.get(`/projects/${team.project.id}/requests/${requestId}/sign`);
  const html = await pageText(res);
  return { status: res.status, html, digest: html.match(/name="seenDigest" value="([0-9a-f]{64})"/)?.[1] };
}

async function sign(requestId: string, digest: string, password = PASSWORD, who = "engineer") {
  return as[who]!.post(`/projects/${team.project.id}/requests/${requestId}/sign`, { password, seenDigest: digest, confirm: "on" });
}

beforeAll(async () => {
  team = await makeProjectTeam();
  for (const role of ["manager", "architect", "engineer", "site_plumber"] as const) {
    as[role] = new Client();
    await as[role].signIn(team.users[role].email, PASSWORD);
  }
  as.outsider = new Client();
  await as.outsider.signIn(team.outsider.email, PASSWORD);
  await team.users.engineer.update({ registrationNumber: "ENG-777", registrationBody: "Test board", registrationState: "unverified" });
});

describe("before verification", () => {
  it("lets an unverified engineer review but not sign", async () => {
    const r = await decidedRequest();
    const page = await signPage(r.id);
    expect(page.status).toBe(200);
    expect(page.html).toContain("not verified on Countersign");
    expect(page.digest).toBeUndefined();
    const res = await sign(r.id, "0".repeat(64));
    expect(res.status).toBe(403);
    expect(await Approval.count({ where: { requestId: r.id } })).toBe(0);
  });
});

describe("signing", () => {
  beforeAll(async () => {
    const member = (await ProjectMember.findOne({ where: { projectId: team.project.id, userId: team.users.engineer.id } }))!;
    await verifyRegistration(team.users.manager.id, team.project.id, member.id, { registrationNumber: "ENG-777", registrationBody: "Test board", checkedOn: "2026-11-30" });
  });

  it("signs a pack that pdfsig and our verifier accept, and that a one-byte change breaks", async () => {
    const r = await decidedRequest();
    const page = await signPage(r.id);
    expect(page.html).toContain("Sign approval v1 of");
    expect(page.html).toContain("Insulate the exposed run.");
    const res = await sign(r.id, page.digest!);
    expect(res.status).toBe(302);
    const approval = (await Approval.findOne({ where: { requestId: r.id } }))!;
    expect(res.headers.get("location")).toBe(`/projects/${team.project.id}/approvals/${approval.id}?signed=1`);
    expect(approval).toMatchObject({ n: 1, state: "current", outcome: "approved_with_conditions" });
    expect(approval.verifyCode.length).toBeGreaterThanOrEqual(20);
    const pack = (await getObjectBytes(approval.packKey))!;
    const out = pdfsig(pack);
    expect(out).toContain("Signature is Valid.");
    expect(out).toContain("Total document signed");
    const tampered = Buffer.from(pack);
    const at = tampered.indexOf("/CreationDate (D:") + 17 + 3;
    tampered[at] = tampered[at] === 0x31 ? 0x32 : 0x31;
    expect(pdfsig(tampered)).toContain("Digest Mismatch.");
    expect(await AuditEvent.count({ where: { action: "approval.signed", subjectId: approval.id } })).toBe(1);
    await waitForMail(team.users.site_plumber.email, /approval v1 signed/);

    // Signed approvals cannot be edited, only moved between states — enforced by the database.
    await expect(sequelize.query(`UPDATE approvals SET reference = 'DR-999' WHERE id = :id`, { replacements: { id: approval.id } })).rejects.toThrow(/cannot be edited/);
    await expect(sequelize.query(`DELETE FROM approvals WHERE id = :id`, { replacements: { id: approval.id } })).rejects.toThrow(/never deleted/);
  });

  it("starts the provision's calculator from the request's measurements", async () => {
    const r = await decidedRequest();
    const html = await pageText(await as.engineer!.get(`/projects/${team.project.id}/requests/${r.id}`));
    expect(html).toContain(`/calculations/new/discharge?from=${r.id}`);
    const calc = await pageText(await as.engineer!.get(`/projects/${team.project.id}/calculations/new/discharge?from=${r.id}`));
    expect(calc).toMatch(/Started from the measurements on DR-\d+/);
  });

  it("refuses a wrong password, a stale record, and signing the same decision twice", async () => {
    const r = await decidedRequest();
    const { digest } = await signPage(r.id);
    const wrong = await sign(r.id, digest!, "not my password");
    expect(wrong.status).toBe(401);
    expect(await pageText(wrong)).toContain("That password is not right");
    const stale = await sign(r.id, "a".repeat(64));
    expect(stale.status).toBe(409);
    expect(await pageText(stale)).toContain("The record changed since you opened it");
    expect(await Approval.count({ where: { requestId: r.id } })).toBe(0);
    expect((await sign(r.id, digest!)).status).toBe(302);
    const again = await signPage(r.id);
    expect(again.status).toBe(409);
  });

  it("produces exactly one version when two engineers sign at once", async () => {
    const r = await decidedRequest();
    const { digest } = await signPage(r.id);
    const results = await Promise.all([sign(r.id, digest!), sign(r.id, digest!)]);
    expect(results.map((x) => x.status).sort()).toEqual([302, 409]);
    expect(await Approval.count({ where: { requestId: r.id } })).toBe(1);
  });

  it("refuses when an attached calculation no longer reproduces", async () => {
    const r = await decidedRequest();
    const run = calculate("discharge", EXAMPLES.discharge);
    await Calculation.create({ projectId: team.project.id, kind: "discharge", title: "Discharge run", inputs: run.input, outputs: { ...(run.output as object), ok: !(run.output as { ok: boolean }).ok }, engineVersion: "0.9.0", createdBy: team.users.engineer.id, requestId: r.id });
    const { digest } = await signPage(r.id);
    const res = await sign(r.id, digest!);
    expect(res.status).toBe(409);
    expect(await pageText(res)).toContain("now gives different results");
    expect(await Approval.count({ where: { requestId: r.id } })).toBe(0);
  });

  it("rolls back, with a clear message, when the file store is down while signing", async () => {
    const r = await decidedRequest();
    const { digest } = await signPage(r.id);
    const runName = process.env.COUNTERSIGN_RUN ?? "test";
    const pid = Number(readFileSync(`.run/${runName}/s3.pid`, "utf8"));
    process.kill(pid, "SIGKILL");
    try {
      await until(async () => { try { process.kill(pid, 0); return false; } catch { return true; } }, 5_000, "the S3 fake to stop");
      const res = await sign(r.id, digest!);
      expect(res.status).toBe(503);
      expect(await pageText(res)).toContain("file store is not answering");
    } finally {
      execFileSync("bash", ["storage/fakes.sh", "up", runName], { stdio: "pipe" });
    }
    expect(await Approval.count({ where: { requestId: r.id } })).toBe(0);
  });
});

describe("versions, supersession, the site and public verification", () => {
  let first: { id: string; revisionId: string; sheet: string };
  let approval: Approval;

  beforeAll(async () => {
    first = await decidedRequest("Unit 6 discharge run");
    const { digest } = await signPage(first.id);
    expect((await sign(first.id, digest!)).status).toBe(302);
    approval = (await Approval.findOne({ where: { requestId: first.id } }))!;
  });

  it("shows the public page without sign-in, exposing only what an inspector needs", async () => {
    const res = await new Client().get(`/verify/${approval.verifyCode}`);
    expect(res.status).toBe(200);
    const html = await pageText(res);
    expect(html).toContain(`${approval.reference} · approval v1`);
    expect(html).toContain("ENG-777");
    expect(html).toContain(approval.packSha256);
    expect(html).not.toContain(team.project.siteAddress);
    expect(html).not.toContain(team.users.engineer.email);
    expect((await new Client().get(`/verify/${approval.verifyCode.slice(0, -1)}x`)).status).toBe(404);
  });

  it("tells the original from a modified or extended copy", async () => {
    const pack = (await getObjectBytes(approval.packKey))!;
    const check = async (bytes: Uint8Array) => {
      const form = new FormData();
      form.append("pack", new Blob([new Uint8Array(bytes)], { type: "application/pdf" }), "pack.pdf");
      const res = await new Client().request(`/verify/${approval.verifyCode}`, { method: "POST", body: form });
      return (await pageText(res)).match(/data-verdict="(\w+)"/)?.[1];
    };
    expect(await check(pack)).toBe("original");
    const tampered = Buffer.from(pack);
    const at = tampered.indexOf("/CreationDate (D:") + 20;
    tampered[at] = tampered[at] === 0x31 ? 0x32 : 0x31;
    expect(await check(tampered)).toBe("modified");
    expect(await check(Buffer.concat([pack, Buffer.from("\n%%EOF\n")]))).toBe("extended");
    expect(await check(await makeSheet({ tag: "unsigned" }))).toBe("unsigned");
  });

  it("serves the pack through a short-lived link after the access check, and all current packs as a zip", async () => {
    const res = await as.site_plumber!.get(`/projects/${team.project.id}/approvals/${approval.id}/pack`);
    expect(res.status).toBe(302);
    const url = new URL(res.headers.get("location")!);
    expect(url.searchParams.get("X-Amz-Expires")).toBe("300");
    const pdf = new Uint8Array(await (await fetch(url)).arrayBuffer());
    expect(Buffer.from(pdf).equals(Buffer.from((await getObjectBytes(approval.packKey))!))).toBe(true);
    expect((await as.outsider!.get(`/projects/${team.project.id}/approvals/${approval.id}/pack`)).status).toBe(403);
    const zip = await as.site_plumber!.get(`/projects/${team.project.id}/site/packs.zip`);
    expect(zip.status).toBe(200);
    expect(zip.headers.get("content-type")).toBe("application/zip");
    const bytes = Buffer.from(await zip.arrayBuffer());
    expect(bytes.subarray(0, 2).toString()).toBe("PK");
    expect(bytes.includes(Buffer.from(`${approval.reference}-approval-v1.pdf`))).toBe(true);
    const site = await pageText(await as.site_plumber!.get(`/projects/${team.project.id}/site`));
    expect(site).toContain("Insulate the exposed run.");
    const viaApi = await as.site_plumber!.json(`/api/projects/${team.project.id}/approvals/${approval.id}`);
    expect(viaApi.status).toBe(200);
    expect(viaApi.body.approval).toMatchObject({ reference: approval.reference, n: 1, state: "current" });
    expect(viaApi.body.pack.url).toContain("X-Amz-Expires=300");
    const list = await as.architect!.json(`/api/projects/${team.project.id}/approvals?state=current`);
    expect(list.body.approvals.map((a: { id: string }) => a.id)).toContain(approval.id);
  });

  it("signs a new version that supersedes the first and shows what changed", async () => {
    // A re-review on a new request version, recorded straight in the database (the review flow is tested elsewhere).
    const old = (await Decision.findOne({ where: { requestId: first.id } }))!;
    const oldVersion = (await RequestVersion.findByPk(old.requestVersionId))!;
    const { id: _id, createdAt: _c, updatedAt: _u, ...content } = oldVersion.get({ plain: true });
    const version = await RequestVersion.create({ ...content, n: oldVersion.n + 1 });
    await Decision.create({ requestId: first.id, requestVersionId: version.id, outcome: "approved_with_conditions", conditions: [...old.conditions, { n: 3, text: "Fit a tundish at the outlet." }], reasons: "", restsOn: old.restsOn, decidedById: team.users.engineer.id, recordedAt: new Date() });
    const newest = (await Decision.findOne({ where: { requestId: first.id }, order: [["recordedAt", "DESC"]] }))!;
    await sequelize.query(`INSERT INTO assessments (id, decision_id, principle, outcome, reasoning, evidence, created_at, updated_at) SELECT gen_random_uuid(), :d, principle, outcome, reasoning, evidence, now(), now() FROM assessments WHERE decision_id = :o`, { replacements: { d: newest.id, o: old.id } });
    const page = await signPage(first.id);
    expect(page.html).toContain("Sign approval v2 of");
    expect((await sign(first.id, page.digest!)).status).toBe(302);
    await approval.reload();
    expect(approval.state).toBe("superseded");
    const v2 = (await Approval.findOne({ where: { requestId: first.id, n: 2 } }))!;
    const detail = await pageText(await as.site_plumber!.get(`/projects/${team.project.id}/approvals/${v2.id}`));
    expect(detail).toContain("+ condition: Fit a tundish at the outlet.");
    approval = v2;
  });

  it("records installation with a photo, closing the request", async () => {
    const form = new FormData();
    form.append("installedOn", new Date().toISOString().slice(0, 10));
    form.append("note", "Installed as shown.");
    form.append("photo", new Blob([new Uint8Array(await makePhoto())], { type: "image/jpeg" }), "site.jpg");
    const res = await as.site_plumber!.request(`/projects/${team.project.id}/approvals/${approval.id}`, { method: "POST", body: form });
    expect(res.status).toBe(302);
    const record = (await InstallationRecord.findOne({ where: { approvalId: approval.id } }))!;
    expect(record.photoKeys).toHaveLength(1);
    expect((await DeviationRequest.findByPk(first.id))!.state).toBe("closed");
    const engineerTry = await as.engineer!.request(`/projects/${team.project.id}/approvals/${approval.id}`, { method: "POST", body: new URLSearchParams({ installedOn: "2026-11-30" }) });
    expect(engineerTry.status).toBe(403);
  });

  it("gives a compliance record for the certificate, showing the installation", async () => {
    const res = await as.site_plumber!.get(`/projects/${team.project.id}/approvals/${approval.id}/compliance-record.pdf`);
    expect(res.status).toBe(200);
    expect(res.headers.get("content-type")).toBe("application/pdf");
    const file = path.join(dir, "record.pdf");
    writeFileSync(file, Buffer.from(await res.arrayBuffer()));
    const text = execFileSync("pdftotext", [file, "-"], { encoding: "utf8" }).replace(/\s+/g, " ");
    expect(text).toContain("COMPLIANCE RECORD");
    expect(text).toContain(`${approval.reference} approval v2`);
    expect(text).toContain("Fit a tundish at the outlet.");
    expect(text).toMatch(/Installed as approved on \d{4}-\d{2}-\d{2}/);
  });

  it("sends a non-compliance notice to the owner as a PDF, refusing incomplete ones", async () => {
    const path_ = `/projects/${team.project.id}/notices`;
    const base = { ownerName: "Test Owner", ownerEmail: "owner-nc@test.example", property: "Unit 2, 1 Test Street", inspectedOn: "2026-11-30" };
    const empty = await as.site_plumber!.post(path_, base);
    expect(empty.status).toBe(400);
    expect(await pageText(empty)).toContain("List at least one non-compliance.");
    const noRule = await as.site_plumber!.post(path_, { ...base, "items[0].finding": "No vacuum breaker on the cold side" });
    expect(noRule.status).toBe(400);
    expect(await pageText(noRule)).toContain("Say which rule it breaks.");
    expect((await as.architect!.post(path_, { ...base, "items[0].finding": "x", "items[0].rule": "y" })).status).toBe(403);
    const ok = await as.site_plumber!.post(path_, {
      ...base,
      "items[0].finding": "No vacuum breaker on the cold side", "items[0].rule": "Vacuum breakers on both hot and cold sides", "items[0].ownerDecision": "correct_now",
      "items[1].finding": "Drain valve replaced with a plug", "items[1].rule": "Integral valves keep their type and rating", "items[1].ownerDecision": "declined",
    });
    expect(ok.status).toBe(200);
    expect(await pageText(ok)).toMatch(/Notice \d+ was sent to owner-nc@test.example/);
    const mail = await waitForMail("owner-nc@test.example", /Non-compliance notice \d+/);
    expect((mail as unknown as { attachments: { fileName?: string; generatedFileName?: string; contentType: string }[] }).attachments?.[0]?.contentType).toBe("application/pdf");
  });

  it("flags an approval for re-approval when a drawing it rests on is superseded", async () => {
    const r = await decidedRequest("Unit 4 vacuum breaker");
    const { digest } = await signPage(r.id);
    expect((await sign(r.id, digest!)).status).toBe(302);
    const a = (await Approval.findOne({ where: { requestId: r.id } }))!;
    const tx = `/projects/${team.project.id}/transmittals`;
    const issue = (revisionId: string) =>
      as.architect!.request(tx, { method: "POST", body: new URLSearchParams([["intent", "issue"], ["revisionIds", revisionId], ["status", "accepted"], ["recipientIds", team.users.site_plumber.id], ["reason", "For construction"]]) });
    expect((await issue(r.revisionId)).status).toBeLessThan(400);
    const next = await upload(as.architect!, team.project.id, await makeSheet({ tag: `${r.sheet}-B` }), { sheetNumber: r.sheet, label: "B", description: "Moved the gutter outlet" });
    expect(next.status, JSON.stringify(next.body)).toBe(201);
    expect((await issue(next.body.stored[0].revisionId)).status).toBeLessThan(400);
    await a.reload();
    expect(a.state).toBe("needs_reapproval");
    await until(async () => (await fetch(`${process.env.MAIL_API_URL}/api/email`).then((x) => x.json()) as { subject: string }[]).some((m) => m.subject.includes(`${a.reference} approval v1 needs re-approval`)), 10_000, "the re-approval e-mail");
    const pub = await pageText(await new Client().get(`/verify/${a.verifyCode}`));
    expect(pub).toContain("needs re-approval");
  });
});
