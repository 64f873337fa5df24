// Two app servers over one PostgreSQL and one bucket, as behind a load balancer: a session made on one is good on
// the other (and ended on both by signing out on either); background work queued through one is done once, by
// whichever worker takes it; and two engineers signing the same decision at once, one on each server, make one
// approval. Both servers run their job worker on a queue schema of their own, so the counts are theirs alone
// (the slot's own app works the default schema).
import { QueryTypes } from "sequelize";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { verifyRegistration } from "../../app/approvals/verification.server";
import { Approval, DrawingRevision, ProjectMember, sequelize } from "../../db/models";
import { decidedRequest } from "../support/approvals";
import { makeSheet, objectKeys, upload, until } from "../support/drawings";
import { slotPort, startApp, type AppProcess } from "../support/faults";
import { makeProjectTeam, makeUser, PASSWORD, signInTeam } from "../support/factory";
import { Client, pageText } from "../support/http";
import { mailsTo } from "../support/mail";

type Role = "manager" | "architect" | "engineer" | "site_plumber";
const ROLES: Role[] = ["manager", "architect", "engineer", "site_plumber"];
const SCHEMA = `pgboss_two_${process.pid}`;

let team: Awaited<ReturnType<typeof makeProjectTeam>>;
let one: AppProcess;
let two: AppProcess;

const jobs = (name: string, where: string, value: string) =>
  sequelize.query<{ state: string; retry_count: number }>(`SELECT state, retry_count FROM ${SCHEMA}.job WHERE name = :name AND data->>'${where}' = :value`, {
    replacements: { name, value },
    type: QueryTypes.SELECT,
  });

/** Waits until no job of the two servers' queue is waiting or running. */
const queueSettled = () =>
  until(async () => ((await sequelize.query(`SELECT count(*)::int AS n FROM ${SCHEMA}.job WHERE state IN ('created', 'retry', 'active')`, { plain: true })) as { n: number }).n === 0, 30_000, "the queue to settle");

beforeAll(async () => {
  team = await makeProjectTeam();
  // One public URL for both, as behind a load balancer. Started one after the other: on a busy machine two cold
  // starts at once can outlast the helper's start-up wait.
  // VITEST is cleared because the built server starts its worker at once only outside vitest, and a child
  // inherits it: without this the second server would never work the queue unless it queued something itself.
  const env = { JOBS_SCHEMA: SCHEMA, JOBS_WORKER: "true", APP_URL: process.env.APP_URL ?? "http://127.0.0.1:3100", VITEST: "" };
  one = await startApp(slotPort(5), env);
  two = await startApp(slotPort(6), env);
  await until(async () => (await sequelize.query(`SELECT 1 FROM pg_namespace WHERE nspname = :s`, { replacements: { s: SCHEMA }, plain: true })) !== null, 20_000, "the job queue schema");
});

afterAll(async () => {
  await Promise.all([one?.stop(), two?.stop()]);
  await sequelize.query(`DROP SCHEMA IF EXISTS ${SCHEMA} CASCADE`);
});

describe("two app servers over one database and one bucket", () => {
  it("honours a session made on one server on the other, and signing out on either ends it on both", async () => {
    const user = await makeUser();
    const onOne = new Client(one.base);
    await onOne.signIn(user.email, PASSWORD);
    const cookie = onOne.cookieHeader();
    const me = async (app: AppProcess) => (await fetch(new URL("/api/me", app.base), { headers: { cookie, accept: "application/json" } })).status;
    expect(await me(two)).toBe(200);
    expect(await me(one)).toBe(200);

    const out = await fetch(new URL("/sign-out", two.base), { method: "POST", headers: { cookie, origin: two.base }, redirect: "manual" });
    expect(out.status).toBe(302);
    expect(await me(one)).toBe(401);
    expect(await me(two)).toBe(401);
  });

  describe("with a decided request raised, reviewed and decided through the first server", () => {
    let request: { id: string; revisionId: string };
    let sheets: string[];

    beforeAll(async () => {
      const as = await signInTeam(team, one.base);
      request = await decidedRequest(team.project.id, as);
      // Three more sheets at once, so that both workers have something to reach for at the same time.
      const ups = await Promise.all(
        [1, 2, 3].map(async (n) => upload(as.architect, team.project.id, await makeSheet({ pages: 2, tag: `two-${n}-${Date.now()}` }), { sheetNumber: `TS-${n}-${Date.now().toString(36)}`, title: "Riser layout" })),
      );
      expect(ups.map((u) => u.status)).toEqual([201, 201, 201]);
      sheets = [request.revisionId, ...ups.map((u) => u.body.stored[0].revisionId as string)];
      await until(async () => (await DrawingRevision.count({ where: { projectId: team.project.id, processing: ["queued", "running"] } })) === 0, 30_000, "sheet processing");
      await queueSettled();
    });

    it("processes each uploaded sheet once: one job, run once, one set of thumbnails", async () => {
      for (const revisionId of sheets) {
        const rev = (await DrawingRevision.findByPk(revisionId))!;
        expect(rev.processing).toBe("done");
        expect(await jobs("revision.process", "revisionId", revisionId)).toEqual([{ state: "completed", retry_count: 0 }]);
        const thumbs = await objectKeys(`projects/${team.project.id}/thumbs/${rev.sha256}-`);
        expect(thumbs.sort()).toEqual(Array.from({ length: rev.pageCount }, (_, i) => `projects/${team.project.id}/thumbs/${rev.sha256}-p${i + 1}.webp`).sort());
      }
    });

    it("sends each queued mail exactly once", async () => {
      expect((await jobs("mail.send", "to", team.users.engineer.email)).length).toBeGreaterThan(0);
      // Give a second sender, if there were one, time to deliver a duplicate.
      await new Promise((r) => setTimeout(r, 1_500));
      for (const role of ROLES) {
        const queued = await jobs("mail.send", "to", team.users[role].email);
        expect(queued.every((j) => j.state === "completed" && j.retry_count === 0), role).toBe(true);
        expect((await mailsTo(team.users[role].email)).length, role).toBe(queued.length);
      }
    });

    it("lets only one of two engineers signing at once, one on each server, make the approval", async () => {
      const second = await makeUser({ name: "Test engineer two" });
      const member = await ProjectMember.create({ projectId: team.project.id, userId: second.id, role: "engineer" });
      const first = (await ProjectMember.findOne({ where: { projectId: team.project.id, userId: team.users.engineer.id } }))!;
      for (const [m, n] of [[first, "ENG-T01"], [member, "ENG-T02"]] as const) {
        await verifyRegistration(team.users.manager.id, team.project.id, m.id, { registrationNumber: n, registrationBody: "Test board", checkedOn: "2026-11-30" });
      }
      const a = new Client(one.base);
      await a.signIn(team.users.engineer.email, PASSWORD);
      const b = new Client(two.base);
      await b.signIn(second.email, PASSWORD);
      const path = `/projects/${team.project.id}/requests/${request.id}/sign`;
      const digest = async (c: Client) => (await pageText(await c.get(path))).match(/name="seenDigest" value="([0-9a-f]{64})"/)![1]!;
      const [da, db] = await Promise.all([digest(a), digest(b)]);

      const results = await Promise.all([a.post(path, { password: PASSWORD, seenDigest: da, confirm: "on" }), b.post(path, { password: PASSWORD, seenDigest: db, confirm: "on" })]);
      expect(results.map((r) => r.status).sort()).toEqual([302, 409]);
      const loser = results.find((r) => r.status === 409)!;
      expect(await pageText(loser)).toContain("This decision is already signed as approval v1.");
      expect(await Approval.count({ where: { requestId: request.id } })).toBe(1);
      expect((await Approval.findOne({ where: { requestId: request.id } }))!.n).toBe(1);
    });
  });
});
