import crypto from "node:crypto";
import { describe, expect, it } from "vitest";
import { makeTestApp, type Agent } from "../setup/app";
import { analysisResponseSchema } from "../../shared/schemas/analysis";

const { agent, agentAs } = makeTestApp();
const model = { headDim: 128, ropeTheta: 10_000, trainedContext: 4096 };
const good = { model, targetContext: 32_768, methods: [{ method: "yarn" }] };

const post = (a: Agent, body: unknown) => a.post("/api/analyses").set("X-CSRF-Token", a.csrf).send(body as object);
const postRaw = (a: Agent, json: string) =>
  a.post("/api/analyses").set("X-CSRF-Token", a.csrf).set("Content-Type", "application/json").send(json);

/** Expects a 400 whose fields name exactly this field. */
async function rejects(a: Agent, body: unknown, field: string) {
  const r = await post(a, body);
  expect(r.status, JSON.stringify(r.body)).toBe(400);
  expect(r.body.error.code).toBe("invalid");
  expect(Object.keys(r.body.error.fields ?? {})).toContain(field);
}

describe("POST /api/analyses", () => {
  it("needs a signed-in user", async () => {
    const anon = await agent();
    expect((await post(anon, good)).status).toBe(401);
  });

  it("computes every method for an inline model, in the published contract", async () => {
    const a = await agentAs(["viewer"]);
    const longFactor = Array.from({ length: 64 }, () => 4);
    const methods = [
      { method: "default" }, { method: "linear" }, { method: "ntk" }, { method: "dynamic" }, { method: "yarn" },
      { method: "llama3" }, { method: "longrope", longFactor, shortFactor: longFactor.map(() => 1) }, { method: "base", base: 500_000 },
    ];
    const r = await post(a, { model, targetContext: 32_768, methods });
    expect(r.status).toBe(200);
    const body = analysisResponseSchema.parse(r.body);
    expect(body.criticalDimension).toBe(92); // Liu et al. 2023, Lemma 1
    expect(body.methods.map((m) => m.method)).toEqual(methods.map((m) => m.method));
    const yarn = body.methods[4];
    expect(yarn.params).toMatchObject({ factor: 8, betaFast: 32, betaSlow: 1, truncate: true });
    expect(yarn.attentionFactor).toBeCloseTo(1.2079, 4); // Peng et al. 2023, Eq. 22
    expect(yarn.ropeScaling).toEqual({
      rope_scaling: { rope_type: "yarn", factor: 8, beta_fast: 32, beta_slow: 1, original_max_position_embeddings: 4096 },
      max_position_embeddings: 32_768,
    });
    expect(body.methods[7].ropeScaling).toEqual({ rope_scaling: null, rope_theta: 500_000, max_position_embeddings: 32_768 });
    expect(body.methods[0].ropeScaling.rope_scaling).toBeNull();
  });

  it("resolves { modelId } from a stored profile, and answers 404 for an unknown id", async () => {
    const a = await agentAs(["researcher"]);
    const created = await a.post("/api/models").set("X-CSRF-Token", a.csrf).send({
      name: `analysis-${crypto.randomBytes(4).toString("hex")}`, family: "test", headDim: 128, ropeTheta: 500_000, trainedContext: 8192,
      layers: 32, attentionHeads: 32, kvHeads: 8, hiddenSize: 4096, parameters: 7e9,
    }).expect(201);
    const r = await post(a, { model: { modelId: created.body.model.id }, targetContext: 65_536, methods: [{ method: "llama3" }] });
    expect(r.status, JSON.stringify(r.body)).toBe(200);
    expect(r.body.model).toMatchObject({ headDim: 128, ropeTheta: 500_000, trainedContext: 8192, rotaryDim: 128, layers: 32, kvHeads: 8 });
    expect(r.body.model).not.toHaveProperty("name");
    expect(r.body.methods[0].params).toEqual({ method: "llama3", factor: 8, lowFreqFactor: 1, highFreqFactor: 4 });

    // model-dependent rules still apply after the lookup
    const short = await post(a, { model: { modelId: created.body.model.id }, targetContext: 8192, methods: [{ method: "linear" }] });
    expect(short.status).toBe(400);
    expect(short.body.error.fields).toHaveProperty("targetContext");
    expect((await post(a, { ...good, model: { modelId: 2_000_000_000 } })).status).toBe(404);
  });

  describe("names the field of every bad input", () => {
    const m = (method: object) => ({ ...good, methods: [method] });
    it.each([
      ["odd rotary dimension", { ...good, model: { ...model, headDim: 63 } }, "model.headDim"],
      ["zero head dimension", { ...good, model: { ...model, headDim: 0 } }, "model.headDim"],
      ["negative head dimension", { ...good, model: { ...model, headDim: -128 } }, "model.headDim"],
      ["odd partial rotary dimension", { ...good, model: { ...model, partialRotaryFactor: 0.3 } }, "model.partialRotaryFactor"],
      ["partialRotaryFactor 0", { ...good, model: { ...model, partialRotaryFactor: 0 } }, "model.partialRotaryFactor"],
      ["partialRotaryFactor above 1", { ...good, model: { ...model, partialRotaryFactor: 1.5 } }, "model.partialRotaryFactor"],
      ["base not above 1", { ...good, model: { ...model, ropeTheta: 1 } }, "model.ropeTheta"],
      ["target equal to trained", { ...good, targetContext: 4096 }, "targetContext"],
      ["target below trained", { ...m({ method: "ntk" }), targetContext: 2048 }, "targetContext"],
      ["factor below 1", m({ method: "linear", factor: 0.5 }), "methods.0.factor"],
      ["betaFast equal to betaSlow", m({ method: "yarn", betaFast: 4, betaSlow: 4 }), "methods.0.betaFast"],
      ["betaSlow above the default betaFast", m({ method: "yarn", betaSlow: 40 }), "methods.0.betaSlow"],
      ["highFreqFactor below lowFreqFactor", m({ method: "llama3", lowFreqFactor: 4, highFreqFactor: 2 }), "methods.0.highFreqFactor"],
      ["longrope list of wrong length", m({ method: "longrope", longFactor: [1, 2, 3], shortFactor: Array(64).fill(1) }), "methods.0.longFactor"],
      ["longrope short list of wrong length", m({ method: "longrope", longFactor: Array(64).fill(1), shortFactor: Array(65).fill(1) }), "methods.0.shortFactor"],
      ["longrope non-positive entry", m({ method: "longrope", longFactor: Array(64).fill(1), shortFactor: [...Array(63).fill(1), 0] }), "methods.0.shortFactor.63"],
      ["target beyond 2^31", { ...good, targetContext: 2 ** 31 + 1 }, "targetContext"],
      ["trained context beyond 2^31", { ...good, model: { ...model, trainedContext: 2 ** 31 + 1 } }, "model.trainedContext"],
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
    ])("%s", async (_label, body, field) => {
      await rejects(await agentAs(["viewer"]), body, field);
    });

    it("Infinity and -Infinity (1e999 in JSON) are refused, naming the field", async () => {
      const a = await agentAs(["viewer"]);
      for (const [json, field] of [
        ['{"model":{"headDim":128,"ropeTheta":1e999,"trainedContext":4096},"targetContext":32768,"methods":[{"method":"yarn"}]}', "model.ropeTheta"],
        ['{"model":{"headDim":128,"ropeTheta":10000,"trainedContext":4096},"targetContext":32768,"methods":[{"method":"linear","factor":1e999}]}', "methods.0.factor"],
        ['{"model":{"headDim":128,"ropeTheta":10000,"trainedContext":4096},"targetContext":-1e999,"methods":[{"method":"yarn"}]}', "targetContext"],
      ]) {
        const r = await postRaw(a, json);
        expect(r.status).toBe(400);
        expect(Object.keys(r.body.error.fields)).toContain(field);
      }
    });
  });
});
