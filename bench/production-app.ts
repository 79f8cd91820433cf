// One way for the benches to start the app as production runs it: `npm start`'s path (scripts/launch.mjs builds
// dist/server when stale, then runs the compiled bundle) with NODE_ENV=production, in a child process on a free
// loopback port. Used by `npm run bench -- speed` and by bench:scale's production timing.
import { spawn, type ChildProcess } from "node:child_process";
import crypto from "node:crypto";
import net from "node:net";
import path from "node:path";
import { send } from "./http-client";

const root = path.resolve(import.meta.dirname, "..");

export const freePort = () =>
  new Promise<number>((resolve) => {
    const s = net.createServer().listen(0, "127.0.0.1", () => {
      const { port } = s.address() as net.AddressInfo;
      s.close(() => resolve(port));
    });
  });

/** Polls `url` every 250 ms, `tries` times, until it answers below 500; fails early if the child exits. */
export async function waitFor(url: string, child: ChildProcess, tries: number) {
  for (let i = 0; i < tries; i++) {
    if (child.exitCode !== null) throw new Error(`the server exited (${child.exitCode})`);
    try {
      if ((await send(url)).status < 500) return;
    } catch {
      // not listening yet
    }
    await new Promise((r) => setTimeout(r, 250));
  }
  throw new Error(`${url} did not answer`);
}

type ProductionOptions = {
  databaseUrl: string;
  migrationUrl: string;
  /** RW_SEED: whether the app seeds the demo scenario at start. */
  seed: boolean;
  /** How many 250 ms polls to wait for /api/health (a stale server or client build happens first). */
  tries: number;
};

/** Starts the compiled production server behind an assumed TLS proxy (TRUST_PROXY); `stop()` ends it. */
export async function startProductionApp({ databaseUrl, migrationUrl, seed, tries }: ProductionOptions) {
  const port = await freePort();
  // BENCH_CPU_PROF=<dir>: the server writes a V8 CPU profile there when it stops (read it with bench/cpu-profile-top.mjs).
  const profile = process.env.BENCH_CPU_PROF ? ["--cpu-prof", `--cpu-prof-dir=${process.env.BENCH_CPU_PROF}`] : [];
  const child = spawn("node", [...profile, "scripts/launch.mjs"], {
    cwd: root,
    stdio: ["ignore", "ignore", "inherit"],
    env: {
      ...process.env,
      NODE_ENV: "production",
      PORT: String(port),
      DATABASE_URL: databaseUrl,
      MIGRATION_DATABASE_URL: migrationUrl,
      SESSION_SECRET: crypto.randomBytes(24).toString("hex"),
      TRUST_PROXY: "true",
      RW_SEED: String(seed),
      LOGIN_LIMIT_PER_ADDRESS: "100000",
      LOG_LEVEL: "warn",
    },
  });
  const base = `http://127.0.0.1:${port}`;
  await waitFor(`${base}/api/health`, child, tries);
  const stop = () =>
    new Promise<void>((resolve) => {
      if (child.exitCode !== null) return resolve();
      child.once("exit", () => resolve());
      child.kill("SIGTERM");
    });
  return { base, child, pid: child.pid!, stop };
}
