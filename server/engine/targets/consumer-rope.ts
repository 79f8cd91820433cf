/**
 * The rotary formulas of the stacks Ropewalk exports to (transformers, vLLM, SGLang), one set for every reader,
 * written from each consumer's source in our own words. Kept apart from server/engine/methods on purpose: a reader
 * that called the engine's own formulas could only ever agree with it.
 *
 * Where the consumers' code differs, the difference is a parameter. A difference that is fixed by the consumer's code
 * is in CONSUMER_RULES, with the repository, file and commit it was read at; one that comes from the artifact (YaRN's
 * truncate and extrapolation factor, the running length, which length a magnitude is computed from) is passed by the
 * reader that knows it. Float64 throughout; the consumers compute θ in float32, which the 1e-6 "equivalent"
 * tolerance allows for. Sources: docs/export-targets.md and docs/export-targets-engines.md.
 */

/** What a consumer's own code fixes about the shared formulas. */
export interface ConsumerRopeRules {
  /**
   * llama3 with low_freq_factor == high_freq_factor, where the blend weight σ = (L/λ − low)/(high − low) divides by
   * zero: "unguarded" computes it anyway (NaN on a pair whose wavelength is exactly L/low; no other pair uses σ),
   * "zero-weight" takes σ = 0 (that pair gets θ/factor).
   */
  llama3EqualFactors: "unguarded" | "zero-weight";
  /**
   * LongRoPE factor lists whose length is not d/2: refused ("throw"), or read as given ("unchecked": NaN past the end).
   * Neither consumer runs such a list (torch cannot multiply it into d/2 frequencies); the rule says what our reader
   * reports: the transformers readers carry the validator's length warning, the engine readers refuse.
   */
  longropeLength: "throw" | "unchecked";
}

export const CONSUMER_RULES = {
  /**
   * huggingface/transformers src/transformers/modeling_rope_utils.py at 0044e3b and ef46806 (4.4x line):
   * `_compute_llama3_parameters` has no guard; `_compute_longrope_parameters` multiplies the list in as given (its
   * validator only warns about the length, which the readers report; torch would then fail to broadcast, not modelled).
   */
  transformers: { llama3EqualFactors: "unguarded", longropeLength: "unchecked" },
  /**
   * vllm-project/vllm vllm/model_executor/layers/rotary_embedding/llama3_rope.py at 045d757: `smooth = 0` when the two
   * factors are equal.
   */
  vllm: { llama3EqualFactors: "zero-weight", longropeLength: "throw" },
  /** sgl-project/sglang python/sglang/srt/layers/rotary_embedding/rope_variant.py at 0b1fd02: as vLLM (its lineage). */
  sglang: { llama3EqualFactors: "zero-weight", longropeLength: "throw" },
} as const satisfies Record<string, ConsumerRopeRules>;

/**
 * θ_i = 1 / base^(2i/d) for i < ⌈d/2⌉ (`torch.arange(0, d, 2)`): transformers `_compute_default_rope_parameters`
 * (0044e3b); vLLM `RotaryEmbedding._compute_inv_freq`, rotary_embedding/base.py (072d10a). Every plan has an even d.
 */
export const plainInvFreq = (d: number, base: number) =>
  Array.from({ length: Math.floor((d + 1) / 2) }, (_, i) => 1 / Math.pow(base, (2 * i) / d));

/**
 * NTK-aware dynamic base b·(stretch − (f − 1))^(d/(d−2)), where stretch = f·l/L for running length l and trained
 * length L. The consumers differ in l only: transformers recomputes at the running length (`dynamicInvFreq`), vLLM and
 * SGLang build the cache once for l = f·L (`staticDynamicBase`).
 */
const dynamicBase = (base: number, factor: number, stretch: number, d: number) =>
  base * Math.pow(stretch - (factor - 1), d / (d - 2));

/** transformers `_compute_dynamic_ntk_parameters`: L = max_position_embeddings, l = max(seq_len, L). */
export function dynamicInvFreq(d: number, base: number, factor: number, maxPos: number, seqLen: number) {
  const l = seqLen > maxPos ? seqLen : maxPos;
  return { invFreq: plainInvFreq(d, dynamicBase(base, factor, (factor * l) / maxPos, d)), seqLen: l };
}

/**
 * The engines' dynamic base, fixed while serving: max_len = max_position × f, so stretch = f² and the base is
 * b·(f² − f + 1)^(d/(d−2)). vLLM dynamic_ntk_scaling_rope.py (50feac9); SGLang rotary_embedding/_base.py (01e3ddd).
 */
export const staticDynamicBase = (base: number, factor: number, d: number) =>
  dynamicBase(base, factor, factor * factor, d);

/**
 * YaRN's magnitude g(s, m) = 0.1·m·ln s + 1, and 1 for s ≤ 1 when `guard` is on: transformers `get_mscale` (the 4.4x
 * line has no guard: its yarn takes 0.1·ln(factor) + 1 directly, 0044e3b/ef46806), vLLM `yarn_get_mscale` (common.py
 * 002d181), SGLang yarn.py (8448045).
 */
export const yarnMscale = (scale: number, m = 1, guard = true) =>
  guard && scale <= 1 ? 1 : 0.1 * m * Math.log(scale) + 1;

export interface YarnInputs {
  d: number;
  base: number;
  factor: number;
  /** the length the ramp is built from (find_correction_range's length argument) */
  original: number;
  betaFast: number;
  betaSlow: number;
  /** floor/ceil the ramp ends: always in transformers 4.4x; the block's `truncate` (default true) elsewhere */
  truncate: boolean;
  /** SGLang's `extrapolation_factor` scaling the kept share (yarn.py 8448045); transformers and vLLM have none (1) */
  extrapolationFactor?: number;
}

/**
 * YaRN's frequencies as every consumer builds them: ramp ends at the correction dims for β_fast and β_slow
 * (d·ln(L/(2πβ)) / (2·ln b)), rounded when `truncate`, clamped to [0, d−1], widened by 0.001 when equal;
 * keep_j = (1 − clamp((j − low)/(high − low), 0, 1))·e; θ′ = θ/s·(1 − keep) + θ·keep. transformers
 * `_compute_yarn_parameters`; vLLM yarn_scaling_rope.py (0cd5784); SGLang yarn.py (8448045).
 */
export function yarnInvFreq(p: YarnInputs): number[] {
  const dimFor = (rotations: number) =>
    (p.d * Math.log(p.original / (rotations * 2 * Math.PI))) / (2 * Math.log(p.base));
  let low = dimFor(p.betaFast);
  let high = dimFor(p.betaSlow);
  if (p.truncate) [low, high] = [Math.floor(low), Math.ceil(high)];
  low = Math.max(low, 0);
  high = Math.min(high, p.d - 1);
  if (low === high) high += 0.001;
  const e = p.extrapolationFactor ?? 1;
  return plainInvFreq(p.d, p.base).map((theta, j) => {
    const ramp = Math.min(Math.max((j - low) / (high - low), 0), 1);
    const keep = (1 - ramp) * e;
    return (theta / p.factor) * (1 - keep) + theta * keep;
  });
}

/**
 * The llama3 band rule: wavelengths under original/high keep θ, over original/low get θ/factor, a σ-blend between.
 * transformers `_compute_llama3_parameters`; vLLM llama3_rope.py (045d757); SGLang rope_variant.py (0b1fd02).
 * The consumers differ only when low == high (`equalFactors`, see CONSUMER_RULES).
 */
export function llama3InvFreq(
  d: number,
  base: number,
  factor: number,
  low: number,
  high: number,
  original: number,
  equalFactors: ConsumerRopeRules["llama3EqualFactors"],
) {
  const lowWave = original / low;
  const highWave = original / high;
  return plainInvFreq(d, base).map((theta) => {
    const wave = (2 * Math.PI) / theta;
    if (wave < highWave) return theta;
    if (wave > lowWave) return theta / factor;
    const smooth = equalFactors === "zero-weight" && low === high ? 0 : (original / wave - low) / (high - low);
    return ((1 - smooth) * theta) / factor + smooth * theta;
  });
}

/**
 * LongRoPE: θ′_i = θ_i / e_i; magnitude √(1 + ln s / ln original) when s > 1, else 1, unless given. The consumers
 * differ in s (transformers: the factor, or max_position_embeddings / the top-level original; vLLM and SGLang:
 * max_position_embeddings / original), which the caller passes, and in the length check (CONSUMER_RULES).
 * transformers `_compute_longrope_parameters`; vLLM phi3_long_rope_scaled_rope.py (17d618b); SGLang rope_variant.py.
 */
export function longropeReading(
  d: number,
  base: number,
  factors: number[],
  scale: number,
  original: number,
  attention: number | undefined,
  length: ConsumerRopeRules["longropeLength"],
) {
  if (length === "throw" && factors.length !== d / 2)
    throw new Error(`LongRoPE needs ${d / 2} factors, the block has ${factors.length}`);
  const attentionFactor = attention ?? (scale <= 1 ? 1 : Math.sqrt(1 + Math.log(scale) / Math.log(original)));
  return { invFreq: plainInvFreq(d, base).map((t, i) => t / factors[i]), attentionFactor };
}
