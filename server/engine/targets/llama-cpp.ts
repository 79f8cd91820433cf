import { pendingTarget } from "./stub";

/** Placeholder until the llama.cpp reader and compiler land (same file, same export name). */
export const llamaCppTarget = pendingTarget("llama-cpp", "llama.cpp", "llama.cpp", "launch-args");
