import fs from "node:fs";
import path from "node:path";
import { describe, expect, it } from "vitest";
import { exportPlan, TARGET_IDS } from "../../../../server/engine/targets";
import { planFingerprint } from "../../../../server/engine/fingerprint";
import { groupRotarySpecs } from "../../../../shared/layer-groups";
import type { LayerGroup } from "../../../../shared/schemas/models";
import type { MethodParams } from "../../../../shared/schemas/analysis";
import { handFingerprint, plainRope } from "../../../setup/hand-fingerprint";

/*
 * Issue 11, per-group coverage: the fingerprint and the conformance matrix cover every rotating layer group.
 * Check values are computed here, independently of the engine: plain RoPE θᵢ = b^(−2i/d) (RoFormer, Su et al. 2021,
 * eq. 15), position interpolation θᵢ/s (Chen et al. 2023, eq. 4), and the byte layout of docs/fingerprint.md.
 */
const fixture = (n: string) =>
  JSON.parse(fs.readFileSync(path.join(import.meta.dirname, "../../../fixtures/configs", n), "utf8")) as Record<
    string,
    unknown
  >;
// The sliding/full fixture: 10 local layers (base 10 000, window 1024) around 2 full layers (base 1e6), d = 256.
const windowed = fixture("sliding-full-local-base.json");
const types = windowed.layer_types as string[];
const layersOf = (k: string) => types.flatMap((t, i) => (t === k ? [i] : []));
const groups: LayerGroup[] = [
  {
    kind: "full_attention",
    layers: layersOf("full_attention"),
    ropeTheta: 1e6,
    rotaryDim: 256,
    slidingWindow: null,
    currentScaling: null,
  },
  {
    kind: "sliding_attention",
    layers: layersOf("sliding_attention"),
    ropeTheta: 1e4,
    rotaryDim: 256,
    slidingWindow: 1024,
    currentScaling: null,
  },
];
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
const linear4: MethodParams = { method: "linear", factor: 4 };

describe("the fingerprint covers every layer group", () => {
  it("a single-group model keeps the fingerprint it always had (old revisions still verify)", () => {
    const single = { ...model, layerGroups: null };
    expect(groupRotarySpecs(single, linear4)).toBeUndefined();
    const expected = handFingerprint([{ d: 256, a: 1, theta: plainRope(256, 1e6).map((t) => t / 4) }]);
    expect(planFingerprint(model, 65536, linear4, groupRotarySpecs(single, linear4))).toBe(expected);
  });

  it("a layered model hashes one record per rotating group, in first-layer order (local layers first here)", () => {
    const specs = groupRotarySpecs({ ...model, layerGroups: groups }, linear4)!;
    expect(specs.map((s) => [s.kind, s.scaled, s.method.method])).toEqual([
      ["sliding_attention", false, "default"],
      ["full_attention", true, "linear"],
    ]);
    const expected = handFingerprint([
      { d: 256, a: 1, theta: plainRope(256, 1e4) },
      { d: 256, a: 1, theta: plainRope(256, 1e6).map((t) => t / 4) },
    ]);
    expect(planFingerprint(model, 65536, linear4, specs)).toBe(expected);
    expect(exportPlan({ model, targetContext: 65536, method: linear4, groups: specs, targets: [] }).fingerprint).toBe(
      expected,
    );
    // Scaling the local layers too is another model at run time, so another fingerprint.
    const both = groupRotarySpecs({ ...model, layerGroups: groups }, linear4, [
      { kind: "sliding_attention", method: linear4 },
    ]);
    expect(planFingerprint(model, 65536, linear4, both)).not.toBe(expected);
  });

  it("no_rope layers rotate nothing and add no record", () => {
    const withNope = [
      ...groups,
      { kind: "no_rope", layers: [12], ropeTheta: null, rotaryDim: 0, slidingWindow: null, currentScaling: null },
    ];
    const specs = groupRotarySpecs({ ...model, layers: 13, layerGroups: withNope }, linear4)!;
    expect(specs.map((s) => s.kind)).toEqual(["sliding_attention", "full_attention"]);
  });
});

describe("the conformance matrix covers every layer group", () => {
  const run = (groupMethods: { kind: string; method: MethodParams }[] = []) =>
    exportPlan({
      model,
      config: windowed,
      targetContext: 65536,
      method: { method: "yarn", factor: 4 },
      groups: groupRotarySpecs({ ...model, layerGroups: groups }, { method: "yarn", factor: 4 }, groupMethods),
    });

  it("transformers-v5 reads each group back exactly; the local layers exactly as trained", () => {
    const v5 = run().targets.find((t) => t.id === "transformers-v5")!;
    expect(v5.conformance.status, v5.conformance.cause).toBe("exact");
    expect(v5.conformance.groups!.map((g) => [g.kind, g.status])).toEqual([
      ["sliding_attention", "exact"],
      ["full_attention", "exact"],
    ]);
    const rp = v5.artifact!.content.rope_parameters as Record<string, unknown>;
    expect(rp.sliding_attention).toEqual({ rope_type: "default", rope_theta: 10000 });
  });

  it("stacks that read one setting for every layer are unsupported, naming the local layers, never exact", () => {
    for (const t of run().targets.filter((x) => x.id !== "transformers-v5")) {
      expect(t.conformance.status, t.id).toBe("unsupported");
      expect(t.conformance.cause, t.id).toContain("sliding_attention layers (base 10000, default)");
      expect(t.conformance.workaround, t.id).toContain("transformers-v5");
      expect(t.conformance.groups!.find((g) => g.kind === "sliding_attention")!.status, t.id).toBe("differs");
    }
    expect(run().targets.map((t) => t.id)).toEqual([...TARGET_IDS]);
  });

  it("a group with its own method is compiled over its own base and read back exactly by transformers-v5", () => {
    const out = run([{ kind: "sliding_attention", method: { method: "linear", factor: 2 } }]);
    const v5 = out.targets.find((t) => t.id === "transformers-v5")!;
    const rp = v5.artifact!.content.rope_parameters as Record<string, unknown>;
    expect(rp.sliding_attention).toEqual({ rope_type: "linear", factor: 2, rope_theta: 10000 });
    expect(v5.conformance.status, v5.conformance.cause).toBe("exact");
  });
});
