// The side-by-side view's "Change" column, checked by hand arithmetic (no outside source needed: differences and ratios).
import { describe, expect, it } from "vitest";
import { fieldDelta, showValue } from "../../../client/src/features/plans/lib/field-delta";

describe("fieldDelta", () => {
  it("gives the difference and the ratio of two numbers", () => {
    expect(fieldDelta(32768, 131072)).toBe("+98,304 · ×4"); // 131072 − 32768 = 98304; 131072 / 32768 = 4
    expect(fieldDelta(10000, 500000)).toBe("+490,000 · ×50");
    expect(fieldDelta(8, 6)).toBe("−2 · ×0.75");
    expect(fieldDelta(1.5, 1.5)).toBe("±0 · ×1");
  });
  it("leaves out the ratio where it means nothing", () => {
    expect(fieldDelta(0, 3)).toBe("+3");
    expect(fieldDelta(-1, 2)).toBe("+3");
  });
  it("says set, cleared or replaced for the rest", () => {
    expect(fieldDelta(null, 4)).toBe("set");
    expect(fieldDelta("yarn", undefined)).toBe("cleared");
    expect(fieldDelta("ntk", "yarn")).toBe("replaced");
  });
  it("shows values grouped, absent as a dash, objects as JSON", () => {
    expect(showValue(131072)).toBe("131,072");
    expect(showValue(0.1234567)).toBe("0.1234567"); // inputs are not rounded
    expect(showValue(null)).toBe("—");
    expect(showValue({ a: 1 })).toBe('{"a":1}');
  });
});
