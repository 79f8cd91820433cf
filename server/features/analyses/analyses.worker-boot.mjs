// Entry of an analysis pool thread. As for the bound-search worker, Node 20 does not apply `--import tsx` to a
// worker's entry module, so this plain-JS file registers tsx inside the thread and re-exports the TypeScript task.
import { register } from "tsx/esm/api";

register();
const task = await import("./analyses.worker.ts");
export default task.default;
