import type { Server } from "node:http";

/** How long each stage of a shutdown may take before it is abandoned (the whole stop stays within their sum). */
export interface ShutdownLimits {
  /** In-flight requests finish within this; then every connection still open is closed. */
  requestsMs: number;
  /** Background workers (the mail outbox) finishing the run in progress. */
  workersMs: number;
  /** Ending the database pools (each waits for its checked-out connections to come back). */
  poolsMs: number;
}
export const SHUTDOWN_LIMITS: ShutdownLimits = { requestsMs: 5000, workersMs: 2000, poolsMs: 3000 };

export interface ShutdownParts {
  server: Server;
  /** Stopped after the HTTP server, before the pools it uses. */
  workers: Record<string, { stop(): Promise<void> }>;
  pools: Record<string, { end(): Promise<void> }>;
}

/** The sweep that closes keep-alive connections as their last request finishes, until the server has closed. */
const IDLE_SWEEP_MS = 100;

/** `true` when `p` settled within `ms` (a rejection counts as settled: the stage is over, if badly). */
function within(p: Promise<unknown>, ms: number): Promise<boolean> {
  let timer: NodeJS.Timeout | undefined;
  const late = new Promise<boolean>((r) => (timer = setTimeout(() => r(false), ms)));
  const done = p.then(
    () => true,
    () => true,
  );
  return Promise.race([done, late]).finally(() => clearTimeout(timer));
}

/**
 * Stops the process's parts in order, each within its limit; resolves the names of the stages that had to be
 * abandoned (empty: a clean stop). Never waits longer than the limits' sum, so a connection a database outage left
 * hanging cannot hold the process after SIGTERM.
 *
 * Node.js http (v20 docs, https://nodejs.org/docs/latest-v20.x/api/http.html): `server.close()` stops accepting and,
 * since v19, closes idle connections; `server.closeIdleConnections()` closes connections "which are not sending a
 * request or waiting for a response" (called after close(), as the docs advise, and again while requests finish, so a
 * keep-alive socket goes as soon as its last response is sent); `server.closeAllConnections()` closes the rest.
 */
export async function shutDown(parts: ShutdownParts, limits: ShutdownLimits = SHUTDOWN_LIMITS): Promise<string[]> {
  const late: string[] = [];
  const { server } = parts;
  const closed = new Promise<void>((r) => server.close(() => r()));
  server.closeIdleConnections();
  const sweep = setInterval(() => server.closeIdleConnections(), IDLE_SWEEP_MS);
  const requestsDone = await within(closed, limits.requestsMs);
  clearInterval(sweep);
  if (!requestsDone) {
    late.push("requests");
    server.closeAllConnections();
  }
  for (const [name, worker] of Object.entries(parts.workers))
    if (!(await within(worker.stop(), limits.workersMs))) late.push(name);
  const ends = Object.entries(parts.pools).map(async ([name, pool]) =>
    (await within(pool.end(), limits.poolsMs)) ? undefined : name,
  );
  for (const name of await Promise.all(ends)) if (name) late.push(name);
  return late;
}
