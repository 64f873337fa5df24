// `npm start` on a machine where everything is installed: seconds from spawning it until http://127.0.0.1:3000
// answers. One untimed start first installs, creates, seeds and builds whatever is missing; then BENCH_RUNS timed
// starts. The dev profile's own ports must be free (someone's `npm start` may be up: then nothing is measured).
// The build goes to its own folder (COUNTERSIGN_BUILD_DIR=.run/build-bench-start) so that a rebuild never swaps the
// assets under a test stack that serves build/. A timed start that had to rebuild (sources changed meanwhile) is
// noted. Stopping ends only what this start began — its app, its npm process group and the dev fakes — and
// leaves PostgreSQL up: `npm run stop` would also stop every test slot's app and fakes and the shared cluster.
//   npx tsx tests/perf/start-time.ts
import { spawn, spawnSync } from "node:child_process";
import { openSync, readFileSync } from "node:fs";
import { createConnection } from "node:net";
import path from "node:path";
import { benchRuns, writeBench } from "./bench-out";

const ROOT = path.resolve(import.meta.dirname, "../..");
const DEV_PORTS = { app: 3000, s3: 4569, smtp: 1025, mailWeb: 1080 };
const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));

const portBusy = (port: number) =>
  new Promise<boolean>((resolve) => {
    const socket = createConnection({ host: "127.0.0.1", port });
    socket.once("connect", () => (socket.destroy(), resolve(true)));
    socket.once("error", () => resolve(false));
  });

async function answers() {
  try {
    await fetch("http://127.0.0.1:3000/", { redirect: "manual", signal: AbortSignal.timeout(2000) });
    return true;
  } catch {
    return false;
  }
}

/** The environment of a plain shell: nothing of a test slot the benchmark itself may have exported. */
function cleanEnv() {
  const env: NodeJS.ProcessEnv = { ...process.env, COUNTERSIGN_BUILD_DIR: ".run/build-bench-start" };
  for (const k of Object.keys(env)) if (/^(DATABASE_URL|S3_|SMTP_|MAIL_|APP_URL|APP_PORT|TEST_SLOT|SESSION_SECRET|COUNTERSIGN_(DB|RUN)|UPLOAD_|BENCH_)/.test(k)) delete env[k];
  return env;
}

const signal = (pid: number, sig: NodeJS.Signals) => {
  try {
    process.kill(pid, sig);
  } catch {
    /* already gone */
  }
};

async function portFreed(port: number, ms: number) {
  for (const until = performance.now() + ms; performance.now() < until; await sleep(100)) if (!(await portBusy(port))) return true;
  return false;
}

async function stop(npm: number) {
  const app = Number(readFileSync(path.join(ROOT, ".run/dev/app.pid"), "utf8"));
  signal(app, "SIGTERM");
  signal(-npm, "SIGTERM");
  spawnSync("bash", ["storage/fakes.sh", "down", "dev"], { cwd: ROOT, env: { ...cleanEnv(), S3_PORT: String(DEV_PORTS.s3) }, stdio: "ignore" });
  // On a loaded machine the app can take a while to close its pools; the next start must not find it answering.
  if (!(await portFreed(DEV_PORTS.app, 30_000))) {
    signal(app, "SIGKILL");
    if (!(await portFreed(DEV_PORTS.app, 10_000))) throw new Error(`:${DEV_PORTS.app} still answers after stopping the app`);
  }
}

async function startOnce(log: string): Promise<{ seconds: number; rebuilt: boolean }> {
  if (await portBusy(DEV_PORTS.app)) throw new Error(`:${DEV_PORTS.app} answers before npm start was run`);
  const out = openSync(log, "w");
  const t0 = performance.now();
  const npm = spawn("npm", ["start"], { cwd: ROOT, env: cleanEnv(), detached: true, stdio: ["ignore", out, out] });
  let exited: number | null = null;
  npm.once("exit", (code) => (exited = code ?? -1));
  try {
    for (;;) {
      if (await answers()) break;
      if (exited !== null) throw new Error(`npm start exited (${exited}) before serving; see ${log}`);
      if (performance.now() - t0 > 600_000) throw new Error(`npm start did not serve within 10 min; see ${log}`);
      await sleep(100);
    }
    const seconds = +((performance.now() - t0) / 1000).toFixed(1);
    return { seconds, rebuilt: readFileSync(log, "utf8").includes("building the app") };
  } finally {
    await stop(npm.pid!);
  }
}

const busy = [];
for (const [name, port] of Object.entries(DEV_PORTS)) if (await portBusy(port)) busy.push(`${name} :${port}`);
if (busy.length) {
  console.error(`not measured: the dev profile's ports are in use (${busy.join(", ")}) — someone's npm start is up`);
  process.exit(1);
}
const dir = process.env.BENCH_DIR ?? path.join(ROOT, ".run");
const first = await startOnce(path.join(dir, "start-0.log"));
console.log(`first start (installs, seeds, builds what is missing): ${first.seconds} s`);
const seconds: number[] = [];
let rebuilt = 0;
for (let run = 1; run <= benchRuns(); run++) {
  const r = await startOnce(path.join(dir, `start-${run}.log`));
  console.log(`start ${run}: serving after ${r.seconds} s${r.rebuilt ? " (sources had changed: it rebuilt)" : ""}`);
  seconds.push(r.seconds);
  rebuilt += r.rebuilt ? 1 : 0;
}
writeBench("start", { serving_s: seconds, first_start_s: [first.seconds] }, { rebuilt, buildDir: ".run/build-bench-start" });
