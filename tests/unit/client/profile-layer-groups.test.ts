import { describe, expect, it } from "vitest";
import { profileGroupRows } from "../../../client/src/features/models/components/profile-layer-groups";
import { groupShape } from "../../../shared/profile-shapes";
import type { LayerGroup } from "../../../shared/schemas/models";

const group = (kind: string, layers: number[], ropeTheta: number | null, rotaryDim: number): LayerGroup => ({
  kind,
  layers,
  ropeTheta,
  rotaryDim,
  slidingWindow: kind === "sliding_attention" ? 512 : null,
  currentScaling: null,
});

describe("the profile's layer-group table", () => {
  it("labels as scaled the group plans scale (shared scaledGroupIndex), not a hard-coded full_attention", () => {
    // A model without full-attention layers: local-window layers and layers with no position encoding.
    const rows = profileGroupRows([group("no_rope", [0, 3], null, 0), group("sliding_attention", [1, 2], 1e4, 64)]);
    expect(rows.map((r) => [r.kind, r.note])).toEqual([
      ["no_rope", "never scaled"],
      ["sliding_attention", "a plan scales these layers"],
    ]);
  });

  it("keeps the full-attention layers scaled and the local ones as trained when both exist", () => {
    const rows = profileGroupRows([group("sliding_attention", [0], 1e4, 64), group("full_attention", [1], 1e6, 64)]);
    expect(rows.map((r) => r.note)).toEqual([
      "kept as trained unless a plan says otherwise",
      "a plan scales these layers",
    ]);
  });
});

describe("groupShape (one copy, shared by the workbench and the plan checks)", () => {
  const profile = {
    headDim: 128,
    ropeTheta: 1e6,
    trainedContext: 8192,
    partialRotaryFactor: 1,
    layers: 4,
    attentionHeads: 8,
    kvHeads: 2,
    hiddenSize: 1024,
  };
  it("takes the group's own base and rotary dimension over the profile's heads", () => {
    expect(groupShape(profile, group("sliding_attention", [0], 1e4, 64))).toMatchObject({
      ropeTheta: 1e4,
      partialRotaryFactor: 0.5,
      headDim: 128,
    });
  });
  it("falls back to the profile's own shape for no_rope or no group", () => {
    expect(groupShape(profile, group("no_rope", [0], null, 0)).ropeTheta).toBe(1e6);
    expect(groupShape(profile, undefined).partialRotaryFactor).toBe(1);
  });
});
