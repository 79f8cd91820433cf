import { EventEmitter } from "node:events";
import os from "node:os";
import { Worker } from "node:worker_threads";
import { HttpError } from "../../platform/errors";
import type { BaseBoundQuery, BaseBoundResponse, BoundProgress } from "../../../shared/schemas/bounds";

/** Thrown when the caller aborted (e.g. the stream's client went away); the worker is already terminated. */
export class SearchCancelled extends Error {
  constructor() {
    super("search cancelled");
  }
}

export const SEARCH_TIMEOUT_MS = 120_000;
const MAX_WORKERS = Math.max(2, os.availableParallelism());
// A plain-JS boot file registers tsx inside the thread, so the TypeScript worker runs under both `node --import tsx` and vitest.
const WORKER_URL = new URL("./bounds.worker-boot.mjs", import.meta.url);

let liveWorkers = 0;
/** Workers spawned and not yet exited (tests use it to see that a cancelled search really stopped). */
export const activeBoundSearches = () => liveWorkers;
/** "start" once a search's worker thread exists, "exit" once it has exited: tests wait on these, never on the clock. */
export const boundSearchEvents = new EventEmitter<{ start: []; exit: [] }>();

// Searches beyond the worker limit wait their turn (a short queue) instead of failing at once.
export const QUEUE_WAIT_MS = 15_000;
const MAX_QUEUED = 32;
const waiting: (() => void)[] = [];
function releaseSlot() {
  liveWorkers--;
  waiting.shift()?.();
}
function takeSlot(signal?: AbortSignal): Promise<void> {
  if (liveWorkers < MAX_WORKERS) {
    liveWorkers++;
    return Promise.resolve();
  }
  if (waiting.length >= MAX_QUEUED)
    return Promise.reject(new HttpError(503, "busy", "all bound searches are busy; try again shortly"));
  return new Promise((resolve, reject) => {
    const go = () => {
      clearTimeout(timer);
      signal?.removeEventListener("abort", cancel);
      liveWorkers++;
      resolve();
    };
    const leave = (e: Error) => {
      const i = waiting.indexOf(go);
      if (i >= 0) waiting.splice(i, 1);
      signal?.removeEventListener("abort", cancel);
      reject(e);
    };
    const cancel = () => {
      clearTimeout(timer);
      leave(new SearchCancelled());
    };
    const timer = setTimeout(
      () => leave(new HttpError(503, "busy", "all bound searches are busy; try again shortly")),
      QUEUE_WAIT_MS,
    );
    signal?.addEventListener("abort", cancel, { once: true });
    waiting.push(go);
  });
}

export interface SearchOptions {
  onProgress?: (p: BoundProgress) => void;
  signal?: AbortSignal;
  timeoutMs?: number;
}

/**
 * Runs one base-bound query in its own worker thread so the event loop keeps serving requests.
 * When every worker is busy the query waits in a short queue (up to QUEUE_WAIT_MS), then answers 503.
 */
export async function runBaseBound(query: BaseBoundQuery, opts: SearchOptions = {}): Promise<BaseBoundResponse> {
  if (opts.signal?.aborted) throw new SearchCancelled();
  await takeSlot(opts.signal);
  let worker: Worker;
  try {
    worker = new Worker(WORKER_URL, { workerData: query });
  } catch (e) {
    releaseSlot();
    throw e;
  }
  worker.once("exit", () => {
    releaseSlot();
    boundSearchEvents.emit("exit");
  });
  boundSearchEvents.emit("start");

  return new Promise((resolve, reject) => {
    let settled = false;
    const settle = (outcome: () => void) => {
      if (settled) return;
      settled = true;
      clearTimeout(timer);
      opts.signal?.removeEventListener("abort", onAbort);
      void worker.terminate();
      outcome();
    };
    const onAbort = () => settle(() => reject(new SearchCancelled()));
    const timer = setTimeout(
      () =>
        settle(() =>
          reject(
            new HttpError(
              503,
              "search_timeout",
              `the search took longer than ${(opts.timeoutMs ?? SEARCH_TIMEOUT_MS) / 1000} s`,
            ),
          ),
        ),
      opts.timeoutMs ?? SEARCH_TIMEOUT_MS,
    );
    opts.signal?.addEventListener("abort", onAbort, { once: true });

    worker.on(
      "message",
      (msg: { type: string; progress?: BoundProgress; result?: BaseBoundResponse; message?: string }) => {
        if (msg.type === "progress" && msg.progress) opts.onProgress?.(msg.progress);
        else if (msg.type === "result" && msg.result) settle(() => resolve(msg.result!));
        else if (msg.type === "error") settle(() => reject(new Error(`bound search failed: ${msg.message}`)));
      },
    );
    worker.on("error", (e) => settle(() => reject(e)));
    worker.on("exit", (code) => settle(() => reject(new Error(`bound search worker exited with code ${code}`))));
  });
}
