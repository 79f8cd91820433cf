import { describe, expect, it } from "vitest";
import { analyse } from "../../server/engine";
import { METHOD_CATALOG, METHOD_IDS } from "../../shared/methods";
import type { MethodParams } from "../../shared/schemas/analysis";
import {
  FROZEN_CONFIG_LACKS_SECTIONS,
  frozenBlockCautions,
  groupBlockCautions,
  missingSectionKeys,
} from "../../shared/frozen-block";

/*
 * The caution of a signed block that lacks the model's multimodal sections (shared/frozen-block.ts). The keys are the
 * ones the model reads every step (shared/mrope-axes.ts MROPE_KEYS cites where); the blocks below are written by hand
 * in the two forms engine 1.0 froze: `rope_scaling: null` (a new base) and a scaling block without the sections.
 */
const contiguous = { mropeSection: [16, 24, 24], mropeInterleaved: false };
const interleaved = { mropeSection: [24, 20, 16], mropeInterleaved: true };
/** the stacks a caution offers come from the targets (tests/unit/engine/targets/sections-keeping.test.ts) */
const ways = { keepingTargets: ["transformers-v4"] };

describe("which section keys a signed block lacks", () => {
  it("a model without sections never draws the caution", () => {
    expect(frozenBlockCautions({}, { rope_scaling: null }, ways)).toEqual([]);
  });
  it("a null block lacks every key the model has", () => {
    expect(missingSectionKeys(contiguous, { rope_scaling: null })).toEqual(["mrope_section"]);
    expect(missingSectionKeys(interleaved, { rope_scaling: null })).toEqual(["mrope_section", "mrope_interleaved"]);
    const [c] = frozenBlockCautions(interleaved, { rope_scaling: null }, ways);
    expect(c.code).toBe(FROZEN_CONFIG_LACKS_SECTIONS);
    expect(c.message).toContain('"mrope_section" and "mrope_interleaved"');
    expect(c.message).toContain("rope_scaling is null");
  });
  it("a scaling block without the sections, as engine 1.0 froze it", () => {
    const old = { rope_scaling: { rope_type: "linear", factor: 4, original_max_position_embeddings: 32768 } };
    expect(missingSectionKeys(contiguous, old)).toEqual(["mrope_section"]);
  });
  it("every block the engine freezes now carries them: no caution for any method", () => {
    for (const model of [contiguous, interleaved]) {
      for (const id of METHOD_IDS) {
        const method = (
          id === "longrope" ? METHOD_CATALOG.longrope.example(64) : METHOD_CATALOG[id].example(64)
        ) as MethodParams;
        const shape = { headDim: 128, ropeTheta: 1e6, trainedContext: 32768, ...model };
        const patch = analyse({ model: shape, targetContext: 131072, methods: [method] }).methods[0].ropeScaling;
        expect(frozenBlockCautions(model, patch, ways), id).toEqual([]);
      }
    }
  });
});

describe("layer-group blocks draw the same caution, naming the group", () => {
  const groups = [
    { kind: "sliding_attention", ropeTheta: 1e4, patch: { rope_scaling: null } },
    { kind: "full_attention", ropeTheta: 1e6, patch: { rope_scaling: { rope_type: "linear", mrope_section: [1] } } },
    { kind: "no_rope", ropeTheta: null, patch: { rope_scaling: null } },
  ];
  it("each group block without the sections, and only those; its v5 entry named when the group rotates", () => {
    const cautions = groupBlockCautions(contiguous, groups, ways.keepingTargets);
    expect(cautions.map((c) => c.group)).toEqual(["sliding_attention", "no_rope"]);
    expect(cautions[0].message).toContain("ropeParametersByLayerType.sliding_attention");
    expect(cautions[1].message).not.toContain("ropeParametersByLayerType");
    // the group's message is the same rule's: missing keys, effect and way out
    const [plain] = frozenBlockCautions(contiguous, { rope_scaling: null }, ways);
    expect(cautions[1].message.slice(cautions[1].message.indexOf(" lacks "))).toBe(
      plain.message.slice(plain.message.indexOf(" lacks ")),
    );
    expect(groupBlockCautions({}, groups, ways.keepingTargets)).toEqual([]);
  });
});
