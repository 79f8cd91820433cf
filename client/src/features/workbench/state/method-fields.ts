import type { MethodId } from "../../../../../shared/schemas/analysis";

/** What the placeholders need to show each default. */
export type FieldContext = { scale: number | null; targetContext: number | null; pairs: number | null };

export type MethodField = {
  key: string;
  label: string;
  kind: "number" | "boolean" | "list";
  /** The engine's default, shown as the placeholder; empty means the field is required. */
  placeholder: (ctx: FieldContext) => string;
  hint?: string;
};

const short = (x: number | null) => (x === null ? "" : String(Number(x.toPrecision(6))));
const factor: MethodField = {
  key: "factor",
  label: "Factor s",
  kind: "number",
  placeholder: (c) => (c.scale === null ? "L′ / L" : short(c.scale)),
  hint: "Default: target ÷ trained length.",
};

/** Plain names for the method picker and the legends. */
export const METHOD_LABELS: Record<MethodId, string> = {
  default: "Plain RoPE (no scaling)",
  linear: "Position interpolation (linear)",
  ntk: "NTK-aware base change",
  dynamic: "Dynamic NTK",
  yarn: "YaRN",
  llama3: "Band-smoothed (Llama 3.1 rule)",
  longrope: "Per-pair factors (LongRoPE)",
  base: "Adjusted base",
};

/** Each method's own inputs (shared/schemas/analysis.ts methodParamsSchema is the authority on ranges). */
export const METHOD_FIELDS: Record<MethodId, MethodField[]> = {
  default: [],
  linear: [factor],
  ntk: [factor],
  dynamic: [
    factor,
    { key: "sequenceLength", label: "Inference length l", kind: "number", placeholder: (c) => short(c.targetContext) || "L′", hint: "The running length the base is computed for; default the target." },
  ],
  yarn: [
    factor,
    { key: "betaFast", label: "β fast", kind: "number", placeholder: () => "32", hint: "Pairs with more rotations than this are kept." },
    { key: "betaSlow", label: "β slow", kind: "number", placeholder: () => "1", hint: "Pairs with fewer are interpolated by s." },
    { key: "truncate", label: "Round the ramp ends", kind: "boolean", placeholder: () => "true" },
    { key: "attentionFactor", label: "Attention factor", kind: "number", placeholder: (c) => (c.scale && c.scale > 1 ? short(0.1 * Math.log(c.scale) + 1) : "1"), hint: "Default 0.1·ln s + 1 (or from mscale)." },
    { key: "mscale", label: "mscale", kind: "number", placeholder: () => "unset" },
    { key: "mscaleAllDim", label: "mscale_all_dim", kind: "number", placeholder: () => "unset" },
  ],
  llama3: [
    factor,
    { key: "lowFreqFactor", label: "Low-frequency factor", kind: "number", placeholder: () => "1" },
    { key: "highFreqFactor", label: "High-frequency factor", kind: "number", placeholder: () => "4" },
  ],
  longrope: [
    { key: "longFactor", label: "Long factors", kind: "list", placeholder: (c) => `${c.pairs ?? "d/2"} numbers, used past the trained length` },
    { key: "shortFactor", label: "Short factors", kind: "list", placeholder: (c) => `${c.pairs ?? "d/2"} numbers, used within it` },
  ],
  base: [{ key: "base", label: "New base b′", kind: "number", placeholder: () => "e.g. 1000000", hint: "Required." }],
};
