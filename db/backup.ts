// Backup and restore of everything Countersign keeps: the PostgreSQL database of DATABASE_URL (pg_dump, custom
// format) and every object of S3_BUCKET, side by side in one folder with a manifest (key, SHA-256, size).
//   npm run backup [-- <folder>]            default backups/<timestamp>/
//   npm run restore -- <folder> [--force]   into an empty database and bucket; --force cleans the database first
// The environment is read like the app reads it (app/platform/env.server.ts), so `source storage/profile.sh dev`
// points both commands at `npm start`'s stack.
import { execFileSync } from "node:child_process";
import { createHash } from "node:crypto";
import { createReadStream, createWriteStream, existsSync, readdirSync, readFileSync, renameSync, writeFileSync, mkdirSync } from "node:fs";
import path from "node:path";
import { Readable, Transform } from "node:stream";
import { pipeline } from "node:stream/promises";
import { fileURLToPath } from "node:url";
import { GetObjectCommand, HeadBucketCommand, PutObjectCommand } from "@aws-sdk/client-s3";
import pg from "pg";
import { env } from "../app/platform/env.server";
import { listKeys, s3 } from "../app/platform/storage.server";

const ROOT = path.resolve(path.dirname(fileURLToPath(import.meta.url)), "..");
const DUMP = "database.dump";
const MANIFEST = "manifest.json";

export interface Manifest {
  createdAt: string;
  database: { file: string; sha256: string; bytes: number };
  bucket: string;
  objects: { key: string; sha256: string; bytes: number; contentType?: string }[];
}

/** The connection for PostgreSQL's tools, with the password in the environment rather than on the command line. */
function pgConnection() {
  const url = new URL(env.DATABASE_URL);
  const password = decodeURIComponent(url.password);
  url.password = "";
  return { url: url.toString(), env: { ...process.env, ...(password ? { PGPASSWORD: password } : {}) } };
}

/** pg_dump and pg_restore from Debian's newest installed PostgreSQL, found like db/postgres.sh finds it. */
function pgTool(name: "pg_dump" | "pg_restore") {
  const base = "/usr/lib/postgresql";
  const versions = existsSync(base) ? readdirSync(base).filter((v) => existsSync(path.join(base, v, "bin", name))) : [];
  versions.sort((a, b) => Number(a) - Number(b));
  return versions.length ? path.join(base, versions.at(-1)!, "bin", name) : name;
}

/** SHA-256 and size of a stream, read to its end. */
async function digest(stream: AsyncIterable<Uint8Array>) {
  const hash = createHash("sha256");
  let bytes = 0;
  for await (const chunk of stream) {
    hash.update(chunk);
    bytes += chunk.length;
  }
  return { sha256: hash.digest("hex"), bytes };
}
const sha256File = (file: string) => digest(createReadStream(file));

/** Objects are stored under their SHA-256 (keys may hold characters a file name cannot). */
const objectFile = (folder: string, sha256: string) => path.join(folder, "objects", sha256);

export async function backup(folder: string): Promise<Manifest> {
  mkdirSync(path.join(folder, "objects"), { recursive: true });
  // The database first: rows point at objects, and objects are written before the rows that name them, so every
  // object a dumped row names is already in the bucket when it is listed below.
  const conn = pgConnection();
  execFileSync(pgTool("pg_dump"), ["--format=custom", "--no-owner", "--no-privileges", `--file=${path.join(folder, DUMP)}`, conn.url], { stdio: "inherit", env: conn.env });
  const dump = await sha256File(path.join(folder, DUMP));

  const objects: Manifest["objects"] = [];
  for await (const Key of listKeys("", env.S3_BUCKET)) {
    const out = await s3.send(new GetObjectCommand({ Bucket: env.S3_BUCKET, Key }));
    const hash = createHash("sha256");
    let bytes = 0;
    const partial = path.join(folder, "objects", ".partial");
    const count = new Transform({
      transform(chunk: Buffer, _enc, done) {
        hash.update(chunk);
        bytes += chunk.length;
        done(null, chunk);
      },
    });
    await pipeline(out.Body as Readable, count, createWriteStream(partial));
    const sha256 = hash.digest("hex");
    renameSync(partial, objectFile(folder, sha256));
    objects.push({ key: Key!, sha256, bytes, contentType: out.ContentType });
  }

  const manifest: Manifest = { createdAt: new Date().toISOString(), database: { file: DUMP, sha256: dump.sha256, bytes: dump.bytes }, bucket: env.S3_BUCKET, objects };
  // Written last: a folder with a manifest is a complete backup.
  writeFileSync(path.join(folder, MANIFEST), JSON.stringify(manifest, null, 2));
  return manifest;
}

class Refused extends Error {}

export async function restore(folder: string, options: { force?: boolean } = {}) {
  if (!existsSync(path.join(folder, MANIFEST))) throw new Refused(`${folder} has no ${MANIFEST}: not a complete backup.`);
  const manifest = JSON.parse(readFileSync(path.join(folder, MANIFEST), "utf8")) as Manifest;

  // Check every file against the manifest before touching the target, so a damaged backup changes nothing.
  const dump = await sha256File(path.join(folder, manifest.database.file));
  if (dump.sha256 !== manifest.database.sha256) throw new Refused(`${manifest.database.file} does not match its SHA-256 in the manifest.`);
  const checked = new Set<string>();
  for (const o of manifest.objects) {
    if (checked.has(o.sha256)) continue;
    const file = objectFile(folder, o.sha256);
    const got = existsSync(file) ? await sha256File(file) : undefined;
    if (got?.sha256 !== o.sha256 || got.bytes !== o.bytes) throw new Refused(`the backup's copy of ${o.key} is missing or does not match its SHA-256.`);
    checked.add(o.sha256);
  }
  try {
    await s3.send(new HeadBucketCommand({ Bucket: env.S3_BUCKET }));
  } catch {
    throw new Refused(`bucket ${env.S3_BUCKET} does not exist (or cannot be reached) at ${env.S3_ENDPOINT}; create it first.`);
  }

  const db = new pg.Client({ connectionString: env.DATABASE_URL });
  await db.connect();
  try {
    const { rows } = await db.query<{ schema: string }>(`
      SELECT DISTINCT n.nspname AS schema FROM pg_class c JOIN pg_namespace n ON n.oid = c.relnamespace
      WHERE n.nspname NOT IN ('pg_catalog', 'information_schema') AND n.nspname NOT LIKE 'pg\\_toast%' AND n.nspname NOT LIKE 'pg\\_temp%'`);
    if (rows.length && !options.force) {
      throw new Refused(`the database ${db.database} is not empty (schemas ${rows.map((r) => r.schema).join(", ")}). Restore into an empty database, or add --force to drop its contents first.`);
    }
    if (rows.length) {
      for (const { schema } of rows) await db.query(`DROP SCHEMA ${pg.escapeIdentifier(schema)} CASCADE`);
      await db.query(`CREATE SCHEMA IF NOT EXISTS public`);
    }
  } finally {
    await db.end();
  }
  // One transaction: the database is restored whole or not at all.
  const conn = pgConnection();
  execFileSync(pgTool("pg_restore"), ["--no-owner", "--no-privileges", "--exit-on-error", "--single-transaction", `--dbname=${conn.url}`, path.join(folder, manifest.database.file)], { stdio: "inherit", env: conn.env });

  for (const o of manifest.objects) {
    await s3.send(new PutObjectCommand({ Bucket: env.S3_BUCKET, Key: o.key, Body: createReadStream(objectFile(folder, o.sha256)), ContentLength: o.bytes, ContentType: o.contentType }));
    // Read back: what counts is what the store now holds, not what was sent.
    const out = await s3.send(new GetObjectCommand({ Bucket: env.S3_BUCKET, Key: o.key }));
    const stored = await digest(out.Body as Readable);
    if (stored.sha256 !== o.sha256) throw new Error(`${o.key} reads back with SHA-256 ${stored.sha256}, not ${o.sha256} as in the manifest.`);
  }
  return manifest;
}

function timestamp() {
  return new Date().toISOString().replace(/\.\d+Z$/, "Z").replace(/:/g, "-");
}

if (process.argv[1] && path.resolve(process.argv[1]) === fileURLToPath(import.meta.url)) {
  const [command, ...args] = process.argv.slice(2);
  const folderArg = args.find((a) => !a.startsWith("--"));
  try {
    if (command === "backup") {
      const folder = path.resolve(folderArg ?? path.join(ROOT, "backups", timestamp()));
      const m = await backup(folder);
      console.log(`backup: database and ${m.objects.length} objects of ${m.bucket} in ${folder}`);
    } else if (command === "restore") {
      if (!folderArg) throw new Refused("usage: npm run restore -- <backup folder> [--force]");
      const m = await restore(path.resolve(folderArg), { force: args.includes("--force") });
      console.log(`restore: database and ${m.objects.length} objects (all SHA-256 checked) into ${env.S3_BUCKET}`);
    } else {
      throw new Refused("usage: tsx db/backup.ts backup [folder] | restore <folder> [--force]");
    }
  } catch (error) {
    console.error(`${command ?? "backup"}: ${error instanceof Refused ? error.message : (error as Error).stack}`);
    process.exitCode = 1;
  }
}
