import { describe, expect, it } from "vitest";
import { TARGETS, exportForTargets, exportPlan, type TargetId } from "../../../../server/engine/targets";
import { groupRotarySpecs } from "../../../../shared/layer-groups";
import type { LayerGroup } from "../../../../shared/schemas/models";
import { LLAMA_LIKE, planInput } from "./helpers";

/*
 * Which head dimension the 4.4x transformers rules rotate. Read in huggingface/transformers
 * src/transformers/modeling_rope_utils.py:
 * - at ef46806 (the 4.45 line: its validators already take `ignore_keys`) every `_compute_*_parameters` function and
 *   the longrope validator take head_dim = getattr(config, "head_dim", hidden_size // num_attention_heads), then
 *   dim = int(head_dim × partial_rotary_factor). The change is transformers PR #32495, "Use head_dim if in config
 *   for RoPE", opened 2024-08-07, the day after v4.44.0 was published (release date from memory).
 * - at 0044e3b, before it, they read hidden_size // num_attention_heads only.
 * So 4.45 to 4.49 rotate head_dim when config.json has one; the "v4-early" reader used the older rule.
 * Check values: a config whose head_dim (256) differs from hidden_size / heads (2560 / 8 = 320), as several model
 * families ship; RoFormer's θᵢ = 1/b^(2i/d) (Su et al. 2021) over d = 256, computed here.
 */
const WIDE_HEADS = {
  ...LLAMA_LIKE,
  hidden_size: 2560,
  num_attention_heads: 8,
  num_key_value_heads: 4,
  head_dim: 256,
  rope_theta: 1000000.0,
  max_position_embeddings: 16384,
};
const SHAPE = { d: 256, base: 1e6, trained: 16384, target: 65536 };
const HF: TargetId[] = ["transformers-v4-early", "transformers-v4", "transformers-v5"];

describe("head_dim under the transformers 4.45+ rules", () => {
  it("every transformers target rotates head_dim (256), not hidden_size / heads (320)", () => {
    const input = planInput(WIDE_HEADS, { method: "yarn" }, SHAPE);
    for (const out of exportForTargets(input, HF)) {
      const r = TARGETS[out.id].read(WIDE_HEADS, out.artifact!, SHAPE.target);
      expect(r.rotaryDim, out.id).toBe(256);
      expect(out.conformance.status, `${out.id}: ${out.conformance.cause}`).toBe("exact");
    }
  });

  it("the default rule over head_dim gives RoFormer's frequencies for d = 256", () => {
    const input = planInput(WIDE_HEADS, { method: "default" }, SHAPE);
    const [out] = exportForTargets(input, ["transformers-v4-early"]);
    const r = TARGETS["transformers-v4-early"].read(WIDE_HEADS, out.artifact!, SHAPE.target);
    expect(r.invFreq).toHaveLength(128);
    r.invFreq.forEach((f, i) => expect(f).toBe(1 / Math.pow(1e6, (2 * i) / 256)));
  });

  it("partial_rotary_factor applies to head_dim; without head_dim the ratio is used", () => {
    const partial = { ...WIDE_HEADS, partial_rotary_factor: 0.5 };
    const [p] = exportForTargets(planInput(partial, { method: "linear" }, { ...SHAPE, d: 128 }), [
      "transformers-v4-early",
    ]);
    expect(TARGETS["transformers-v4-early"].read(partial, p.artifact!, SHAPE.target).rotaryDim).toBe(128);
    const { head_dim: _hd, ...ratioOnly } = WIDE_HEADS;
    const [q] = exportForTargets(planInput(ratioOnly, { method: "linear" }, { ...SHAPE, d: 320 }), [
      "transformers-v4-early",
    ]);
    expect(TARGETS["transformers-v4-early"].read(ratioOnly, q.artifact!, SHAPE.target).rotaryDim).toBe(320);
  });

  it("a layered model: the scaled group reads back exactly; only the local layers make it unsupported", () => {
    const layerTypes = Array.from({ length: 12 }, (_, i) => (i % 6 === 5 ? "full_attention" : "sliding_attention"));
    const config = { ...WIDE_HEADS, num_hidden_layers: 12, layer_types: layerTypes, rope_local_base_freq: 10000.0 };
    const layersOf = (k: string) => layerTypes.flatMap((t, i) => (t === k ? [i] : []));
    const group = (kind: string, ropeTheta: number): LayerGroup => ({
      kind,
      layers: layersOf(kind),
      ropeTheta,
      rotaryDim: 256,
      slidingWindow: kind === "full_attention" ? null : 1024,
      currentScaling: null,
    });
    const model = {
      headDim: 256,
      ropeTheta: 1e6,
      trainedContext: 16384,
      partialRotaryFactor: 1,
      layers: 12,
      attentionHeads: 8,
      kvHeads: 4,
      hiddenSize: 2560,
    };
    const method = { method: "yarn", factor: 4 } as const;
    const layerGroups = [group("full_attention", 1e6), group("sliding_attention", 1e4)];
    const out = exportPlan({
      model,
      config,
      targetContext: 65536,
      method,
      targets: ["transformers-v4-early"],
      groups: groupRotarySpecs({ ...model, layerGroups }, method),
    });
    const early = out.targets[0].conformance;
    expect(early.status).toBe("unsupported");
    expect(early.groups!.map((g) => [g.kind, g.status])).toEqual([
      ["sliding_attention", "differs"],
      ["full_attention", "exact"],
    ]);
  });
});
