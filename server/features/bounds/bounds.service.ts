import os from "node:os";
import { Worker } from "node:worker_threads";
import { HttpError } from "../../http/errors";
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

export interface SearchOptions {
  onProgress?: (p: BoundProgress) => void;
  signal?: AbortSignal;
  timeoutMs?: number;
}

/**
 * Runs one base-bound query in its own worker thread so the event loop keeps serving requests.
 * The capacity check throws synchronously, before any response has started.
 */
export function runBaseBound(query: BaseBoundQuery, opts: SearchOptions = {}): Promise<BaseBoundResponse> {
  if (liveWorkers >= MAX_WORKERS) throw new HttpError(503, "busy", "all bound searches are busy; try again shortly");
  if (opts.signal?.aborted) return Promise.reject(new SearchCancelled());
  const worker = new Worker(WORKER_URL, { workerData: query });
  liveWorkers++;
  worker.once("exit", () => liveWorkers--);

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
      () => settle(() => reject(new HttpError(503, "search_timeout", `the search took longer than ${(opts.timeoutMs ?? SEARCH_TIMEOUT_MS) / 1000} s`))),
      opts.timeoutMs ?? SEARCH_TIMEOUT_MS,
    );
    opts.signal?.addEventListener("abort", onAbort, { once: true });

    worker.on("message", (msg: { type: string; progress?: BoundProgress; result?: BaseBoundResponse; message?: string }) => {
      if (msg.type === "progress" && msg.progress) opts.onProgress?.(msg.progress);
      else if (msg.type === "result" && msg.result) settle(() => resolve(msg.result!));
      else if (msg.type === "error") settle(() => reject(new Error(`bound search failed: ${msg.message}`)));
    });
    worker.on("error", (e) => settle(() => reject(e)));
    worker.on("exit", (code) => settle(() => reject(new Error(`bound search worker exited with code ${code}`))));
  });
}
