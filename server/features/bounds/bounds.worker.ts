import type { MessagePort } from "node:worker_threads";
import { baseBoundQuerySchema, type BaseBoundResponse } from "../../../shared/schemas/bounds";
import { computeBaseBound } from "./bounds.compute";

// A task of the bound-search pool (bounds.pool.ts). Progress goes out on the task's own port, at most every 50 ms.
const PROGRESS_INTERVAL_MS = 50;

export interface BoundTask {
  query: unknown;
  progress: MessagePort;
}

export default function searchInWorker({ query, progress }: BoundTask): BaseBoundResponse {
  let lastProgress = -Infinity;
  try {
    return computeBaseBound(baseBoundQuerySchema.parse(query), (p) => {
      const now = performance.now();
      if (now - lastProgress < PROGRESS_INTERVAL_MS) return;
      lastProgress = now;
      progress.postMessage(p);
    });
  } finally {
    progress.close();
  }
}
