import type { CompileInput, CompileResult, TargetArtifact } from "../types";
import { writeJsonText } from "../json-text";
import { CONFIG_FLOAT_KEYS, floatKeyTest } from "../float-keys";
import { type Obj } from "./config-view";
import { isObj } from "../../../../shared/json-values";
import type { GroupRotary } from "../../group-rotary";
import { MROPE_KEYS, sectionKeysOf } from "../../../../shared/mrope-axes";

/** Which rule set a config patch is written for (the matching readers are read-v4.ts and read-v5.ts). */
export type HfRules = "early" | "v4" | "v5";

/** Keys of an old block that the new one does not set become null in the patch (RFC 7396: remove). */
function clearStale(existing: unknown, block: Obj, keep: string[] = []): Obj {
  const out: Obj = {};
  if (isObj(existing)) for (const k of Object.keys(existing)) if (!(k in block) && !keep.includes(k)) out[k] = null;
  return { ...out, ...block };
}

/*
 * Multimodal section keys (shared/mrope-axes.ts) are the model's, not the plan's: its attention layers read them on
 * every forward pass (huggingface/transformers src/transformers/models/qwen2_vl/modeling_qwen2_vl.py at 00b676f8,
 * Qwen2VLAttention.forward passes `self.rope_scaling["mrope_section"]` to apply_multimodal_rotary_pos_emb), so every
 * patch keeps them.
 */

interface Placed {
  /** the scaling keys (rope_type first), or null for plain RoPE */
  block: Obj | null;
  base: number;
  maxPos: number;
  /** top-level original_max_position_embeddings to write (longrope on configs that carry one) */
  topOriginal?: number;
  unsupported?: { cause: string; workaround: string };
}

/** Where each method's numbers go for one rule set: the heart of "put the original length where that version reads it". */
function place(input: CompileInput, rules: HfRules): Placed {
  const { plan, config } = input;
  const L = plan.trainedContext;
  const target = plan.targetContext;
  // The engine ran the method once for this export (PlanRotary): its filled params, effective base, attention factor.
  const p = plan.params as Record<string, unknown>;
  const ratio = target / L;
  const hasTopOriginal = typeof config.original_max_position_embeddings === "number";
  switch (plan.params.method) {
    case "default":
      return { block: null, base: plan.base, maxPos: target };
    case "base":
    case "ntk":
      return { block: null, base: plan.effectiveBase!, maxPos: target };
    case "linear":
      return { block: { rope_type: "linear", factor: p.factor }, base: plan.base, maxPos: target };
    case "dynamic":
      // Every line uses max_position_embeddings as the L of the dynamic formula, so it keeps the trained length.
      return { block: { rope_type: "dynamic", factor: p.factor }, base: plan.base, maxPos: L };
    case "llama3":
      return {
        block: {
          rope_type: "llama3",
          factor: p.factor,
          low_freq_factor: p.lowFreqFactor,
          high_freq_factor: p.highFreqFactor,
          original_max_position_embeddings: L,
        },
        base: plan.base,
        maxPos: target,
      };
    case "yarn":
      return placeYarn(p, rules, L, target, ratio, plan.base, plan.attentionFactor, "attentionFactor" in input.method);
    case "longrope": {
      const block: Obj = { rope_type: "longrope", long_factor: p.longFactor, short_factor: p.shortFactor };
      if (rules === "v5") {
        return {
          block: { ...block, factor: ratio, original_max_position_embeddings: L },
          base: plan.base,
          maxPos: target,
          topOriginal: hasTopOriginal ? L : undefined,
        };
      }
      // 4.x reads the original length only from the top level; without one it takes max_position_embeddings.
      if (hasTopOriginal) return { block, base: plan.base, maxPos: target, topOriginal: L };
      return { block: { ...block, factor: ratio }, base: plan.base, maxPos: L };
    }
  }
}

function placeYarn(
  p: Record<string, unknown>,
  rules: HfRules,
  L: number,
  target: number,
  ratio: number,
  base: number,
  a: number,
  explicitA: boolean,
): Placed {
  const factor = p.factor as number;
  const block: Obj = { rope_type: "yarn", factor, beta_fast: p.betaFast, beta_slow: p.betaSlow };
  if (rules === "early") {
    // 4.45 reads the ramp length from max_position_embeddings and knows neither truncate nor mscale: the attention
    // factor goes in explicitly and max_position_embeddings holds the trained length.
    const placed: Placed = { block: { ...block, attention_factor: a }, base, maxPos: L };
    if (p.truncate === false) {
      placed.unsupported = {
        cause:
          "the 4.4x rules always round the ramp ends to whole pairs; this plan keeps them fractional (truncate: false)",
        workaround: "export for transformers-v4 (4.55 or later) or transformers-v5, or plan with truncate on",
      };
    }
    return placed;
  }
  if (p.truncate === false) block.truncate = false;
  if (p.mscale !== undefined) block.mscale = p.mscale;
  if (p.mscaleAllDim !== undefined) block.mscale_all_dim = p.mscaleAllDim;
  // An attention factor the plan set by hand is written; one that follows from mscale or g(s) is left to the reader.
  const fromFormula = p.mscale && p.mscaleAllDim ? true : a === (factor <= 1 ? 1 : 0.1 * Math.log(factor) + 1);
  if (explicitA || !fromFormula) block.attention_factor = a;
  // 4.51+ replaces the factor by max_position_embeddings / original when the block names the original length, and
  // v5 warns when the two disagree: a factor other than target/trained keeps max_position_embeddings at the trained
  // length (the ramp then reads it as the original length, and the implicit ratio is 1).
  if (factor === ratio) return { block: { ...block, original_max_position_embeddings: L }, base, maxPos: target };
  return { block: rules === "v5" ? { ...block, original_max_position_embeddings: L } : block, base, maxPos: L };
}

/** The merge patch for the 4.x layout: `rope_scaling` beside a top-level `rope_theta`. */
export function compileV4(input: CompileInput, rules: "early" | "v4"): CompileResult {
  const placed = place(input, rules);
  const existing = input.config.rope_scaling;
  const keep = [...MROPE_KEYS];
  // A plan exported as plain RoPE (or a new base) removes the block, unless it carries multimodal sections: then it
  // stays as a "default" block with its sections.
  const block = placed.block ?? (sectionKeysOf(existing) ? { rope_type: "default" } : null);
  const patch: Obj = {
    rope_theta: placed.base,
    max_position_embeddings: placed.maxPos,
    rope_scaling: block === null ? null : clearStale(existing, block, keep),
  };
  if (placed.topOriginal !== undefined) patch.original_max_position_embeddings = placed.topOriginal;
  return result(patch, placed);
}

const FULL_ATTENTION = "full_attention";

/**
 * What a non-scaled layer type of a flat config was trained with: its own base when the config gives one
 * (`rope_local_base_freq`, used unscaled: huggingface/transformers models/gemma3/modeling_gemma3.py builds the local
 * rotary embedding with rope_type "default", v4.5x line), else the model's one shared rotary setting, scaling included.
 */
function trainedBlock(config: Obj, existing: Obj): Obj {
  const local = typeof config.rope_local_base_freq === "number" ? config.rope_local_base_freq : undefined;
  if (local !== undefined) return { rope_type: "default", rope_theta: local };
  const shared: Obj =
    isObj(config.rope_scaling) && Object.keys(config.rope_scaling).length ? config.rope_scaling : existing;
  const { type, rope_type: ropeType, ...rest } = shared;
  const theta = typeof existing.rope_theta === "number" ? existing.rope_theta : config.rope_theta;
  return { ...rest, rope_type: ropeType ?? type ?? "default", rope_theta: typeof theta === "number" ? theta : 10000 };
}

/** A non-scaled group's own block: its method's run placed over its own base and rotary dimension (v5 rules). */
function groupBlock(input: CompileInput, g: GroupRotary): Obj {
  const { rotaryDim, base, invFreq, attentionFactor, params, effectiveBase } = g;
  const plan = { ...input.plan, rotaryDim, base, invFreq, attentionFactor, params, effectiveBase };
  const placed = place({ ...input, method: g.method, plan }, "v5");
  return { ...(placed.block ?? { rope_type: "default" }), rope_theta: placed.base };
}

/** The merge patch for the v5 layout: everything inside `rope_parameters`, nested by layer type when the config has them. */
export function compileV5(input: CompileInput): CompileResult {
  const placed = place(input, "v5");
  const { config } = input;
  const existing = isObj(config.rope_parameters) ? config.rope_parameters : {};
  // Sections a 4.x-layout config keeps in rope_scaling move into rope_parameters with the block, since the patch
  // removes rope_scaling below (v5 reads them from rope_parameters: from memory of the v5 qwen2_vl config, not re-read).
  // The model's sections from a flat block (rope_parameters, else the 4.x rope_scaling the patch removes).
  const own = sectionKeysOf(existing);
  const sections = own ?? sectionKeysOf(config.rope_scaling);
  const moved = own ? null : sections;
  const block: Obj = { ...(placed.block ?? { rope_type: "default" }), rope_theta: placed.base, ...moved };
  const written = Array.isArray(config.layer_types) ? undefined : derivedLayerTypes(input.plan.groups);
  const layerTypes = [
    ...new Set((Array.isArray(config.layer_types) ? config.layer_types : (written ?? [])).map(String)),
  ];
  // partial_rotary_factor lives inside rope_parameters in v5 and is the model's, not the plan's: it is kept, as are
  // the multimodal sections.
  const keep = ["partial_rotary_factor", ...MROPE_KEYS];
  let rp: Obj;
  if (layerTypes.length) {
    const nested = layerTypes.every((t) => isObj(existing[t]));
    rp = nested ? {} : clearStale(existing, {}, layerTypes);
    // The plan scales the full-attention layers only (issue 11, shared/layer-groups.ts): every other layer type keeps
    // exactly what it was trained with. A nested entry is simply left out of the merge patch (RFC 7396: untouched);
    // a flat config gets the local layers' trained setting written under their type.
    const planned = input.plan.groups;
    const scaled =
      planned?.find((g) => g.scaled)?.kind ?? (layerTypes.includes(FULL_ATTENTION) ? FULL_ATTENTION : layerTypes[0]);
    // Nested, each layer type is read from its own entry only (hf/read-v5.ts), so the sections a flat block held go
    // into every entry the patch writes: the top-level keys are cleared above and a local type's trained block (its
    // own base) would otherwise have none. A nested entry keeps its own sections (`keep`).
    const sectioned = (b: Obj): Obj => (nested ? b : { ...b, ...sections });
    for (const t of layerTypes) {
      // A group the plan gives its own method (groupMethods) gets that method's block over its own base and dimension.
      const own = planned?.find((g) => g.kind === t && !g.scaled && g.method.method !== "default");
      if (t === scaled) rp[t] = clearStale(nested ? existing[t] : {}, sectioned(block), keep);
      else if (own) rp[t] = clearStale(nested ? existing[t] : {}, sectioned(groupBlock(input, own)), keep);
      else if (!nested) rp[t] = sectioned(trainedBlock(config, existing));
    }
  } else {
    rp = clearStale(existing, block, keep);
  }
  const patch: Obj = { rope_parameters: rp, max_position_embeddings: placed.maxPos };
  // A config.json that still has rope_scaling would win over rope_parameters when v5 converts it.
  if ("rope_scaling" in config) patch.rope_scaling = null;
  if (placed.topOriginal !== undefined) patch.original_max_position_embeddings = placed.topOriginal;
  if (written) patch.layer_types = written;
  return result(patch, placed);
}

/**
 * Each layer's kind from the plan's groups, for a layered config that gives no `layer_types` (its layout is, say, a
 * `sliding_window_pattern`). v5 nests rope_parameters only under the config's own `layer_types` keys, so without them
 * it reads one flat block for every layer; the patch writes the list out. An explicit `layer_types` wins over the
 * pattern in the model configs that still accept one (huggingface/transformers, models/gemma3/configuration_gemma3.py,
 * Gemma3TextConfig.__init__ derives layer_types only when it is None; from memory, not re-read). Undefined unless every
 * layer belongs to a rotating group.
 */
function derivedLayerTypes(groups: readonly { kind: string; layers: number[] }[] | undefined): string[] | undefined {
  if (!groups || groups.length < 2) return undefined;
  const kinds: (string | undefined)[] = [];
  for (const g of groups) for (const l of g.layers) kinds[l] = g.kind;
  const dense = Array.from(kinds);
  return dense.every((k): k is string => typeof k === "string") ? dense : undefined;
}

function result(patch: Obj, placed: Placed): CompileResult {
  const artifact: TargetArtifact = {
    kind: "config-merge-patch",
    content: patch,
    text: writeJsonText(patch, floatKeyTest(CONFIG_FLOAT_KEYS)),
  };
  return placed.unsupported ? { ok: false, ...placed.unsupported, artifact } : { ok: true, artifact };
}
