import { describe, expect, it } from "vitest";
import { CONSUMER_RULES, llama3InvFreq } from "../../../../server/engine/targets/consumer-rope";
import { TARGETS } from "../../../../server/engine/targets";
import { LLAMA_LIKE } from "./helpers";

/*
 * The llama3 band rule with low_freq_factor == high_freq_factor. The blend weight
 * σ = (L/λ − low)/(high − low) divides by zero there. What each consumer does, read in its source:
 * - huggingface/transformers src/transformers/modeling_rope_utils.py, `_compute_llama3_parameters`, at 0044e3b and at
 *   ef46806 (the 4.4x line): no guard. σ is computed for every pair and the torch.where mask keeps it only for the
 *   "medium" pairs, those with neither λ < L/high nor λ > L/low. With equal factors that is only a pair whose λ is
 *   exactly L/low; for it σ = 0/0 (or ±x/0) and θ′ = NaN. Every other pair is kept or divided by the factor.
 *   The validator (`_validate_llama3_parameters`, same commits) only logs "high_freq_factor field must be greater
 *   than low_freq_factor".
 * - vllm-project/vllm vllm/model_executor/layers/rotary_embedding/llama3_rope.py at 045d757: `smooth = 0` when the two
 *   factors are equal, so that pair gets θ/factor. SGLang's Llama3 class (rope_variant.py 0b1fd02) has the same guard.
 * Check values: the published rule (Meta, Llama 3.1, 2024; docs DOMAIN.md): λ < L/high keeps θ, λ > L/low gives θ/f.
 */
const d = 128;
const base = 500000;
const factor = 8;
// θᵢ = 1 / b^(2i/d), written in the order both consumers compute it (1.0 / base ** (arange(0, d, 2) / d)).
const theta = (i: number) => 1 / Math.pow(base, (2 * i) / d);
const wave = (i: number) => (2 * Math.PI) / theta(i);
// The one formula set with each consumer's rule (server/engine/targets/consumer-rope.ts, CONSUMER_RULES).
const hfLlama3 = (...a: [number, number, number, number, number, number]) =>
  llama3InvFreq(...a, CONSUMER_RULES.transformers.llama3EqualFactors);
const engineLlama3 = (...a: [number, number, number, number, number, number]) =>
  llama3InvFreq(...a, CONSUMER_RULES.vllm.llama3EqualFactors);

describe("llama3 with equal low and high factors", () => {
  it("on an integer original length no pair sits on the edge: both copies give the published two-band rule", () => {
    // L = 8192, low = high = 4: one edge at 2048 tokens; no pair's wavelength is exactly 2048 in float64.
    const hf = hfLlama3(d, base, factor, 4, 4, 8192);
    const engines = engineLlama3(d, base, factor, 4, 4, 8192);
    for (let i = 0; i < d / 2; i++) {
      const expected = wave(i) < 2048 ? theta(i) : theta(i) / factor;
      expect(hf[i], `pair ${i}`).toBe(expected);
      expect(engines[i], `pair ${i}`).toBe(expected);
    }
  });

  it("a pair exactly on the edge: transformers' unguarded blend gives NaN, vLLM's guard gives θ/factor", () => {
    // L = 2·λ₄₀ with low = high = 2 puts L/low exactly on pair 40's wavelength (halving is exact in binary).
    const edge = 40;
    const L = 2 * wave(edge);
    expect(L / 2).toBe(wave(edge));
    const hf = hfLlama3(d, base, factor, 2, 2, L);
    const engines = engineLlama3(d, base, factor, 2, 2, L);
    expect(hf[edge]).toBeNaN();
    expect(engines[edge]).toBe(theta(edge) / factor);
    for (let i = 0; i < d / 2; i++) {
      if (i === edge) continue;
      expect(hf[i], `pair ${i}`).toBe(engines[i]);
      expect(engines[i], `pair ${i}`).toBe(i < edge ? theta(i) : theta(i) / factor);
    }
  });

  it("the 4.x readers pass the warning on: equal factors are not refused, only logged", () => {
    const text =
      '{"max_position_embeddings": 32768, "rope_scaling": {"rope_type": "llama3", "factor": 4.0,' +
      ' "low_freq_factor": 2.0, "high_freq_factor": 2.0, "original_max_position_embeddings": 8192}}';
    for (const id of ["transformers-v4-early", "transformers-v4"] as const) {
      const r = TARGETS[id].read(LLAMA_LIKE, { kind: "config-merge-patch", content: {}, text }, 32768);
      expect(r.warnings, id).toContain("rope_scaling's high_freq_factor field must be greater than low_freq_factor");
      expect(r.invFreq.every(Number.isFinite), id).toBe(true);
    }
  });
});
