import { z } from "zod";
import { dynamicFactorField } from "./dynamic-factor";
import { defineMethod, type ParamField } from "./entry";
import { baseSchema, factorListSchema, factorSchema, lengthSchema, ordered, positive, yarnMscale } from "./params";

/**
 * The catalog of rotary scaling methods, one entry per method, keyed by our method id. The engine, the config
 * import and export, and both client forms read it; see DEVELOPERS.md "Add a scaling method".
 *
 * rope types and config keys follow huggingface/transformers, src/transformers/modeling_rope_utils.py,
 * ROPE_VALIDATION_FUNCTIONS and its `_validate_<type>_parameters` key sets (read at commit 0044e3b, v4.45 line).
 * Keys that line does not list yet are from memory of later versions and of published configs: yarn's mscale,
 * mscale_all_dim and truncate; longrope's long_mscale / short_mscale and its older rope_type "su".
 */

const factor: ParamField<"factor"> = {
  key: "factor",
  label: "Factor s",
  kind: "number",
  hint: "How far the trained length is stretched.",
  fallback: (c) => c.scale,
  fallbackText: "target ÷ trained length",
};

export const YARN_DEFAULTS = { betaFast: 32, betaSlow: 1, truncate: true } as const;
export const LLAMA3_DEFAULTS = { lowFreqFactor: 1, highFreqFactor: 4 } as const;

const RAW_CATALOG = {
  default: defineMethod({
    id: "default",
    label: "No rescaling (plain RoPE)",
    short: "No rescaling",
    summary: "The trained frequencies as they are; past the trained length they simply extrapolate.",
    explanation: {
      text: "`θᵢ = b^(−2i/d)`, attention factor 1: no scaling at all, the baseline.",
      source: "RoFormer, Su et al. 2021",
    },
    schema: z.strictObject({ method: z.literal("default") }),
    extends: false,
    defaults: {},
    fields: [],
    exportType: null,
    ropeTypes: ["default"],
    configKeys: [],
    example: () => ({ method: "default" as const }),
  }),
  linear: defineMethod({
    id: "linear",
    label: "Position interpolation (every pair divided)",
    short: "Position interpolation",
    summary: "Every pair slowed by the factor.",
    explanation: {
      text: "Every pair is divided by the factor: `θ′ᵢ = θᵢ/s`, attention factor 1. Positions are squeezed into the trained range.",
      source: "Position Interpolation, Chen et al. 2023",
    },
    schema: z.strictObject({ method: z.literal("linear"), factor: factorSchema }),
    extends: true,
    defaults: {},
    fields: [factor],
    exportType: "linear",
    ropeTypes: ["linear"],
    configKeys: [],
    example: () => ({ method: "linear" as const }),
  }),
  ntk: defineMethod({
    id: "ntk",
    label: "NTK-aware base change",
    short: "NTK-aware base",
    summary: "A larger base: slow pairs stretch most.",
    explanation: {
      text: "A new base `b′ = b·s^(d/(d−2))`, then plain RoPE with it. Fast pairs barely change; the slowest pair ends up divided by exactly `s`.",
      source: "As defined in YaRN, Peng et al. 2023, §3.1, Eq. 16",
    },
    schema: z.strictObject({ method: z.literal("ntk"), factor: factorSchema }),
    extends: true,
    defaults: {},
    fields: [factor],
    // The convention has no static NTK-aware rope_type: the export is a new rope_theta.
    exportType: null,
    ropeTypes: [],
    configKeys: [],
    example: () => ({ method: "ntk" as const }),
  }),
  dynamic: defineMethod({
    id: "dynamic",
    label: "Dynamic base change (at inference length)",
    short: "Dynamic base",
    summary: "The base grows with the sequence at inference.",
    explanation: {
      text: "The base grows with the running length `l`: `l* = max(l, L)`, `b′ = b·(f·l*/L − (f − 1))^(d/(d−2))`. Keys already in a cache were turned with an older base.",
      source: "YaRN, Peng et al. 2023, §3.3, in the form open model libraries run",
    },
    schema: z.strictObject({
      method: z.literal("dynamic"),
      factor: factorSchema,
      sequenceLength: lengthSchema.optional(),
    }),
    extends: true,
    defaults: {},
    fields: [
      dynamicFactorField(factor),
      {
        key: "sequenceLength",
        label: "Inference length l (tokens)",
        kind: "integer",
        hint: "The running length the base is computed for.",
        fallback: (c) => c.targetContext,
        fallbackText: "the target length",
      },
    ],
    exportType: "dynamic",
    ropeTypes: ["dynamic"],
    configKeys: [],
    example: () => ({ method: "dynamic" as const }),
  }),
  yarn: defineMethod({
    id: "yarn",
    label: "YaRN (ramped per pair, with attention factor)",
    short: "YaRN",
    summary: "Keeps fast pairs, interpolates slow ones, ramps between.",
    explanation: {
      text: "Pairs with more than `β_fast` turns in the window are kept, pairs with fewer than `β_slow` are divided by `s`, and a ramp in the pair index blends between (the form implementations run, linear in the index rather than in `r` as the paper writes it). The attention factor is `0.1·ln s + 1` unless set.",
      source: "YaRN, Peng et al. 2023, Eqs. 17-22",
    },
    schema: z
      .strictObject({
        method: z.literal("yarn"),
        factor: factorSchema,
        betaFast: positive.optional(),
        betaSlow: positive.optional(),
        truncate: z.boolean().optional(),
        attentionFactor: positive.optional(),
        // 0 is accepted because configs carry it; like the loaders, the engine treats 0 as "not set".
        mscale: z.number().min(0).max(1e6).optional(),
        mscaleAllDim: z.number().min(0).max(1e6).optional(),
      })
      .superRefine(ordered("betaFast", "betaSlow", YARN_DEFAULTS.betaFast, YARN_DEFAULTS.betaSlow)),
    extends: true,
    defaults: YARN_DEFAULTS,
    fields: [
      factor,
      {
        key: "betaFast",
        label: "β fast (rotations)",
        kind: "number",
        hint: "Pairs with more rotations in the trained window are kept.",
        fallback: () => YARN_DEFAULTS.betaFast,
      },
      {
        key: "betaSlow",
        label: "β slow (rotations)",
        kind: "number",
        hint: "Pairs with fewer are divided by s.",
        fallback: () => YARN_DEFAULTS.betaSlow,
      },
      {
        key: "truncate",
        label: "Round the ramp ends to whole pairs",
        kind: "boolean",
        fallback: () => YARN_DEFAULTS.truncate,
      },
      {
        key: "attentionFactor",
        label: "Attention factor",
        kind: "number",
        hint: "Overrides the formula and mscale.",
        fallback: (c) => (c.scale === null ? null : yarnMscale(c.scale)),
        fallbackText: "0.1·ln s + 1, or from mscale",
      },
      {
        key: "mscale",
        label: "mscale",
        kind: "number",
        hint: "Counts only together with mscale_all_dim.",
        fallbackText: "not set",
      },
      { key: "mscaleAllDim", label: "mscale_all_dim", kind: "number", fallbackText: "not set" },
    ],
    exportType: "yarn",
    ropeTypes: ["yarn"],
    configKeys: ["attention_factor", "beta_fast", "beta_slow", "mscale", "mscale_all_dim", "truncate"],
    example: () => ({ method: "yarn" as const }),
  }),
  llama3: defineMethod({
    id: "llama3",
    label: "Band-smoothed (llama3 rule)",
    short: "Band-smoothed",
    summary: "Fast pairs kept, slow pairs divided, a smooth band between.",
    explanation: {
      text: "With `λ_low = L/lowFreqFactor` and `λ_high = L/highFreqFactor`: pairs shorter than `λ_high` are kept, pairs longer than `λ_low` are divided by `f`, and in between `θ′ = (1−σ)·θ/f + σ·θ` with `σ = (L/λ − low)/(high − low)`.",
      source: "The rule published with the Llama 3.1 models, Meta 2024",
    },
    schema: z
      .strictObject({
        method: z.literal("llama3"),
        factor: factorSchema,
        lowFreqFactor: positive.optional(),
        highFreqFactor: positive.optional(),
      })
      .superRefine(
        ordered("highFreqFactor", "lowFreqFactor", LLAMA3_DEFAULTS.highFreqFactor, LLAMA3_DEFAULTS.lowFreqFactor),
      ),
    extends: true,
    defaults: LLAMA3_DEFAULTS,
    fields: [
      factor,
      {
        key: "lowFreqFactor",
        label: "Low-frequency factor",
        kind: "number",
        fallback: () => LLAMA3_DEFAULTS.lowFreqFactor,
      },
      {
        key: "highFreqFactor",
        label: "High-frequency factor",
        kind: "number",
        fallback: () => LLAMA3_DEFAULTS.highFreqFactor,
      },
    ],
    exportType: "llama3",
    ropeTypes: ["llama3"],
    configKeys: ["low_freq_factor", "high_freq_factor"],
    example: () => ({ method: "llama3" as const }),
  }),
  longrope: defineMethod({
    id: "longrope",
    label: "Per-pair factors (LongRoPE)",
    short: "Per-pair factors",
    summary: "One factor per pair, searched offline.",
    explanation: {
      text: "Each pair has its own divisor: `θ′ᵢ = θᵢ/eᵢ`, with the long factors when `L′ > L`, else the short ones; attention factor `√(1 + ln s / ln L)`.",
      source: "LongRoPE, Ding et al. 2024",
    },
    schema: z.strictObject({
      method: z.literal("longrope"),
      longFactor: factorListSchema,
      shortFactor: factorListSchema,
    }),
    extends: false,
    defaults: {},
    fields: [
      {
        key: "longFactor",
        label: "Long factors",
        kind: "list",
        required: true,
        hint: "One number per pair (rotary dimension ÷ 2), used past the trained length.",
      },
      {
        key: "shortFactor",
        label: "Short factors",
        kind: "list",
        required: true,
        hint: "The same count, used within the trained length.",
      },
    ],
    exportType: "longrope",
    ropeTypes: ["longrope", "su"],
    configKeys: ["attention_factor", "long_factor", "short_factor", "long_mscale", "short_mscale"],
    // Long factors rising from 1 to 8 across the pairs, short factors all 1 (an illustration, no source).
    example: (pairs: number) => ({
      method: "longrope" as const,
      longFactor: Array.from({ length: pairs }, (_, i) => 1 + (7 * i) / Math.max(1, pairs - 1)),
      shortFactor: Array.from({ length: pairs }, () => 1),
    }),
  }),
  base: defineMethod({
    id: "base",
    label: "Adjusted base (new rope_theta)",
    short: "Adjusted base",
    summary: "Default rotation with a new base.",
    explanation: {
      text: "Plain RoPE with a new base `b′` chosen by hand (for example 10 000 → 500 000).",
      source: "Xiong et al. 2023 (adjusted base frequency); Rozière et al. 2023 (base 1 000 000)",
    },
    schema: z.strictObject({ method: z.literal("base"), base: baseSchema }),
    extends: false,
    defaults: {},
    fields: [
      { key: "base", label: "New base b′", kind: "number", required: true, hint: "For example 500000 or 1000000." },
    ],
    exportType: null,
    ropeTypes: [],
    configKeys: [],
    // Xiong et al. 2023 raised 10 000 to 500 000.
    example: () => ({ method: "base" as const, base: 500_000 }),
  }),
};

/** Every entry must sit under its own id: a mismatch makes that property `never` and this assignment fail. */
type KeyedById<C> = { [K in keyof C]: C[K] extends { id: K } ? C[K] : never };
export const METHOD_CATALOG: KeyedById<typeof RAW_CATALOG> = RAW_CATALOG;
