import { describe, expect, it } from "vitest";
import { analysisRequestSchema, rotaryDimension } from "../../../shared/schemas/analysis";
import { baseBoundRequestSchema } from "../../../shared/schemas/bounds";
import { issuesToFields } from "../../../server/platform/validate";

const fieldsOf = (schema: { safeParse: (v: unknown) => { success: boolean; error?: unknown } }, value: unknown) => {
  const r = schema.safeParse(value);
  return r.success ? {} : issuesToFields(r.error as never);
};
const good = {
  model: { headDim: 128, ropeTheta: 10_000, trainedContext: 4096 },
  targetContext: 32_768,
  methods: [{ method: "yarn" }],
};

// JSON cannot carry NaN, so these checks sit at the schema level; Infinity is also checked over HTTP (tests/api).
describe("request schemas refuse NaN and ±Infinity, naming the field", () => {
  it.each([
    ["model.ropeTheta", { ...good, model: { ...good.model, ropeTheta: NaN } }],
    ["model.headDim", { ...good, model: { ...good.model, headDim: Infinity } }],
    ["targetContext", { ...good, targetContext: NaN }],
    ["methods.0.betaFast", { ...good, methods: [{ method: "yarn", betaFast: NaN }] }],
    ["methods.0.base", { ...good, methods: [{ method: "base", base: Infinity }] }],
    ["bands.alpha", { ...good, bands: { alpha: NaN, beta: 32 } }],
  ])("%s", (field, value) => {
    expect(Object.keys(fieldsOf(analysisRequestSchema, value))).toContain(field);
  });

  it("bounds: base, maxLength", () => {
    expect(fieldsOf(baseBoundRequestSchema, { rotaryDim: 128, base: NaN })).toHaveProperty("base");
    expect(fieldsOf(baseBoundRequestSchema, { rotaryDim: 128, base: 1e4, maxLength: Infinity })).toHaveProperty(
      "maxLength",
    );
  });

  it("a well-formed request passes and fills the bounds defaults", () => {
    expect(analysisRequestSchema.safeParse(good).success).toBe(true);
    expect(baseBoundRequestSchema.parse({ rotaryDim: 64, base: 1e4 })).toEqual({
      kind: "supportedLength",
      rotaryDim: 64,
      base: 1e4,
      maxLength: 2 ** 24,
    });
    expect(baseBoundRequestSchema.parse({ rotaryDim: 64, targetContext: 4096 })).toEqual({
      kind: "smallestBase",
      rotaryDim: 64,
      targetContext: 4096,
      grid: { from: 1e3, to: 1e10, perDecade: 100 },
    });
  });
});

describe("rotary dimension", () => {
  it("is headDim × partialRotaryFactor when that is a positive even integer (phi-2: 80 × 0.4 = 32, from memory)", () => {
    expect(rotaryDimension({ headDim: 80, partialRotaryFactor: 0.4 })).toBe(32);
    expect(rotaryDimension({ headDim: 128 })).toBe(128);
    expect(rotaryDimension({ headDim: 128, partialRotaryFactor: 0.3 })).toBeNull();
    expect(rotaryDimension({ headDim: 63 })).toBeNull();
  });
});
