import os from "node:os";
import { Piscina } from "piscina";
import { Unavailable } from "../../platform/errors";
import { workerEntry } from "../../platform/worker-entry";
import type { AnalysisResponse, ResolvedAnalysisRequest } from "../../../shared/schemas/analysis";

/** Thrown when the caller aborted (its client went away) before the pool thread finished. */
export class AnalysisCancelled extends Error {
  constructor() {
    super("analysis cancelled");
  }
}

// A small pool of long-lived threads: starting one costs far more than a large analysis, so they are kept
// for a while after the last task. Tasks beyond the threads wait in a bounded queue.
const MAX_QUEUE = 64;
let pool: Piscina | undefined;
const getPool = () =>
  (pool ??= new Piscina({
    filename: workerEntry(import.meta.url, "analyses.worker"),
    minThreads: 0,
    maxThreads: Math.max(1, Math.min(4, os.availableParallelism() - 1)),
    idleTimeout: 60_000,
    maxQueue: MAX_QUEUE,
  }));

let offloaded = 0;
/** How many analyses the pool has been given (tests use it to see that large ones leave the event loop). */
export const offloadedAnalyses = () => offloaded;

/** Computes one analysis in a pool thread; the request thread keeps serving others meanwhile. */
export async function analyseOffThread(
  request: ResolvedAnalysisRequest,
  signal?: AbortSignal,
): Promise<AnalysisResponse> {
  const p = getPool();
  if (p.queueSize >= MAX_QUEUE) throw new Unavailable("busy", "the analysis workers are busy; try again shortly");
  offloaded++;
  try {
    return (await p.run(request, { signal })) as AnalysisResponse;
  } catch (e) {
    if (signal?.aborted) throw new AnalysisCancelled();
    throw e;
  }
}
