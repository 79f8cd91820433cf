import { parentPort, workerData } from "node:worker_threads";
import { baseBoundQuerySchema } from "../../../shared/schemas/bounds";
import { computeBaseBound } from "./bounds.compute";

// Entry point of the search worker (spawned by bounds.service.ts). Messages: progress*, then result or error.
const PROGRESS_INTERVAL_MS = 50;

const port = parentPort!;
let lastProgress = -Infinity;
try {
  const query = baseBoundQuerySchema.parse(workerData);
  const result = computeBaseBound(query, (progress) => {
    const now = performance.now();
    if (now - lastProgress < PROGRESS_INTERVAL_MS) return;
    lastProgress = now;
    port.postMessage({ type: "progress", progress });
  });
  port.postMessage({ type: "result", result });
} catch (e) {
  port.postMessage({ type: "error", message: e instanceof Error ? e.message : String(e) });
}
