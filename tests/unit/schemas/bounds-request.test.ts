import { describe, expect, it } from "vitest";
import { baseBoundRequestSchema } from "../../../shared/schemas/bounds";
import { fieldsOf } from "./fields";

// The request table of POST /api/bounds/base and /base/stream (moved from tests/api/bounds.test.ts,
// which keeps one HTTP case per endpoint). Our own contract; no outside source.
describe("POST /api/bounds/base body: every bad input names its field", () => {
  it("both well-formed shapes name nothing", () => {
    expect(fieldsOf(baseBoundRequestSchema, { rotaryDim: 128, base: 10_000, maxLength: 4096 })).toEqual([]);
    expect(
      fieldsOf(baseBoundRequestSchema, {
        rotaryDim: 128,
        targetContext: 4096,
        grid: { from: 1e3, to: 1e4, perDecade: 10 },
      }),
    ).toEqual([]);
  });

  it.each([
    ["odd rotary dimension", { rotaryDim: 127, base: 10_000 }, "rotaryDim"],
    ["zero rotary dimension", { rotaryDim: 0, base: 10_000 }, "rotaryDim"],
    ["base not above 1", { rotaryDim: 128, base: 0.5 }, "base"],
    ["maxLength beyond 2^31", { rotaryDim: 128, base: 10_000, maxLength: 2 ** 31 + 1 }, "maxLength"],
    ["target beyond 2^31", { rotaryDim: 128, targetContext: 2 ** 31 + 1 }, "targetContext"],
    ["neither base nor target", { rotaryDim: 128 }, "base"],
    ["both base and target", { rotaryDim: 128, base: 10_000, targetContext: 4096 }, "targetContext"],
    ["a grid given with a base", { rotaryDim: 128, base: 10_000, grid: { from: 1e3, to: 1e4, perDecade: 10 } }, "grid"],
    ["maxLength given with a target", { rotaryDim: 128, targetContext: 4096, maxLength: 8192 }, "maxLength"],
    [
      "grid upside down",
      { rotaryDim: 128, targetContext: 4096, grid: { from: 1e6, to: 1e4, perDecade: 10 } },
      "grid.to",
    ],
    [
      "grid with a fractional step count",
      { rotaryDim: 128, targetContext: 4096, grid: { from: 1e3, to: 1e4, perDecade: 2.5 } },
      "grid.perDecade",
    ],
    [
      "grid too fine",
      { rotaryDim: 128, targetContext: 4096, grid: { from: 1e3, to: 1e15, perDecade: 1000 } },
      "grid.perDecade",
    ],
  ])("%s", (_label, body, field) => {
    expect(fieldsOf(baseBoundRequestSchema, body)).toContain(field);
  });
});
