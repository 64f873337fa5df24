// Backup and restore end to end: a project with rows and objects of every kind (sheets and their thumbnails, a
// photo, a signed pack) is backed up with the real command, restored with the real command into a database and
// a bucket made here for the purpose, and compared table by table (row count and a hash of the ordered rows) and
// object by object (SHA-256). Nothing may be lost.
import { execFile } from "node:child_process";
import { createHash } from "node:crypto";
import { mkdtempSync, rmSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { promisify } from "node:util";
import { CreateBucketCommand, DeleteBucketCommand, DeleteObjectCommand, GetObjectCommand, ListObjectsV2Command } from "@aws-sdk/client-s3";
import pg from "pg";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { verifyRegistration } from "../../app/approvals/verification.server";
import { listKeys, s3 } from "../../app/platform/storage.server";
import { Approval, DrawingRevision, ProjectMember } from "../../db/models";
import { decidedRequest } from "../support/approvals";
import { until } from "../support/drawings";
import { DATABASE_URL } from "../support/env";
import { makeProjectTeam, PASSWORD } from "../support/factory";
import { Client, pageText } from "../support/http";
import { api, attach, CONTENT, makePhoto } from "../support/requests";

const run = promisify(execFile);
const SOURCE_BUCKET = process.env.S3_BUCKET ?? "countersign-test";
const tag = `${Date.now().toString(36)}${process.pid}`;
const target = { database: `countersign_restore_${tag}`, bucket: `restore-${tag}` };
const targetUrl = Object.assign(new URL(DATABASE_URL), { pathname: `/${target.database}` }).toString();
const folder = mkdtempSync(path.join(tmpdir(), "countersign-backup-"));

/** Runs `tsx db/backup.ts …` as `npm run backup` / `npm run restore` do, with extra environment. */
function command(args: string[], env: Record<string, string> = {}) {
  return run("node_modules/.bin/tsx", ["db/backup.ts", ...args], { env: { ...process.env, ...env }, timeout: 60_000 });
}

async function withDb<T>(url: string, work: (db: pg.Client) => Promise<T>) {
  const db = new pg.Client({ connectionString: url });
  await db.connect();
  try {
    return await work(db);
  } finally {
    await db.end();
  }
}

/** Every table of the app's schemas: its row count and an MD5 of its rows in a fixed order. */
function tables(url: string) {
  return withDb(url, async (db) => {
    const { rows } = await db.query<{ name: string }>(
      `SELECT format('%I.%I', schemaname, tablename) AS name FROM pg_tables
       WHERE schemaname NOT IN ('pg_catalog', 'information_schema')
         -- pg-boss stamps its own maintenance times here while the app runs; it holds no data of ours.
         AND (schemaname, tablename) <> ('pgboss', 'version')
       ORDER BY 1`,
    );
    const out: Record<string, { rows: number; md5: string }> = {};
    for (const { name } of rows) {
      const { rows: [r] } = await db.query(`SELECT count(*)::int AS rows, md5(coalesce(string_agg(t::text, E'\\n' ORDER BY t::text), '')) AS md5 FROM ${name} t`);
      out[name] = r;
    }
    return out;
  });
}

/** Every object of a bucket with the SHA-256 of its bytes as read back from the store. */
async function objects(bucket: string) {
  const out: Record<string, string> = {};
  for await (const Key of listKeys("", bucket)) {
    const body = (await s3.send(new GetObjectCommand({ Bucket: bucket, Key }))).Body!;
    out[Key] = createHash("sha256").update(await body.transformToByteArray()).digest("hex");
  }
  return out;
}

let team: Awaited<ReturnType<typeof makeProjectTeam>>;

beforeAll(async () => {
  team = await makeProjectTeam();
  const as = {} as Record<"manager" | "architect" | "engineer" | "site_plumber", Client>;
  for (const role of ["manager", "architect", "engineer", "site_plumber"] as const) {
    as[role] = new Client();
    await as[role].signIn(team.users[role].email, PASSWORD);
  }
  const member = (await ProjectMember.findOne({ where: { projectId: team.project.id, userId: team.users.engineer.id } }))!;
  await team.users.engineer.update({ registrationNumber: "ENG-B01", registrationBody: "Test board", registrationState: "unverified" });
  await verifyRegistration(team.users.manager.id, team.project.id, member.id, { registrationNumber: "ENG-B01", registrationBody: "Test board", checkedOn: "2026-11-30" });

  // A decided request on an uploaded sheet, signed: rows in most tables, a sheet, thumbnails and a signed pack.
  const decided = await decidedRequest(team.project.id, as);
  const signPage = await pageText(await as.engineer.get(`/projects/${team.project.id}/requests/${decided.id}/sign`));
  const seenDigest = signPage.match(/name="seenDigest" value="([0-9a-f]{64})"/)![1]!;
  const signed = await as.engineer.post(`/projects/${team.project.id}/requests/${decided.id}/sign`, { password: PASSWORD, seenDigest, confirm: "on" });
  expect(signed.status).toBe(302);
  // A draft request with a photo.
  const draft = await api(as.site_plumber, "POST", `/api/projects/${team.project.id}/requests`, { ...CONTENT, title: "Unit 2 riser through the slab" });
  expect((await attach(as.site_plumber, team.project.id, draft.body.request.id, await makePhoto(320, 240))).status).toBe(201);

  // Let background work settle, so the source does not change under the comparison.
  await until(async () => (await DrawingRevision.count({ where: { projectId: team.project.id, processing: ["queued", "running"] } })) === 0, 30_000, "sheet processing");
  await until(
    () => withDb(DATABASE_URL, async (db) => (await db.query(`SELECT count(*)::int AS n FROM pgboss.job WHERE state IN ('created', 'retry', 'active')`)).rows[0].n === 0),
    30_000,
    "queued jobs",
  );
  expect(await Approval.count({ where: { projectId: team.project.id } })).toBe(1);

  await withDb(Object.assign(new URL(DATABASE_URL), { pathname: "/postgres" }).toString(), (db) => db.query(`CREATE DATABASE ${target.database}`));
  await s3.send(new CreateBucketCommand({ Bucket: target.bucket }));
});

afterAll(async () => {
  await withDb(Object.assign(new URL(DATABASE_URL), { pathname: "/postgres" }).toString(), (db) => db.query(`DROP DATABASE IF EXISTS ${target.database} WITH (FORCE)`));
  const left = await s3.send(new ListObjectsV2Command({ Bucket: target.bucket })).catch(() => undefined);
  for (const { Key } of left?.Contents ?? []) await s3.send(new DeleteObjectCommand({ Bucket: target.bucket, Key }));
  await s3.send(new DeleteBucketCommand({ Bucket: target.bucket })).catch(() => undefined);
  rmSync(folder, { recursive: true, force: true });
});

describe("npm run backup, then npm run restore into another database and bucket", () => {
  it("restores every table row for row and every object byte for byte", async () => {
    const before = { tables: await tables(DATABASE_URL), objects: await objects(SOURCE_BUCKET) };
    expect(before.tables["public.approvals"]!.rows).toBeGreaterThan(0);
    expect(Object.keys(before.objects).filter((k) => k.startsWith(`projects/${team.project.id}/`)).length).toBeGreaterThanOrEqual(4);

    const backedUp = await command(["backup", folder]);
    expect(backedUp.stdout).toContain(`backup: database and ${Object.keys(before.objects).length} objects`);
    // The source did not move while it was being copied (otherwise the comparison below would prove nothing).
    expect(await tables(DATABASE_URL)).toEqual(before.tables);

    const restored = await command(["restore", folder], { DATABASE_URL: targetUrl, S3_BUCKET: target.bucket });
    expect(restored.stdout).toContain("all SHA-256 checked");

    const after = { tables: await tables(targetUrl), objects: await objects(target.bucket) };
    expect(Object.keys(after.tables)).toEqual(Object.keys(before.tables));
    for (const [name, t] of Object.entries(before.tables)) expect(after.tables[name], name).toEqual(t);
    expect(after.objects).toEqual(before.objects);
  }, 150_000); // two child processes, each a full tsx start-up, on a machine that may be busy

  it("refuses to restore over a database that is not empty unless told to with --force", async () => {
    const into = { DATABASE_URL: targetUrl, S3_BUCKET: target.bucket };
    const refused = await command(["restore", folder], into).then(() => null, (e: { code: number; stderr: string }) => e);
    expect(refused?.code).toBe(1);
    expect(refused?.stderr).toMatch(/is not empty .*add --force/);

    await withDb(targetUrl, (db) => db.query(`DELETE FROM sessions`));
    const forced = await command(["restore", folder, "--force"], into);
    expect(forced.stdout).toContain("all SHA-256 checked");
    expect(await withDb(targetUrl, async (db) => (await db.query(`SELECT count(*)::int AS n FROM sessions`)).rows[0].n)).toBeGreaterThan(0);
  }, 150_000);
});
