// Tick and axis helpers checked by hand: powers of two counted out, and the props the helper must (not) set.
import { describe, expect, it } from "vitest";
import { axisLook, powerOfTwoTicks } from "../../../client/src/components/chart-axis";

describe("length ticks shared by the evidence and budget charts", () => {
  it("are the powers of two inside the range (2^12 = 4096 … 2^16 = 65536)", () => {
    expect(powerOfTwoTicks(3000, 70_000, 8)).toEqual([4096, 8192, 16384, 32768, 65536]);
    expect(powerOfTwoTicks(4096, 4096, 8)).toEqual([4096]);
  });

  it("are thinned to at most `max`, keeping every step-th from the first (2^10 … 2^20: 11 powers, step 3)", () => {
    const ticks = powerOfTwoTicks(1024, 1024 ** 2, 4);
    expect(ticks).toEqual([1024, 8192, 65536, 524288]);
    expect(ticks.length).toBeLessThanOrEqual(4);
  });
});

describe("axis look", () => {
  it("leaves the font out unless one is named, so visx keeps its own", () => {
    const plain = axisLook({ line: "a", text: "b" });
    expect("fontFamily" in plain.tickLabelProps).toBe(false);
    expect("fontFamily" in plain.labelProps).toBe(false);
    const named = axisLook({ line: "a", text: "b", labelSize: 12, fontFamily: "F" });
    expect(named.labelProps).toEqual({ fill: "b", fontSize: 12, fontFamily: "F", textAnchor: "middle" });
    expect(named.tickLabelProps).toEqual({ fill: "b", fontSize: 11, fontFamily: "F" });
  });
});
