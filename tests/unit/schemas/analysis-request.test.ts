import { describe, expect, it } from "vitest";
import { analysisRequestSchema } from "../../../shared/schemas/analysis";
import { fieldsOf } from "./fields";

// The request table of POST /api/analyses (moved from tests/api/analyses.test.ts, which keeps one HTTP case).
// Rules are our own contract; the 2^31 limit and the even rotary dimension follow from the engine's arithmetic.
const model = { headDim: 128, ropeTheta: 10_000, trainedContext: 4096 };
const good = { model, targetContext: 32_768, methods: [{ method: "yarn" }] };
const m = (method: object) => ({ ...good, methods: [method] });

describe("POST /api/analyses body: every bad input names its field", () => {
  it("a well-formed body names nothing", () => {
    expect(fieldsOf(analysisRequestSchema, good)).toEqual([]);
    expect(fieldsOf(analysisRequestSchema, { ...good, model: { modelId: 7 } })).toEqual([]);
  });

  it.each([
    ["odd rotary dimension", { ...good, model: { ...model, headDim: 63 } }, "model.headDim"],
    ["zero head dimension", { ...good, model: { ...model, headDim: 0 } }, "model.headDim"],
    ["negative head dimension", { ...good, model: { ...model, headDim: -128 } }, "model.headDim"],
    [
      "odd partial rotary dimension",
      { ...good, model: { ...model, partialRotaryFactor: 0.3 } },
      "model.partialRotaryFactor",
    ],
    ["partialRotaryFactor 0", { ...good, model: { ...model, partialRotaryFactor: 0 } }, "model.partialRotaryFactor"],
    [
      "partialRotaryFactor above 1",
      { ...good, model: { ...model, partialRotaryFactor: 1.5 } },
      "model.partialRotaryFactor",
    ],
    ["base not above 1", { ...good, model: { ...model, ropeTheta: 1 } }, "model.ropeTheta"],
    ["target equal to trained", { ...good, targetContext: 4096 }, "targetContext"],
    ["target below trained", { ...m({ method: "ntk" }), targetContext: 2048 }, "targetContext"],
    ["factor below 1", m({ method: "linear", factor: 0.5 }), "methods.0.factor"],
    ["betaFast equal to betaSlow", m({ method: "yarn", betaFast: 4, betaSlow: 4 }), "methods.0.betaFast"],
    ["betaSlow above the default betaFast", m({ method: "yarn", betaSlow: 40 }), "methods.0.betaSlow"],
    [
      "highFreqFactor below lowFreqFactor",
      m({ method: "llama3", lowFreqFactor: 4, highFreqFactor: 2 }),
      "methods.0.highFreqFactor",
    ],
    [
      "longrope list of wrong length",
      m({ method: "longrope", longFactor: [1, 2, 3], shortFactor: Array(64).fill(1) }),
      "methods.0.longFactor",
    ],
    [
      "longrope short list of wrong length",
      m({ method: "longrope", longFactor: Array(64).fill(1), shortFactor: Array(65).fill(1) }),
      "methods.0.shortFactor",
    ],
    [
      "longrope non-positive entry",
      m({ method: "longrope", longFactor: Array(64).fill(1), shortFactor: [...Array(63).fill(1), 0] }),
      "methods.0.shortFactor.63",
    ],
    ["target beyond 2^31", { ...good, targetContext: 2 ** 31 + 1 }, "targetContext"],
    [
      "trained context beyond 2^31",
      { ...good, model: { ...model, trainedContext: 2 ** 31 + 1 } },
      "model.trainedContext",
    ],
    ["sequence length beyond 2^31", m({ method: "dynamic", sequenceLength: 2 ** 32 }), "methods.0.sequenceLength"],
    ["fractional length", { ...good, targetContext: 8192.5 }, "targetContext"],
    ["more than 16 methods", { ...good, methods: Array(17).fill({ method: "default" }) }, "methods"],
    ["no methods", { ...good, methods: [] }, "methods"],
    ["unknown method", m({ method: "rerope" }), "methods.0.method"],
    ["unknown parameter key", m({ method: "yarn", beta_fast: 32 }), "methods.0"],
    ["alpha not below beta", { ...good, bands: { alpha: 8, beta: 8 } }, "bands.beta"],
    ["a head dimension sent as text", { ...good, model: { ...model, headDim: "128" } }, "model.headDim"],
    ["a model that is not an object", { ...good, model: 5 }, "model"],
    ["a model id that is not a number", { ...good, model: { modelId: "x" } }, "model.modelId"],
  ])("%s", (_label, body, field) => {
    expect(fieldsOf(analysisRequestSchema, body)).toContain(field);
  });
});
