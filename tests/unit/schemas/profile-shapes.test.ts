import { describe, expect, it } from "vitest";
import { budgetShapeOf, rotaryShapeOf } from "../../../shared/profile-shapes";
import { rotaryShapeSchema } from "../../../shared/schemas/analysis";
import { budgetModelShapeSchema as budgetShapeSchema } from "../../../shared/schemas/budget";

// A fictional profile with every stored column, as a row, a profile response or a revision snapshot carries it.
const profile = {
  id: 3,
  name: "Bollard-3B",
  family: "bollard",
  headDim: 96,
  partialRotaryFactor: 0.5,
  ropeTheta: 50_000,
  trainedContext: 4096,
  layers: 28,
  attentionHeads: 24,
  kvHeads: 8,
  hiddenSize: 2304,
  parameters: 2.8e9 + 0.4,
  parametersTotal: 3.1e9,
  bytesPerElement: 2,
  retiredAt: null,
  createdAt: "2026-01-01T00:00:00.000Z",
};

describe("one profile → engine shape rule for server and client", () => {
  it("the rotary shape passes the strict analysis schema and carries the profile's numbers unchanged", () => {
    const shape = rotaryShapeOf(profile);
    expect(rotaryShapeSchema.parse(shape)).toEqual(shape);
    expect(shape).toEqual({
      headDim: 96,
      ropeTheta: 50_000,
      trainedContext: 4096,
      partialRotaryFactor: 0.5,
      layers: 28,
      attentionHeads: 24,
      kvHeads: 8,
      hiddenSize: 2304,
    });
  });

  it("the budget shape passes the strict estimate schema, with a whole parameter count", () => {
    const shape = budgetShapeOf(profile);
    expect(budgetShapeSchema.parse(shape)).toEqual(shape);
    expect(shape.parameters).toBe(2_800_000_000);
    expect(Object.keys(shape).sort()).toEqual([
      "attentionHeads",
      "bytesPerElement",
      "headDim",
      "hiddenSize",
      "kvHeads",
      "layers",
      "parameters",
    ]);
  });
});
