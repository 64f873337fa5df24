// Serves the production build with one process per core: each is the framework's own server
// (@react-router/serve) listening on the same port through node:cluster, so the pages and the API use every core
// rather than one. Sessions, rate limits, uploads and jobs already live in PostgreSQL and object storage, which is
// what lets any process answer any request.
//   node storage/serve.mjs build/server/index.js     (HOST and PORT as for react-router-serve)
//   WEB_CONCURRENCY=n   processes (default: the cores this machine offers; 1 serves without a launcher)
// A process that dies is replaced, unless it dies within its first seconds (a start-up fault such as a port in use
// would only die again): then the launcher stops too, with that exit code. SIGTERM and SIGINT are passed on to
// every process, which finish their requests and stop their job queues; the launcher leaves when they have (and
// kills any still running after STOP_GRACE_MS, with a failing exit code).
import cluster from "node:cluster";
import { createRequire } from "node:module";
import os from "node:os";
import { fileURLToPath } from "node:url";

const processes = Math.max(1, Math.trunc(Number(process.env.WEB_CONCURRENCY)) || os.availableParallelism());
const START_GRACE_MS = 10_000;
const STOP_GRACE_MS = 15_000;

if (cluster.isPrimary && processes > 1) {
  const startedAt = new Map();
  const fork = () => startedAt.set(cluster.fork().id, Date.now());
  let stopping = false;
  // The first process starts alone and the others once it listens: started together they would share the cores
  // while loading the app, and the first answer would come later.
  fork();
  cluster.once("listening", () => {
    for (let i = 1; i < processes; i++) fork();
  });
  cluster.on("exit", (worker, code, signal) => {
    const lived = Date.now() - (startedAt.get(worker.id) ?? 0);
    startedAt.delete(worker.id);
    if (stopping) {
      if (startedAt.size === 0) process.exit();
      return;
    }
    if (lived < START_GRACE_MS) {
      console.error(`server process ${worker.process.pid} ended during start-up (${signal ?? code}); stopping`);
      stopping = true;
      for (const other of Object.values(cluster.workers ?? {})) other?.process.kill("SIGTERM");
      process.exitCode = code || 1;
      if (startedAt.size === 0) process.exit();
      return;
    }
    console.error(`server process ${worker.process.pid} ended (${signal ?? code}); starting another`);
    fork();
  });
  for (const signal of ["SIGTERM", "SIGINT"]) {
    process.on(signal, () => {
      stopping = true;
      for (const worker of Object.values(cluster.workers ?? {})) worker?.process.kill(signal);
      // A process that has not finished by then is killed rather than left running on its own.
      setTimeout(() => {
        console.error(`server processes still running after ${STOP_GRACE_MS / 1000} s; killing them`);
        for (const worker of Object.values(cluster.workers ?? {})) worker?.process.kill("SIGKILL");
        process.exit(1);
      }, STOP_GRACE_MS).unref();
    });
  }
} else {
  // The package exports no subpaths, so its command is required by file.
  createRequire(import.meta.url)(fileURLToPath(new URL("../node_modules/@react-router/serve/bin.js", import.meta.url)));
}
