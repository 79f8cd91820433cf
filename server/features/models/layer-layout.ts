import type { CurrentScaling, LayerGroup } from "../../../shared/schemas";
import { FULL_ATTENTION, layerGroupsOf, NO_ROPE } from "../../../shared/layer-groups";
import { isObj, num, type Json, type Warn } from "./config-values";
import { toCurrentScaling } from "./scaling-block";

/*
 * Per-layer-type rotary settings, read the way the loaders read them (huggingface/transformers):
 * - `layer_types`: one entry per layer (`full_attention`, `sliding_attention`, …); without it, Gemma-3-style configs
 *   give `sliding_window_pattern` and every pattern-th layer is full: models/gemma3/configuration_gemma3.py,
 *   `"sliding_attention" if (i + 1) % sliding_window_pattern else "full_attention"` (v4.5x line, from memory);
 * - local layers' own base `rope_local_base_freq`, which they use unscaled: models/gemma3/modeling_gemma3.py builds
 *   `rotary_emb_local` with `rope_theta = rope_local_base_freq` and rope_type "default" (v4.5x line);
 * - `rope_parameters` nested by layer type (v5 line): modeling_rope_utils.py `standardize_rope_params`, "Case 2:
 *   different RoPE for each layer", taken when the dict's keys are a subset of `layer_types`;
 * - `no_rope_layers`: 1 = the layer rotates, 0 = no position encoding: models/smollm3/modeling_smollm3.py,
 *   `self.use_rope = config.no_rope_layers[layer_idx]`.
 * Layers without layer types share one full_attention group (and one rotary embedding, scaling included).
 */

const MAX_LAYERS = 10_000;

type Top = {
  layers: number;
  headDim: number;
  partialRotaryFactor: number;
  ropeTheta: number;
  currentScaling: CurrentScaling | null;
};

function layerTypesOf(c: Json, layers: number, warn: Warn): string[] | undefined {
  const lt = c.layer_types;
  if (Array.isArray(lt)) {
    if (lt.length === layers && lt.every((t) => typeof t === "string" && t.length > 0 && t.length <= 80))
      return lt as string[];
    warn(
      "layer_types_unreadable",
      `layer_types has ${lt.length} entries for ${layers} layers (or entries that are not names); it was ignored.`,
      "Give one layer type per layer (full_attention, sliding_attention, …), or every layer is treated as full attention.",
    );
    return undefined;
  }
  const pattern = num(c.sliding_window_pattern);
  if (pattern !== undefined && Number.isInteger(pattern) && pattern > 0 && num(c.sliding_window) !== undefined)
    return Array.from({ length: layers }, (_, i) => ((i + 1) % pattern ? "sliding_attention" : FULL_ATTENTION));
  return undefined;
}

/** `rope_parameters` when it is nested by layer type, else undefined. */
export function nestedRopeParameters(c: Json): Record<string, Json> | undefined {
  const rp = c.rope_parameters;
  if (!isObj(rp) || !Array.isArray(c.layer_types)) return undefined;
  const keys = Object.keys(rp);
  const types = new Set(c.layer_types as unknown[]);
  if (!keys.length || !keys.every((k) => types.has(k) && isObj(rp[k]))) return undefined;
  return rp as Record<string, Json>;
}

/** Builds the groups; the scaled group (full attention, see shared/layer-groups.ts) carries `top`'s values. */
export function readLayerGroups(c: Json, top: Top, warn: Warn): LayerGroup[] | undefined {
  // One entry per layer is listed, so a file claiming more layers than a profile may hold (10 000) gets no groups:
  // the preview still renders and saving refuses num_hidden_layers.
  if (top.layers > MAX_LAYERS) return undefined;
  const kinds = layerTypesOf(c, top.layers, warn) ?? Array.from({ length: top.layers }, () => FULL_ATTENTION);
  const nr = c.no_rope_layers;
  if (Array.isArray(nr) && nr.length === top.layers)
    nr.forEach((v, i) => {
      if (v === 0 || v === false) kinds[i] = NO_ROPE;
    });
  const nested = nestedRopeParameters(c);
  const localBase = num(c.rope_local_base_freq);
  const window = num(c.sliding_window);
  const order: string[] = [];
  const byKind = new Map<string, number[]>();
  kinds.forEach((k, i) => {
    const seen = byKind.get(k);
    if (seen) seen.push(i);
    else {
      order.push(k);
      byKind.set(k, [i]);
    }
  });
  const dim = (prf: number) => Math.round(top.headDim * prf);
  const groups = order.map((kind): LayerGroup => {
    const layers = byKind.get(kind)!;
    if (kind === NO_ROPE)
      return { kind, layers, ropeTheta: null, rotaryDim: 0, slidingWindow: null, currentScaling: null };
    const slidingWindow = /sliding|local/.test(kind) && window !== undefined ? window : null;
    const block = nested?.[kind];
    if (block)
      return {
        kind,
        layers,
        ropeTheta: num(block.rope_theta) ?? top.ropeTheta,
        rotaryDim: dim(num(block.partial_rotary_factor) ?? top.partialRotaryFactor),
        slidingWindow,
        currentScaling: toCurrentScaling(block),
      };
    if (kind !== FULL_ATTENTION && localBase !== undefined)
      return {
        kind,
        layers,
        ropeTheta: localBase,
        rotaryDim: dim(top.partialRotaryFactor),
        slidingWindow,
        currentScaling: null,
      };
    return {
      kind,
      layers,
      ropeTheta: top.ropeTheta,
      rotaryDim: dim(top.partialRotaryFactor),
      slidingWindow,
      currentScaling: top.currentScaling,
    };
  });
  return layerGroupsOf({ ...top, layerGroups: groups });
}
