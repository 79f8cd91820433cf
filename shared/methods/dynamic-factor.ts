import type { FieldContext, ParamField } from "./entry";

/**
 * How many times dynamic scaling multiplies the base at running length l (trained length L, rotary dimension d):
 * (1 + f·(max(l, L)/L − 1))^(d/(d−2)), the loaders' `f·l/L − (f − 1)` written so that it is exactly 1 at l = L.
 * Source: huggingface/transformers, src/transformers/modeling_rope_utils.py, `_compute_dynamic_ntk_parameters`
 * (credited there to /u/bloc97 and /u/emozilla, r/LocalLLaMA, June 2023). The engine's dynamic method uses this.
 */
export function dynamicBaseGrowth(factor: number, d: number, length: number, trained: number): number {
  const l = Math.max(length, trained);
  return Math.pow(1 + factor * (l / trained - 1), d / (d - 2));
}

const times = (x: number) => `×${Number(x.toPrecision(3)).toLocaleString("en-GB")}`;

/**
 * Why the factor defaults to L′/L, and what that does, shown beside the field. We keep L′/L (and say so) rather
 * than change the engine's default under stored plans: it is how loaders read `factor` (the rope_scaling docstring
 * of transformers' model configs, e.g. LlamaConfig: "a `factor` of x will enable the model to handle sequences of
 * length x * original maximum pre-trained length"), and published dynamic configs write it that way (an 8k model
 * served at 32k with factor 4, dreamgen/opus-v1.2-llama-3-8b config.json). But at l = L′ it grows the base by
 * about s² − s + 1, far past the NTK-aware base for the same s. f = 1 is dynamic NTK as YaRN (Peng et al. 2023,
 * §3.3) states it, s = max(1, l/L) fed to the NTK-aware base b·s^(d/(d−2)) (the §3.3 wording is from memory; the
 * identity with our NTK-aware method is checked in tests/unit/engine/dynamic-default.test.ts).
 */
export function dynamicFactorNote(c: FieldContext): string {
  const general =
    "Left empty, f = L′/L, as loaders read the factor (x serves x times the trained length); at l = L′ that grows the base about s² − s + 1 times. f = 1 is dynamic NTK as Peng et al. 2023 §3.3 state it: the NTK-aware base for s = l/L, a much smaller growth.";
  if (c.scale === null || c.pairs === null || c.targetContext === null || c.scale <= 1) return general;
  const d = 2 * c.pairs;
  const trained = c.targetContext / c.scale;
  const atDefault = dynamicBaseGrowth(c.scale, d, c.targetContext, trained);
  const atOne = dynamicBaseGrowth(1, d, c.targetContext, trained);
  return `Left empty, f = L′/L = ${Number(c.scale.toPrecision(4))}, as loaders read the factor (x serves x times the trained length): at l = L′ the base grows ${times(atDefault)}. f = 1 is dynamic NTK as Peng et al. 2023 §3.3 state it, the NTK-aware base for s = l/L: ${times(atOne)} at L′.`;
}

/** The factor field of the dynamic method: the shared factor field, with its default explained. */
export const dynamicFactorField = (factor: ParamField<"factor">): ParamField<"factor"> => ({
  ...factor,
  hint: "How fast the base grows past the trained length.",
  note: dynamicFactorNote,
});
