/**
 * `npm start`: local PostgreSQL on loopback, migrations, demo seed, client build when stale, then the server.
 */
import { execFileSync, spawnSync } from "node:child_process";
import fs from "node:fs";
import net from "node:net";
import path from "node:path";
import { loadConfig } from "../server/config";
import { createDb } from "../server/db/client";
import { migrateDatabase, migrationUrl } from "../server/db/migrate";
import { DEMO_LAB, DEMO_PASSWORD, DEMO_USERS, seedDemo } from "../server/db/seed";
import { startServer } from "../server/index";
import { startMailSink } from "../server/mailer/sink";
import { projectRoot } from "../server/platform/project-root";
import { newestMtime } from "./newest-mtime.mjs";

// The same folder whether this runs from source or from the bundle in dist/server (scripts/launch.mjs).
const root = projectRoot();

function portInUse(port: number, host: string) {
  return new Promise<boolean>((resolve) => {
    const s = net.connect({ port, host }, () => {
      s.destroy();
      resolve(true);
    });
    s.on("error", () => resolve(false));
  });
}

async function isRopewalk(url: string) {
  try {
    const r = await fetch(`${url}/api/health`, { signal: AbortSignal.timeout(2000) });
    const body = (await r.json()) as { db?: string };
    return typeof body.db === "string";
  } catch {
    return false;
  }
}

function buildClientIfStale(clientDir: string) {
  const index = path.join(clientDir, "index.html");
  const sources = [path.join(root, "client"), path.join(root, "shared")];
  const sourceTime = Math.max(...sources.map(newestMtime), fs.statSync(path.join(root, "vite.config.ts")).mtimeMs);
  if (fs.existsSync(index) && fs.statSync(index).mtimeMs >= sourceTime) return;
  console.log("Building the client (missing or older than its sources)…");
  const r = spawnSync("npx", ["vite", "build", "--logLevel", "warn"], { cwd: root, stdio: "inherit" });
  if (r.status !== 0) throw new Error("client build failed");
}

/** Outside production, and unless SMTP_URL points elsewhere, mail goes to a sink on loopback; returns the line to print. */
async function startLocalMailSink(config: ReturnType<typeof loadConfig>): Promise<string> {
  if (process.env.SMTP_URL) return "Mail goes to the SMTP server named in SMTP_URL.";
  if (config.env === "production")
    return "Mail: SMTP_URL is not set, so mail waits in the outbox (admins see it on the Mail page).";
  const where = `127.0.0.1:${config.mailSinkPort}`;
  try {
    // Its own small pool; it lives as long as the process.
    await startMailSink({ db: createDb(config.databaseUrl, 2).db, port: config.mailSinkPort });
    return `Mail goes to the local sink on ${where}; admins read it on the Mail page.`;
  } catch (e) {
    if ((e as NodeJS.ErrnoException).code !== "EADDRINUSE") throw e;
    return (
      `Port ${config.mailSinkPort} on 127.0.0.1 is taken by another program, so the local mail sink is not running. ` +
      `Mail waits in the outbox (Mail page) and goes to whatever accepts SMTP on ${where}; ` +
      `start with MAIL_SINK_PORT=<free port> npm start to use the sink.`
    );
  }
}

async function main() {
  const config = loadConfig({ ...process.env, NODE_ENV: process.env.NODE_ENV ?? "development" });
  const url = `http://${config.host}:${config.port}`;
  if (await portInUse(config.port, config.host)) {
    const ours = await isRopewalk(url);
    console.error(
      ours
        ? `Ropewalk is already running at ${url} — open it there, or stop that one first (Ctrl-C in its terminal).`
        : `Port ${config.port} on ${config.host} is taken by another program. Stop it or start with PORT=<free port> npm start.`,
    );
    process.exit(1);
  }
  if (!process.env.DATABASE_URL) {
    // Our own loopback cluster; the script creates the owner and app roles, prints the URLs on stdout and explains
    // problems on stderr. The config's defaults name the same roles and database.
    execFileSync("bash", [path.join(root, "docker-free-db-scripts/start.sh"), "ropewalk"], {
      stdio: ["ignore", "ignore", "inherit"],
    });
  }
  await migrateDatabase(migrationUrl(config), config.databaseUrl);
  // Seeding is plain inserts, so it runs as the app role like everything after it.
  const { pool, db } = createDb(config.databaseUrl, 2);
  const seed = (process.env.RW_SEED ?? (config.env === "production" ? "false" : "true")) === "true";
  if (seed) await seedDemo({ config, pool, db });
  await pool.end();
  buildClientIfStale(config.clientDir);

  const mailLine = await startLocalMailSink(config);
  await startServer(config);
  console.log(`\nRopewalk is running at ${url}  (Ctrl-C stops it; npm run db:stop stops PostgreSQL)`);
  console.log(mailLine);
  if (seed) {
    console.log(`\nDemo scenario: ${DEMO_LAB}. Every demo account's password is "${DEMO_PASSWORD}":`);
    for (const u of DEMO_USERS) console.log(`  ${u.email.padEnd(26)} ${u.name.padEnd(18)} ${u.roles.join(", ")}`);
  }
}

main().catch((e) => {
  console.error(`npm start failed: ${(e as Error).message}`);
  process.exit(1);
});
