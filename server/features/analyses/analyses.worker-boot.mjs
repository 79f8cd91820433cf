// Entry of an analysis pool thread when running from source (see server/platform/worker-entry.ts): Node 20 does not
// apply `--import tsx` to a worker's entry module, so this plain-JS file registers tsx and re-exports the task.
import { register } from "tsx/esm/api";

register();
const task = await import("./analyses.worker.ts");
export default task.default;
