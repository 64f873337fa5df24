// Fault injection for integration tests: a TCP relay that can be cut, or made to hold or cut a connection at the
// moment a given message passes (e.g. the COMMIT of a transaction), and a separate app server process that a test
// can point at such relays and kill. Ports come from the test slot (APP_PORT + 50 …), so slots never collide.
import { spawn, type ChildProcess } from "node:child_process";
import net from "node:net";

const APP_PORT = Number(process.env.APP_PORT ?? 3100);
/** Spare ports of this slot: APP_PORT + 50, + 51, … (the slot's own app is on APP_PORT). */
export const slotPort = (n: number) => APP_PORT + 50 + n;

/** The PostgreSQL simple-query message Sequelize sends to end a transaction: 'Q', length 12, "COMMIT;\0". */
export const COMMIT_MESSAGE = Buffer.concat([Buffer.from("Q"), Buffer.from([0, 0, 0, 12]), Buffer.from("COMMIT;\0")]);

interface Pair {
  client: net.Socket;
  upstream: net.Socket;
}

/** `sent`: what this connection sent since its last COMMIT (PostgreSQL) or request (HTTP), as latin1 text. */
export type Matcher = (chunk: Buffer, sent: string) => boolean;

type Trigger = { match: Matcher; action: "cut" | "hold" | "cut-after"; fired: (pair: Pair) => void };

export interface Relay {
  port: number;
  /** Drop every open connection and refuse new ones until `restore`. */
  cut(): Promise<void>;
  restore(): Promise<void>;
  /**
   * The next time a client sends a chunk that `match`es: "cut" drops every connection without forwarding it
   * and refuses new ones until `restore`,
   * "cut-after" forwards it and then drops the connections before the answer returns, "hold" stops forwarding
   * that connection (resolve with `release`). Resolves with the connection's upstream local port (which
   * PostgreSQL shows as pg_stat_activity.client_port).
   */
  when(match: Matcher, action: Trigger["action"]): Promise<{ upstreamPort: number; release: () => void }>;
  close(): Promise<void>;
}

export async function relay(port: number, targetPort: number): Promise<Relay> {
  const pairs = new Set<Pair>();
  let trigger: Trigger | undefined;
  let server: net.Server | undefined;

  const dropAll = () => {
    for (const p of pairs) {
      p.client.destroy();
      p.upstream.destroy();
    }
    pairs.clear();
  };

  const onConnection = (client: net.Socket) => {
    const upstream = net.connect(targetPort, "127.0.0.1");
    const pair = { client, upstream };
    pairs.add(pair);
    const drop = () => {
      client.destroy();
      upstream.destroy();
      pairs.delete(pair);
    };
    client.on("error", drop).on("close", drop);
    upstream.on("error", drop).on("close", drop);
    // Once a "cut-after" fires, answers from upstream are dropped: the client never learns how the message ended.
    let muted = false;
    upstream.on("data", (d) => {
      if (!muted) client.write(d);
    });
    let held: Buffer[] | undefined;
    let sent = "";
    client.on("data", (chunk: Buffer) => {
      if (held) return void held.push(chunk);
      sent = (sent + chunk.toString("latin1")).slice(-200_000);
      const t = trigger;
      const hit = t?.match(chunk, sent);
      if (chunk.includes(COMMIT_MESSAGE)) sent = "";
      if (t && hit) {
        trigger = undefined;
        if (t.action === "cut") {
          // As if the server died: nothing more is forwarded and new connections are refused until `restore`.
          t.fired(pair);
          return void stop();
        }
        if (t.action === "cut-after") {
          muted = true;
          upstream.write(chunk, () => setTimeout(dropAll, 50));
          return t.fired(pair);
        }
        held = [chunk];
        return t.fired(pair);
      }
      upstream.write(chunk);
    });
    (pair as Pair & { release?: () => void }).release = () => {
      const queued = held ?? [];
      held = undefined;
      for (const c of queued) upstream.write(c);
    };
  };

  const listen = () =>
    new Promise<void>((resolve, reject) => {
      server = net.createServer(onConnection);
      server.once("error", reject);
      server.listen(port, "127.0.0.1", () => resolve());
    });
  const stop = () =>
    new Promise<void>((resolve) => {
      dropAll();
      if (!server) return resolve();
      server.close(() => resolve());
      server = undefined;
    });

  await listen();
  return {
    port,
    cut: stop,
    restore: listen,
    close: stop,
    when: (match, action) =>
      new Promise((resolve) => {
        trigger = {
          match,
          action,
          fired: (pair) => resolve({ upstreamPort: pair.upstream.localPort!, release: () => (pair as Pair & { release?: () => void }).release?.() }),
        };
      }),
  };
}

/** Matches the COMMIT of a transaction that wrote `pattern` (e.g. /INSERT INTO "deviation_requests"/). */
export const commitOf = (pattern: RegExp): Matcher => (chunk, sent) => chunk.includes(COMMIT_MESSAGE) && pattern.test(sent);

/** Matches an HTTP request whose first line is `PUT <path containing part>`. */
export const putTo = (part: string): Matcher => (chunk) => {
  const line = chunk.subarray(0, 2000).toString("latin1").split("\r\n", 1)[0]!;
  return line.startsWith("PUT ") && line.includes(part);
};

export interface AppProcess {
  base: string;
  child: ChildProcess;
  /** Ends the process with `signal` and waits until it is gone. */
  stop(signal?: NodeJS.Signals): Promise<void>;
}

/** Starts the slot's built app server on `port` with extra environment, and waits until it answers. */
export async function startApp(port: number, extraEnv: Record<string, string> = {}): Promise<AppProcess> {
  const base = `http://127.0.0.1:${port}`;
  const child = spawn(process.execPath, ["node_modules/@react-router/serve/bin.js", `${process.env.COUNTERSIGN_BUILD_DIR ?? "build"}/server/index.js`], {
    // Without VITEST: the built server starts its job worker only outside test runners.
    env: { ...process.env, VITEST: undefined, PORT: String(port), HOST: "127.0.0.1", APP_URL: base, ...extraEnv },
    stdio: ["ignore", "ignore", "pipe"],
  });
  let stderr = "";
  child.stderr!.on("data", (d) => (stderr = (stderr + d).slice(-4000)));
  const exited = new Promise<void>((resolve) => child.once("exit", () => resolve()));
  const deadline = Date.now() + 40_000;
  for (;;) {
    if (child.exitCode !== null) throw new Error(`the app on :${port} exited at start:\n${stderr}`);
    try {
      await fetch(`${base}/healthz`);
      break;
    } catch {
      if (Date.now() > deadline) {
        child.kill("SIGKILL");
        throw new Error(`the app on :${port} did not answer:\n${stderr}`);
      }
      await new Promise((r) => setTimeout(r, 100));
    }
  }
  return {
    base,
    child,
    stop: async (signal = "SIGTERM") => {
      if (child.exitCode === null && child.signalCode === null) child.kill(signal);
      await exited;
    },
  };
}
