// The background job queue: one pg-boss instance per app process, on the app's own database (schema JOBS_SCHEMA, "pgboss"),
// started lazily. Domains declare their jobs with `defineJob`; the worker runs inside the app process, and since
// pg-boss hands each job to one worker (SKIP LOCKED), any number of app servers can share the queue.
import PgBoss from "pg-boss";
import { env } from "./env.server";

export interface JobDefinition<T extends object> {
  name: string;
  retryLimit?: number;
  retryDelaySeconds?: number;
  expireInSeconds?: number;
  /** Jobs fetched at once by this process's worker. */
  batchSize?: number;
  handler: (data: T, job: { id: string; retryCount: number; retryLimit: number }) => Promise<void>;
}

const definitions = new Map<string, JobDefinition<any>>();
let starting: Promise<PgBoss> | undefined;
let onStarted: (() => Promise<void>)[] = [];

export function defineJob<T extends object>(definition: JobDefinition<T>) {
  definitions.set(definition.name, definition);
  // A module loaded after the queue started (dev server) still gets its queue and worker.
  if (starting) void starting.then((boss) => register(boss, definition)).catch(() => {});
  return {
    name: definition.name,
    send: (data: T, options: PgBoss.SendOptions = {}) => enqueue(definition.name, data, options),
  };
}

/** Run once the queue is up (e.g. re-queue work a crashed process left behind). */
export function whenJobsStart(task: () => Promise<void>) {
  onStarted.push(task);
}

async function boot(): Promise<PgBoss> {
  const boss = new PgBoss({ connectionString: env.DATABASE_URL, schema: env.JOBS_SCHEMA, max: 4 });
  boss.on("error", (error) => console.error("job queue:", error.message));
  await boss.start();
  for (const d of definitions.values()) await register(boss, d);
  return boss;
}

// Run once the queue is up, not as part of starting it: a task that queues work (re-queueing what a stopped
// process left) calls `startJobs()` itself, and waiting for it inside `boot` would wait for itself forever.
async function runStartTasks() {
  const tasks = onStarted;
  onStarted = [];
  for (const task of tasks) await task().catch((error) => console.error("job queue start-up task:", error));
}

const registered = new Set<string>();
async function register(boss: PgBoss, d: JobDefinition<any>) {
  if (registered.has(d.name)) return;
  registered.add(d.name);
  await boss.createQueue(d.name, {
    name: d.name,
    retryLimit: d.retryLimit ?? 3,
    retryDelay: d.retryDelaySeconds ?? 5,
    retryBackoff: true,
    expireInSeconds: d.expireInSeconds ?? 15 * 60,
  });
  if (!env.JOBS_WORKER) return;
  await boss.work(d.name, { batchSize: d.batchSize ?? 1, pollingIntervalSeconds: 0.5, includeMetadata: true }, async (jobs) => {
    for (const job of jobs) {
      await d.handler(job.data as object, { id: job.id, retryCount: job.retryCount, retryLimit: job.retryLimit });
    }
  });
}

/** The started queue (starting it on first use). A failed start is retried on the next call. */
export function startJobs(): Promise<PgBoss> {
  if (!starting) {
    starting = boot().catch((error) => {
      starting = undefined;
      throw error;
    });
    starting.then(runStartTasks, () => {});
  }
  return starting;
}

export async function enqueue(name: string, data: object, options: PgBoss.SendOptions = {}) {
  if (!definitions.has(name)) throw new Error(`no job named ${name}`);
  const boss = await startJobs();
  return boss.send(name, data, options);
}

/** The jobs of `name` that a worker has taken and not finished (their id, data and start), from the queue's table. */
export async function activeJobs<T extends object>(name: string): Promise<{ id: string; data: T; startedOn: Date }[]> {
  const boss = await startJobs();
  const { rows } = await boss.getDb().executeSql(`SELECT id, data, started_on FROM ${env.JOBS_SCHEMA}.job WHERE name = $1 AND state = 'active'`, [name]);
  return (rows as { id: string; data: T; started_on: Date }[]).map((r) => ({ id: r.id, data: r.data, startedOn: r.started_on }));
}

/**
 * Hands a job back to the queue as failed, so it is retried (within its retry limit) by any live worker. For work
 * whose process died: pg-boss itself would only notice when the job expires.
 */
export async function failJob(name: string, id: string, reason: string) {
  const boss = await startJobs();
  await boss.fail(name, id, { message: reason });
}

export async function stopJobs() {
  if (!starting) return;
  const boss = await starting;
  starting = undefined;
  registered.clear();
  await boss.stop({ graceful: true, wait: true, timeout: 10_000 });
}

// In the built app server, start right after every module has declared its jobs, so work queued before a
// restart (or by another server) is picked up without waiting for a request. Scripts and tests start it lazily.
if (typeof import.meta.env !== "undefined" && import.meta.env.PROD && !process.env.VITEST) {
  if (env.JOBS_WORKER) setTimeout(() => void startJobs().catch((error) => console.error("job queue did not start:", (error as Error).message)), 0);
  // The HTTP server closes on these signals, but the queue's timers (also of a web-only process, whose queue starts
  // with its first job) would keep the process, and a worker with old code, alive: stop the queue and leave.
  for (const signal of ["SIGTERM", "SIGINT"] as const) {
    process.once(signal, () => {
      const force = setTimeout(() => process.exit(0), 12_000);
      force.unref();
      void stopJobs().finally(() => process.exit(0));
    });
  }
}
