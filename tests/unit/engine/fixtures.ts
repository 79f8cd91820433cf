import type { MethodId, ParamsOf } from "../../../shared/schemas/analysis";
import type { MethodContext } from "../../../server/engine";

/** A Llama-2-like shape (d = 128, b = 10 000, L = 4096) extended 8×. */
export const CTX: MethodContext = { d: 128, base: 10_000, trainedContext: 4096, targetContext: 32_768 };

/** One sample per method id; the mapped type makes a new method without a sample a type error. */
export const SAMPLE: { [K in MethodId]: ParamsOf<K> } = {
  default: { method: "default" },
  linear: { method: "linear" },
  ntk: { method: "ntk" },
  dynamic: { method: "dynamic" },
  yarn: { method: "yarn" },
  llama3: { method: "llama3" },
  longrope: {
    method: "longrope",
    longFactor: Array.from({ length: 64 }, (_, i) => 1 + (7 * i) / 63),
    shortFactor: Array.from({ length: 64 }, () => 1),
  },
  base: { method: "base", base: 500_000 },
};

export const samplesFor = (d: number): { [K in MethodId]: ParamsOf<K> } => ({
  ...SAMPLE,
  longrope: {
    method: "longrope",
    longFactor: Array.from({ length: d / 2 }, (_, i) => 1 + (7 * i) / Math.max(1, d / 2 - 1)),
    shortFactor: Array.from({ length: d / 2 }, () => 1),
  },
});
