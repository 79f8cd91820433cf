import type { MethodId } from "../../../../../shared/schemas/analysis";

export type ParamKind = "number" | "integer" | "list" | "boolean";
export type ParamField = { key: string; label: string; kind: ParamKind; hint?: string; required?: boolean };
/** `label` for the method picker, `short` for tables. */
export type MethodEntry = { id: MethodId; label: string; short: string; summary: string; params: ParamField[] };

const factor: ParamField = { key: "factor", label: "Factor", kind: "number", hint: "Left empty: target context ÷ trained context" };

/**
 * Our names for the rescaling methods and the parameters each one takes, in the order the form shows them.
 * Parameter keys are those of the shared method schema (methodParamsSchema); defaults are the engine's.
 */
export const METHOD_TABLE: MethodEntry[] = [
  { id: "yarn", short: "YaRN", label: "YaRN (ramped per pair, with attention factor)", summary: "Keeps fast pairs, interpolates slow ones, ramps between.", params: [
    factor,
    { key: "betaFast", label: "Ramp start β fast (rotations)", kind: "number", hint: "Default 32" },
    { key: "betaSlow", label: "Ramp end β slow (rotations)", kind: "number", hint: "Default 1" },
    { key: "truncate", label: "Round the ramp ends to whole pairs", kind: "boolean", hint: "Default yes" },
    { key: "attentionFactor", label: "Attention factor (overrides the formula)", kind: "number" },
    { key: "mscale", label: "mscale", kind: "number" },
    { key: "mscaleAllDim", label: "mscale_all_dim", kind: "number" },
  ] },
  { id: "linear", short: "Position interpolation", label: "Position interpolation (every pair divided)", summary: "Every pair slowed by the factor.", params: [factor] },
  { id: "ntk", short: "NTK-aware base", label: "NTK-aware base change", summary: "A larger base: slow pairs stretch most.", params: [factor] },
  { id: "dynamic", short: "Dynamic base", label: "Dynamic base change (at inference length)", summary: "The base grows with the sequence at inference.", params: [
    factor,
    { key: "sequenceLength", label: "Inference length (tokens)", kind: "integer", hint: "Left empty: the target context" },
  ] },
  { id: "llama3", short: "Band-smoothed", label: "Band-smoothed (llama3 rule)", summary: "Fast pairs kept, slow pairs divided, a smooth band between.", params: [
    factor,
    { key: "lowFreqFactor", label: "Low-frequency factor", kind: "number", hint: "Default 1" },
    { key: "highFreqFactor", label: "High-frequency factor", kind: "number", hint: "Default 4" },
  ] },
  { id: "longrope", short: "Per-pair factors", label: "Per-pair factors (LongRoPE)", summary: "One factor per pair, searched offline.", params: [
    { key: "longFactor", label: "Long factors", kind: "list", required: true, hint: "One number per pair (rotary dimension ÷ 2), comma-separated" },
    { key: "shortFactor", label: "Short factors", kind: "list", required: true, hint: "Used below the trained context; same count" },
  ] },
  { id: "base", short: "Adjusted base", label: "Adjusted base (new rope_theta)", summary: "Default rotation with a new base.", params: [
    { key: "base", label: "New base", kind: "number", required: true, hint: "For example 500000 or 1000000" },
  ] },
  { id: "default", short: "No rescaling", label: "No rescaling", summary: "The trained frequencies as they are.", params: [] },
];

export const methodEntry = (id: string): MethodEntry | undefined => METHOD_TABLE.find((m) => m.id === id);
export const methodLabel = (id: string) => methodEntry(id)?.label ?? id;
export const methodShort = (id: string) => methodEntry(id)?.short ?? id;

/** "factor 8, betaFast 32" from a method's parameters, or "engine defaults". */
export function describeParams(method: { method: string } & Record<string, unknown>): string {
  const entry = methodEntry(method.method);
  const parts = Object.entries(method)
    .filter(([k, v]) => k !== "method" && v !== undefined)
    .map(([k, v]) => {
      const label = entry?.params.find((p) => p.key === k)?.label ?? k;
      if (Array.isArray(v)) return `${label}: ${v.length} values`;
      return `${label} ${typeof v === "boolean" ? (v ? "yes" : "no") : String(v)}`;
    });
  return parts.length ? parts.join(", ") : "engine defaults";
}
