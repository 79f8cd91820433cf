import type { Server } from "node:http";
import { loadConfig } from "./config";
import { createDb } from "./db/client";
import { createApp } from "./app";
import { startOutboxWorker } from "./mailer/worker";
import { createLogger } from "./logger";
import { signingKey } from "./features/plans/signing";
import { warmBoundPool } from "./features/bounds/bounds.pool";
import { shutDown } from "./shutdown";

/** Starts the HTTP server; resolves once it listens. Used by `npm start` and production. */
export async function startServer(config = loadConfig()) {
  // Created at first start (mode 0600); a bad key file stops the start here rather than at the first decision.
  signingKey(config.signingKeyFile);
  const { pool, db } = createDb(config.databaseUrl, 10, config.db);
  // Sessions get their own 3 connections, so signed-in requests never wait behind slow queries for their session.
  const { pool: sessionPool } = createDb(config.databaseUrl, 3, config.db);
  const logger = createLogger({ level: config.logLevel });
  const app = createApp({ config, pool, db, sessionPool, logger });
  const server: Server = await new Promise((resolve, reject) => {
    const s = app.listen(config.port, config.host, () => resolve(s));
    s.on("error", reject);
  });
  // The search pool keeps one thread ready, so the first search does not pay for starting it.
  warmBoundPool();
  const mailWorker = startOutboxWorker({ config, db });
  let closing = false;
  const shutdown = async (signal: string) => {
    if (closing) return;
    closing = true;
    console.log(`\n${signal} received: finishing open requests, then stopping.`);
    const late = await shutDown({ server, workers: { mail: mailWorker }, pools: { pool, sessionPool } });
    if (late.length) console.error(`Stopped without waiting longer for: ${late.join(", ")}.`);
    process.exit(late.length ? 1 : 0);
  };
  process.on("SIGTERM", () => void shutdown("SIGTERM"));
  process.on("SIGINT", () => void shutdown("SIGINT"));
  process.on("unhandledRejection", (reason) => logger.error({ err: reason }, "unhandled promise rejection"));
  return { server, pool, db, config };
}

const isMain = process.argv[1] && import.meta.url.endsWith(process.argv[1].replace(/\\/g, "/"));
if (isMain) {
  startServer().then(
    ({ config }) => console.log(`Ropewalk listening on http://${config.host}:${config.port}`),
    (e) => {
      console.error(`Ropewalk could not start: ${(e as Error).message}`);
      process.exit(1);
    },
  );
}
