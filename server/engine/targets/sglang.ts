import { pendingTarget } from "./stub";

/** Placeholder until the SGLang reader and compiler land (same file, same export name). */
export const sglangTarget = pendingTarget("sglang", "SGLang", "SGLang", "launch-args");
