// Entry of the bound-search worker thread. On Node 20, hooks passed as execArgv ["--import", "tsx"] are not applied
// to a worker's entry module, so this plain-JS file registers tsx inside the thread and then loads the TypeScript worker.
import { register } from "tsx/esm/api";

register();
await import("./bounds.worker.ts");
