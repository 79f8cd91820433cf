import { EventEmitter } from "node:events";
import os from "node:os";
import { MessageChannel } from "node:worker_threads";
import { Piscina } from "piscina";
import { Unavailable } from "../../platform/errors";
import { workerEntry } from "../../platform/worker-entry";
import type { BaseBoundQuery, BaseBoundResponse, BoundProgress } from "../../../shared/schemas/bounds";
import type { BoundTask } from "./bounds.worker";

/** Thrown when the caller aborted (e.g. the stream's client went away); a running task's thread is terminated. */
export class SearchCancelled extends Error {
  constructor() {
    super("search cancelled");
  }
}

export const SEARCH_TIMEOUT_MS = 120_000;
/** Searches waiting for a thread beyond this answer 503 at once (piscina's own queue bound). */
const MAX_QUEUE = 32;

// Warm threads: starting one (and loading the engine into it) costs more than many searches, so one thread is kept
// ready at all times and the others live for a minute after their last task.
let pool: Piscina<BoundTask, BaseBoundResponse> | undefined;
const getPool = () =>
  (pool ??= new Piscina({
    filename: workerEntry(import.meta.url, "bounds.worker"),
    minThreads: 1,
    maxThreads: Math.max(2, os.availableParallelism()),
    idleTimeout: 60_000,
    maxQueue: MAX_QUEUE,
  }));

/** Starts the pool's first thread now (server start), so the first search does not pay for it. */
export function warmBoundPool() {
  getPool();
}

let running = 0;
let started = 0;
/** Searches given to the pool and not yet settled (tests use it to see that a cancelled search really stopped). */
export const activeBoundSearches = () => running;
/** How many searches were computed in the pool since start (tests: a kept answer computes nothing). */
export const boundSearchesStarted = () => started;
/**
 * "start" when a search is handed to the pool; "exit" once it settled — finished, failed, or cancelled, in which
 * case piscina has already terminated the thread running it. Tests wait on these, never on the clock.
 */
export const boundSearchEvents = new EventEmitter<{ start: []; exit: [] }>();

export interface PoolSearchOptions {
  onProgress?: (p: BoundProgress) => void;
  signal?: AbortSignal;
  timeoutMs?: number;
}

/** Runs one query in a pool thread; the event loop keeps serving requests meanwhile. */
export async function searchOffThread(query: BaseBoundQuery, opts: PoolSearchOptions = {}): Promise<BaseBoundResponse> {
  if (opts.signal?.aborted) throw new SearchCancelled();
  const p = getPool();
  if (p.queueSize >= MAX_QUEUE) throw new Unavailable("busy", "all bound searches are busy; try again shortly");
  const timeoutMs = opts.timeoutMs ?? SEARCH_TIMEOUT_MS;
  const timeout = AbortSignal.timeout(timeoutMs);
  const signal = opts.signal ? AbortSignal.any([opts.signal, timeout]) : timeout;
  const { port1, port2 } = new MessageChannel();
  port1.on("message", (progress: BoundProgress) => opts.onProgress?.(progress));
  running++;
  started++;
  boundSearchEvents.emit("start");
  try {
    return await p.run({ query, progress: port2 }, { transferList: [port2], signal });
  } catch (e) {
    if (opts.signal?.aborted) throw new SearchCancelled();
    if (timeout.aborted) throw new Unavailable("search_timeout", `the search took longer than ${timeoutMs / 1000} s`);
    throw e;
  } finally {
    port1.close();
    running--;
    boundSearchEvents.emit("exit");
  }
}
