import { describe, expect, it } from "vitest";
import { mropeAxisOfPairs, mropeAxisSummary, mropeBands } from "../../shared/mrope-axes";

/*
 * Which axis each pair rotates by. Check values follow the loaders shared/mrope-axes.ts cites, worked out by hand:
 * contiguous blocks split by mrope_section with block i on axis i % 3 (transformers qwen2_vl
 * apply_multimodal_rotary_pos_emb); interleaved T H W T H W … with the tail temporal (transformers qwen3_vl
 * apply_interleaved_mrope, whose docstring gives [24, 20, 20] over 64 pairs: temporal 0, 3, …, 57 and 60–63,
 * height 1, 4, …, 58, width 2, 5, …, 59).
 */
describe("multimodal sections over the pair axis", () => {
  it("contiguous [16, 24, 24]: pairs 0–15 temporal, 16–39 height, 40–63 width", () => {
    expect(mropeBands([16, 24, 24], false, 64)).toEqual([
      { axis: "temporal", from: 0, to: 15 },
      { axis: "height", from: 16, to: 39 },
      { axis: "width", from: 40, to: 63 },
    ]);
  });

  it("interleaved [24, 20, 20] over 64 pairs: T H W repeating, then the last four temporal", () => {
    const axes = mropeAxisOfPairs([24, 20, 20], true, 64);
    expect(axes.slice(0, 6)).toEqual(["temporal", "height", "width", "temporal", "height", "width"]);
    expect(axes.slice(57, 64)).toEqual(["temporal", "height", "width", "temporal", "temporal", "temporal", "temporal"]);
    const summary = Object.fromEntries(mropeAxisSummary([24, 20, 20], true, 64).map((a) => [a.axis, a.pairs.length]));
    expect(summary).toEqual({ temporal: 24, height: 20, width: 20 });
  });

  it("sections that fall short of the rotating pairs leave the rest unassigned (the import warns mrope_section_sum)", () => {
    const axes = mropeAxisOfPairs([4, 2, 2], false, 10);
    expect(axes.slice(8)).toEqual([null, null]);
    expect(mropeBands([4, 2, 2], false, 10).at(-1)).toEqual({ axis: "width", from: 6, to: 7 });
  });
});
