// The app as production runs it, for bench:scale: `npm start`'s path (scripts/launch.mjs builds dist/server when stale,
// then runs the compiled bundle) with NODE_ENV=production, in a child process on the bench database. Production skips
// the development-only check of every reply against its schema (server/http/route.ts), so this is the figure a
// deployment would see. Behind a TLS proxy as in production: the session cookie is Secure, so requests say https.
import { spawn, type ChildProcess } from "node:child_process";
import crypto from "node:crypto";
import net from "node:net";
import path from "node:path";
import { send } from "../http-client";
import { appUrl, ownerUrl } from "./prepare";

const root = path.resolve(import.meta.dirname, "../..");
export const PROXIED = { "x-forwarded-proto": "https" };

const freePort = () =>
  new Promise<number>((resolve) => {
    const s = net.createServer().listen(0, "127.0.0.1", () => {
      const { port } = s.address() as net.AddressInfo;
      s.close(() => resolve(port));
    });
  });

async function waitFor(url: string, child: ChildProcess) {
  // Generous: a stale server or client build happens first.
  for (let i = 0; i < 2400; i++) {
    if (child.exitCode !== null) throw new Error(`the production server exited (${child.exitCode})`);
    try {
      if ((await send(url)).status < 500) return;
    } catch {
      // not listening yet
    }
    await new Promise((r) => setTimeout(r, 250));
  }
  throw new Error(`${url} did not answer`);
}

/** Starts the compiled production server on the bench database; `stop()` ends it. */
export async function startProduction() {
  const port = await freePort();
  const child = spawn("node", ["scripts/launch.mjs"], {
    cwd: root,
    stdio: ["ignore", "ignore", "inherit"],
    env: {
      ...process.env,
      NODE_ENV: "production",
      PORT: String(port),
      DATABASE_URL: appUrl,
      MIGRATION_DATABASE_URL: ownerUrl,
      SESSION_SECRET: crypto.randomBytes(24).toString("hex"),
      TRUST_PROXY: "true",
      RW_SEED: "false", // the bench database is seeded already, demo accounts included
      LOGIN_LIMIT_PER_ADDRESS: "100000",
      LOG_LEVEL: "warn",
    },
  });
  const base = `http://127.0.0.1:${port}`;
  await waitFor(`${base}/api/health`, child);
  const stop = () =>
    new Promise<void>((resolve) => {
      if (child.exitCode !== null) return resolve();
      child.once("exit", () => resolve());
      child.kill("SIGTERM");
    });
  return { base, pid: child.pid!, stop };
}
