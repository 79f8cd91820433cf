import { pendingTarget } from "./stub";

/** Placeholder until the vLLM reader and compiler land (same file, same export name). */
export const vllmTarget = pendingTarget("vllm", "vLLM", "vLLM", "launch-args");
