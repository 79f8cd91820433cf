import fs from "node:fs";
import path from "node:path";
import { describe, expect, it } from "vitest";
import {
  applyMergePatch,
  exportPlan,
  SECTIONS_WITH_ARTIFACT,
  stacksKeepingSections,
  TARGET_IDS,
} from "../../../../server/engine/targets";
import { parseModelConfig } from "../../../../server/features/models/config-import";
import { groupRotarySpecs } from "../../../../shared/layer-groups";
import { rotaryShapeOf } from "../../../../shared/profile-shapes";
import type { MethodParams } from "../../../../shared/schemas/analysis";

/*
 * The v5 layout nested by layer type (rope_parameters keyed by the config's layer_types: huggingface/transformers
 * RotaryEmbeddingConfigMixin.standardize_rope_params, "Case 2", v5 line; hf/read-v5.ts and layer-nesting.ts cite it)
 * builds each layer type's rotary from its own entry, so a layered multimodal model holds its sections only when every
 * layer type's entry holds them. Two layouts of the hand-written sliding + full + no_rope model with sections
 * [16, 24, 24] (local layers with their own base 10 000):
 * - as the fixture gives it: the sections in the 4.x rope_scaling, which the v5 patch removes;
 * - nested: each layer type's entry in rope_parameters holds its base and the sections, nothing at the top level.
 * What is checked against the artifacts themselves: the v5 patch merged onto the config (RFC 7396) leaves mrope_section
 * in every layer type's entry; SECTIONS_WITH_ARTIFACT and the stacks the caution offers agree with that. The other
 * stacks are not named for this model as before: none of them compiles a per-layer-type plan (their conformance is
 * not exact or equivalent, tests/unit/engine/targets/group-coverage.test.ts).
 */
const SECTIONS = [16, 24, 24];
const fourX = JSON.parse(
  fs.readFileSync(
    path.join(import.meta.dirname, "../../../fixtures/configs/sliding-full-nope-mrope-sections.json"),
    "utf8",
  ),
) as Record<string, unknown>;
const { rope_scaling: _, rope_local_base_freq: __, ...bare } = fourX;
const nested = {
  ...bare,
  rope_parameters: {
    full_attention: { rope_type: "default", rope_theta: 1e6, mrope_section: SECTIONS },
    sliding_attention: { rope_type: "default", rope_theta: 1e4, mrope_section: SECTIONS },
  },
};
const LAYER_TYPES = ["full_attention", "sliding_attention"];

const requestFor = (config: Record<string, unknown>, method: MethodParams) => {
  const { profile } = parseModelConfig(JSON.stringify(config));
  const p = { ...profile, parameters: 7e9 } as Parameters<typeof rotaryShapeOf>[0] &
    Parameters<typeof groupRotarySpecs>[0];
  return {
    model: rotaryShapeOf(p),
    config,
    targetContext: 131072,
    method,
    groups: groupRotarySpecs(p, method),
  };
};

/** Each layer type's mrope_section in config.json once the v5 patch is merged onto it. */
const perLayerType = (config: Record<string, unknown>, patch: object) => {
  const applied = applyMergePatch(config, patch) as { rope_parameters?: Record<string, { mrope_section?: unknown }> };
  return Object.fromEntries(LAYER_TYPES.map((t) => [t, applied.rope_parameters?.[t]?.mrope_section]));
};

describe("a layered multimodal model in the v5 nested layout keeps its sections per layer type", () => {
  for (const [layout, config] of [
    ["4.x rope_scaling", fourX],
    ["nested rope_parameters", nested],
  ] as const) {
    for (const method of ["ntk", "linear", "yarn"] as const) {
      it(`${layout}, ${method}: every layer type's entry holds them, and transformers-v5 is named`, () => {
        const request = requestFor(config, { method });
        expect(request.model.mropeSection).toEqual(SECTIONS);
        const v5 = exportPlan({ ...request, targets: TARGET_IDS }).targets.find((t) => t.id === "transformers-v5")!;
        expect(v5.conformance.status).toBe("exact");
        const patch = v5.artifact!.content;
        // the artifact writes them nowhere else: rope_parameters is nested, rope_scaling removed
        expect(
          Object.keys((applyMergePatch(config, patch) as { rope_parameters: object }).rope_parameters).sort(),
        ).toEqual(LAYER_TYPES);
        expect(perLayerType(config, patch)).toEqual({ full_attention: SECTIONS, sliding_attention: SECTIONS });
        expect(SECTIONS_WITH_ARTIFACT["transformers-v5"](config, v5.artifact!)).toEqual({ mrope_section: SECTIONS });
        expect(stacksKeepingSections(request)).toEqual(["transformers-v5"]);
      });
    }
  }

  it("one layer type's entry without them: v5 holds none, whatever the other entry holds", () => {
    const v5 = exportPlan({ ...requestFor(nested, { method: "ntk" }), targets: ["transformers-v5"] }).targets[0];
    const lacking = {
      ...nested,
      rope_parameters: { ...nested.rope_parameters, sliding_attention: { rope_type: "default", rope_theta: 1e4 } },
    };
    expect(perLayerType(lacking, v5.artifact!.content).sliding_attention).toBeUndefined();
    expect(SECTIONS_WITH_ARTIFACT["transformers-v5"](lacking, v5.artifact!)).toBeNull();
  });
});
