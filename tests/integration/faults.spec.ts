// Faults in the middle of work, against separate app processes of this slot: PostgreSQL lost (connection dropped,
// backend terminated) while an action's transaction is committing, the file store gone in the middle of an upload
// and of signing, and the app killed while processing a drawing in the background. Each time: a clear message,
// nothing half-written (no rows, no orphan objects), and the next request after recovery works.
import { createHash } from "node:crypto";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { verifyRegistration } from "../../app/approvals/verification.server";
import { Approval, AuditEvent, DeviationRequest, Drawing, DrawingRevision, ProjectMember, sequelize } from "../../db/models";
import { decidedRequest } from "../support/approvals";
import { A1_LANDSCAPE, makeSheet, objectKeys, upload, until } from "../support/drawings";
import { commitOf, putTo, relay, slotPort, startApp, type AppProcess, type Relay } from "../support/faults";
import { makeProjectTeam, PASSWORD, signInTeam } from "../support/factory";
import { Client, pageText } from "../support/http";

type Team = Awaited<ReturnType<typeof makeProjectTeam>>;
type Role = import("../../app/projects/permissions").Role;

let team: Team;
const started: AppProcess[] = [];
const relays: Relay[] = [];

beforeAll(async () => {
  team = await makeProjectTeam();
});

afterAll(async () => {
  for (const app of started) await app.stop("SIGKILL");
  for (const r of relays) await r.close();
});

describe("PostgreSQL and the file store failing in the middle of an action", () => {
  let pg: Relay;
  let s3: Relay;
  let app: AppProcess;
  let on: Record<Role, Client>;

  beforeAll(async () => {
    const db = new URL(process.env.DATABASE_URL!);
    pg = await relay(slotPort(1), Number(db.port));
    s3 = await relay(slotPort(2), Number(new URL(process.env.S3_ENDPOINT!).port));
    relays.push(pg, s3);
    db.port = String(pg.port);
    // Web only: background work stays with the slot's own app, so the relays see only this process's requests.
    app = await startApp(slotPort(0), { DATABASE_URL: db.toString(), S3_ENDPOINT: `http://127.0.0.1:${s3.port}`, JOBS_WORKER: "false" });
    started.push(app);
    on = await signInTeam(team, app.base);
  });

  const projectId = () => team.project.id;
  const rows = async () => ({
    requests: await DeviationRequest.count({ where: { projectId: projectId() } }),
    versions: ((await sequelize.query("SELECT count(*)::int AS n FROM request_versions v JOIN deviation_requests r ON r.id = v.request_id WHERE r.project_id = :p", { replacements: { p: projectId() }, plain: true })) as { n: number }).n,
    audits: await AuditEvent.count({ where: { projectId: projectId(), action: "request.created" } }),
  });
  const createRequest = (title: string) => on.site_plumber.post(`/projects/${projectId()}/requests/new`, { title, provision: "discharge", clauseRef: "" });
  const INSERT_REQUEST = /INSERT INTO "deviation_requests"/;

  async function expectRecovered(title: string) {
    const before = await rows();
    const res = await createRequest(title);
    expect(res.status).toBe(302);
    expect(await rows()).toEqual({ requests: before.requests + 1, versions: before.versions + 1, audits: before.audits + 1 });
  }

  it("says the database was lost and keeps nothing when the connection drops just before COMMIT", async () => {
    const before = await rows();
    const armed = pg.when(commitOf(INSERT_REQUEST), "cut");
    const res = await createRequest("Dropped before commit");
    await armed;
    expect(res.status).toBe(503);
    expect(await pageText(res)).toContain("cannot reach its database right now. Nothing was saved.");
    await pg.restore();
    expect(await rows()).toEqual(before);
    expect(await DeviationRequest.count({ where: { title: "Dropped before commit" } })).toBe(0);
    // The pool drops its dead connections and the very next action works.
    await expectRecovered("After the dropped commit");
  });

  it("keeps nothing when PostgreSQL terminates the backend while its COMMIT is on the way", async () => {
    const before = await rows();
    const armed = pg.when(commitOf(INSERT_REQUEST), "hold");
    const pending = createRequest("Terminated before commit");
    const { upstreamPort, release } = await armed;
    // Only the one backend behind the held connection, in this slot's database.
    const [killed] = (await sequelize.query(
      "SELECT pg_terminate_backend(pid) AS ok FROM pg_stat_activity WHERE datname = current_database() AND client_port = :port",
      { replacements: { port: upstreamPort }, type: "SELECT" },
    )) as { ok: boolean }[];
    expect(killed?.ok).toBe(true);
    release();
    const res = await pending;
    expect(res.status).toBe(503);
    expect(await pageText(res)).toContain("cannot reach its database");
    expect(await rows()).toEqual(before);
    await expectRecovered("After the terminated backend");
  });

  it("writes all or nothing when the connection drops after COMMIT was sent but before its answer", async () => {
    const before = await rows();
    const armed = pg.when(commitOf(INSERT_REQUEST), "cut-after");
    const res = await createRequest("Dropped during commit");
    await armed;
    expect(res.status).toBe(503);
    const after = await rows();
    const n = after.requests - before.requests;
    expect([0, 1]).toContain(n);
    expect(after).toEqual({ requests: before.requests + n, versions: before.versions + n, audits: before.audits + n });
    await expectRecovered("After the commit with no answer");
  });

  it("stores no object and no row when the file store goes away in the middle of an upload, and takes it after", async () => {
    const sheetNumber = `FLT-${Date.now().toString(36)}`.toUpperCase();
    const bytes = await makeSheet({ tag: sheetNumber, pages: 3 });
    const sha = createHash("sha256").update(bytes).digest("hex");
    const key = `projects/${projectId()}/revisions/${sha}.pdf`;
    const audits = () => AuditEvent.count({ where: { projectId: projectId(), action: "revision.uploaded" } });
    const auditsBefore = await audits();
    const armed = s3.when(putTo(`/revisions/${sha}.pdf`), "cut");
    const res = await upload(on.architect, projectId(), bytes, { sheetNumber, title: "Cut mid-upload" });
    await armed;
    expect(res.status).toBe(503);
    expect(res.body.message).toMatch(/file store is not answering, so nothing was stored or recorded/);
    await s3.restore();
    expect(await Drawing.count({ where: { projectId: projectId(), sheetNumber } })).toBe(0);
    expect(await audits()).toBe(auditsBefore);
    expect(await objectKeys(key)).toEqual([]);

    const again = await upload(on.architect, projectId(), bytes, { sheetNumber, title: "Cut mid-upload" });
    expect(again.status, JSON.stringify(again.body)).toBe(201);
    expect(await objectKeys(key)).toEqual([key]);
    expect(await DrawingRevision.count({ where: { projectId: projectId(), sha256: sha } })).toBe(1);
  });

  it("signs nothing and leaves no pack behind when the file store goes away while the pack is stored", async () => {
    const member = (await ProjectMember.findOne({ where: { projectId: projectId(), userId: team.users.engineer.id } }))!;
    await team.users.engineer.update({ registrationNumber: "ENG-888", registrationBody: "Test board", registrationState: "unverified" });
    await verifyRegistration(team.users.manager.id, projectId(), member.id, { registrationNumber: "ENG-888", registrationBody: "Test board", checkedOn: "2026-11-30" });
    const r = await decidedRequest(projectId(), on);
    const signUrl = `/projects/${projectId()}/requests/${r.id}/sign`;
    const digest = (await pageText(await on.engineer.get(signUrl))).match(/name="seenDigest" value="([0-9a-f]{64})"/)?.[1];
    expect(digest).toBeDefined();
    const packs = `projects/${projectId()}/approvals/${r.id}-`;
    const armed = s3.when(putTo(`/approvals/${r.id}-`), "cut");
    const res = await on.engineer.post(signUrl, { password: PASSWORD, seenDigest: digest!, confirm: "on" });
    await armed;
    expect(res.status).toBe(503);
    expect(await pageText(res)).toContain("file store is not answering");
    await s3.restore();
    expect(await Approval.count({ where: { requestId: r.id } })).toBe(0);
    expect(await AuditEvent.count({ where: { subjectType: "approval", projectId: projectId(), action: "approval.signed" } })).toBe(0);
    expect(await objectKeys(packs)).toEqual([]);
    expect((await DeviationRequest.findByPk(r.id))!.state).toBe("decided");

    const again = await on.engineer.post(signUrl, { password: PASSWORD, seenDigest: digest!, confirm: "on" });
    expect(again.status).toBe(302);
    const approval = (await Approval.findOne({ where: { requestId: r.id } }))!;
    expect(await objectKeys(packs)).toEqual([approval.packKey]);
  }, 40_000);
});

describe("the app killed while it processes a drawing", () => {
  // Its own queue schema: the slot's own app (which shares the database) cannot take the job from under us.
  const JOBS_SCHEMA = "faults_jobs";
  const env = { JOBS_SCHEMA };

  afterAll(async () => {
    await sequelize.query(`DROP SCHEMA IF EXISTS ${JOBS_SCHEMA} CASCADE`).catch(() => undefined);
  });

  it("hands the job to the next process once it shows no progress, and finishes it exactly once", async () => {
    const first = await startApp(slotPort(3), env);
    started.push(first);
    const on = await signInTeam(team, first.base);
    const sheetNumber = `KIL-${Date.now().toString(36)}`.toUpperCase();
    const bytes = await makeSheet({ size: A1_LANDSCAPE, pages: 24, tag: sheetNumber });
    const up = await upload(on.architect, team.project.id, bytes, { sheetNumber, title: "Killed while processing" });
    expect(up.status, JSON.stringify(up.body)).toBe(201);
    const { revisionId, sha256 } = up.body.stored[0] as { revisionId: string; sha256: string };
    const running = await until(async () => {
      const r = await DrawingRevision.findByPk(revisionId, { attributes: ["processing", "processedPages"] });
      return r?.processing === "running" && r.processedPages >= 1 ? r : null;
    }, 20_000, "processing to start");
    await first.stop("SIGKILL");
    const atKill = (await DrawingRevision.findByPk(revisionId, { attributes: ["processing", "processedPages"] }))!;
    expect(atKill.processing).toBe("running");
    expect(atKill.processedPages).toBeLessThan(24);
    expect(running.processedPages).toBeGreaterThanOrEqual(1);

    const killedAt = Date.now();
    const second = await startApp(slotPort(3), env);
    started.push(second);
    const done = await until(async () => {
      const r = await DrawingRevision.findByPk(revisionId);
      return r?.processing === "done" ? r : null;
    }, 90_000, "the retried job to finish");
    const resumeSeconds = (Date.now() - killedAt) / 1000;
    console.log(`faults: a job killed mid-run finished in the next process ${resumeSeconds.toFixed(1)} s after the kill`);
    expect(done).toMatchObject({ pageCount: 24, processedPages: 24, processingError: null });
    expect(done.pages).toHaveLength(24);

    // Exactly once: one job (retried, completed), one revision, one drawing, one upload audit, one thumbnail a page.
    const jobs = (await sequelize.query(
      `SELECT state, retry_count FROM ${JOBS_SCHEMA}.job WHERE name = 'revision.process' AND data->>'revisionId' = :id
       UNION ALL SELECT state, retry_count FROM ${JOBS_SCHEMA}.archive WHERE name = 'revision.process' AND data->>'revisionId' = :id`,
      { replacements: { id: revisionId }, type: "SELECT" },
    )) as { state: string; retry_count: number }[];
    expect(jobs).toHaveLength(1);
    expect(jobs[0]!.state).toBe("completed");
    expect(jobs[0]!.retry_count).toBeGreaterThanOrEqual(1);
    expect(await Drawing.count({ where: { projectId: team.project.id, sheetNumber } })).toBe(1);
    expect(await DrawingRevision.count({ where: { projectId: team.project.id, sha256 } })).toBe(1);
    expect(await AuditEvent.count({ where: { action: "revision.uploaded", subjectId: revisionId } })).toBe(1);
    expect(await objectKeys(`projects/${team.project.id}/thumbs/${sha256}-`)).toHaveLength(24);
    await second.stop();
  }, 150_000);
});

describe("an app that starts while processing is left queued", () => {
  const JOBS_SCHEMA = "faults_boot_jobs";

  afterAll(async () => {
    await sequelize.query(`DROP SCHEMA IF EXISTS ${JOBS_SCHEMA} CASCADE`).catch(() => undefined);
  });

  // Its start-up task re-queues that work, and queueing waits for the queue to be up: the task once waited for
  // itself, and every upload to that process hung.
  it("queues the left work again and still answers uploads at once", async () => {
    const on = await signInTeam(team);
    const sheetNumber = `BOOT-${Date.now().toString(36)}`.toUpperCase();
    const left = await upload(on.architect, team.project.id, await makeSheet({ tag: sheetNumber }), { sheetNumber, title: "Left queued" });
    expect(left.status, JSON.stringify(left.body)).toBe(201);
    const revisionId = left.body.stored[0].revisionId as string;
    await until(async () => (await DrawingRevision.findByPk(revisionId))?.processing === "done", 30_000, "the first processing");
    // As a stopped process leaves it: queued more than a minute ago, with no job.
    await sequelize.query(`UPDATE drawing_revisions SET processing = 'queued', updated_at = now() - interval '2 minutes' WHERE id = :id`, { replacements: { id: revisionId } });

    const app = await startApp(slotPort(4), { JOBS_SCHEMA, JOBS_WORKER: "false" });
    started.push(app);
    const architect = (await signInTeam(team, app.base)).architect;
    const next = `BOOT2-${Date.now().toString(36)}`.toUpperCase();
    const t0 = Date.now();
    const res = await upload(architect, team.project.id, await makeSheet({ tag: next }), { sheetNumber: next, title: "After start" });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    expect(Date.now() - t0).toBeLessThan(15_000);
    // The start-up task runs beside the first requests, so the left work may be queued a moment after this upload.
    const queued = async () =>
      ((await sequelize.query(`SELECT data->>'revisionId' AS id FROM ${JOBS_SCHEMA}.job WHERE name = 'revision.process'`, { type: "SELECT" })) as { id: string }[]).map((j) => j.id);
    await until(async () => (await queued()).includes(revisionId), 20_000, "the left work queued again");
    expect(await queued()).toEqual(expect.arrayContaining([revisionId, res.body.stored[0].revisionId]));
    await app.stop();
    await sequelize.query(`UPDATE drawing_revisions SET processing = 'done' WHERE id = :id`, { replacements: { id: revisionId } });
  }, 60_000);
});
