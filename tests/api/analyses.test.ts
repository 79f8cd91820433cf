import crypto from "node:crypto";
import { describe, expect, it } from "vitest";
import { makeTestApp, type Agent } from "../setup/app";
import { analyse } from "../../server/engine";
import { analysisResponseSchema, resolvedAnalysisRequestSchema } from "../../shared/schemas/analysis";
import { analysisColumnsResponseSchema } from "../../shared/schemas/analysis-columns";
import { expandAnalysis, packAnalysis } from "../../shared/analysis-columns";

const { agent, agentAs } = makeTestApp();
const model = { headDim: 128, ropeTheta: 10_000, trainedContext: 4096 };
const good = { model, targetContext: 32_768, methods: [{ method: "yarn" }] };

const post = (a: Agent, body: unknown) =>
  a
    .post("/api/analyses")
    .set("X-CSRF-Token", a.csrf)
    .send(body as object);
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
      { method: "default" },
      { method: "linear" },
      { method: "ntk" },
      { method: "dynamic" },
      { method: "yarn" },
      { method: "llama3" },
      { method: "longrope", longFactor, shortFactor: longFactor.map(() => 1) },
      { method: "base", base: 500_000 },
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
      rope_scaling: {
        rope_type: "yarn",
        factor: 8,
        beta_fast: 32,
        beta_slow: 1,
        original_max_position_embeddings: 4096,
      },
      max_position_embeddings: 32_768,
    });
    expect(body.methods[7].ropeScaling).toEqual({
      rope_scaling: null,
      rope_theta: 500_000,
      max_position_embeddings: 32_768,
    });
    expect(body.methods[0].ropeScaling.rope_scaling).toBeNull();
  });

  it("resolves { modelId } from a stored profile, and answers 404 for an unknown id", async () => {
    const a = await agentAs(["researcher"]);
    const created = await a
      .post("/api/models")
      .set("X-CSRF-Token", a.csrf)
      .send({
        name: `analysis-${crypto.randomBytes(4).toString("hex")}`,
        family: "test",
        headDim: 128,
        ropeTheta: 500_000,
        trainedContext: 8192,
        layers: 32,
        attentionHeads: 32,
        kvHeads: 8,
        hiddenSize: 4096,
        parameters: 7e9,
      })
      .expect(201);
    const r = await post(a, {
      model: { modelId: created.body.model.id },
      targetContext: 65_536,
      methods: [{ method: "llama3" }],
    });
    expect(r.status, JSON.stringify(r.body)).toBe(200);
    expect(r.body.model).toMatchObject({
      headDim: 128,
      ropeTheta: 500_000,
      trainedContext: 8192,
      rotaryDim: 128,
      layers: 32,
      kvHeads: 8,
    });
    expect(r.body.model).not.toHaveProperty("name");
    expect(r.body.methods[0].params).toEqual({ method: "llama3", factor: 8, lowFreqFactor: 1, highFreqFactor: 4 });

    // model-dependent rules still apply after the lookup
    const short = await post(a, {
      model: { modelId: created.body.model.id },
      targetContext: 8192,
      methods: [{ method: "linear" }],
    });
    expect(short.status).toBe(400);
    expect(short.body.error.fields).toHaveProperty("targetContext");
    expect((await post(a, { ...good, model: { modelId: 2_000_000_000 } })).status).toBe(404);
  });

  describe("names the field of every bad input", () => {
    // The full table of bad bodies runs against the same schema in tests/unit/schemas/analysis-request.test.ts;
    // this case proves the route answers that 400 with the field named.
    it("a target not above the trained context is a 400 naming targetContext", async () => {
      await rejects(await agentAs(["viewer"]), { ...good, targetContext: 4096 }, "targetContext");
    });

    it("Infinity and -Infinity (1e999 in JSON) are refused, naming the field", async () => {
      const a = await agentAs(["viewer"]);
      for (const [json, field] of [
        [
          '{"model":{"headDim":128,"ropeTheta":1e999,"trainedContext":4096},"targetContext":32768,"methods":[{"method":"yarn"}]}',
          "model.ropeTheta",
        ],
        [
          '{"model":{"headDim":128,"ropeTheta":10000,"trainedContext":4096},"targetContext":32768,"methods":[{"method":"linear","factor":1e999}]}',
          "methods.0.factor",
        ],
        [
          '{"model":{"headDim":128,"ropeTheta":10000,"trainedContext":4096},"targetContext":-1e999,"methods":[{"method":"yarn"}]}',
          "targetContext",
        ],
      ]) {
        const r = await postRaw(a, json);
        expect(r.status).toBe(400);
        expect(Object.keys(r.body.error.fields)).toContain(field);
      }
    });
  });
});

describe('POST /api/analyses with form: "columns"', () => {
  it("answers the column form, which expands to exactly the default row form's numbers", async () => {
    const a = await agentAs(["viewer"]);
    const longFactor = Array.from({ length: 64 }, (_, i) => 1 + i / 8);
    const body = {
      model,
      targetContext: 65_536,
      methods: [
        { method: "yarn" },
        { method: "llama3" },
        { method: "longrope", longFactor, shortFactor: longFactor.map(() => 1) },
      ],
    };
    const rows = await post(a, body);
    const columns = await post(a, { ...body, form: "columns" });
    expect(rows.status).toBe(200);
    expect(columns.status).toBe(200);
    expect(rows.body.form).toBeUndefined();
    const packed = analysisColumnsResponseSchema.parse(columns.body);
    expect(expandAnalysis(packed)).toEqual(analysisResponseSchema.parse(rows.body));
    expect(JSON.stringify(columns.body).length).toBeLessThan(JSON.stringify(rows.body).length / 2);
  });

  it("refuses an unknown form naming the field", async () => {
    await rejects(await agentAs(["viewer"]), { ...good, form: "table" }, "form");
  });
});

describe("POST /api/analyses answers a kept question from prepared bytes", () => {
  /** The decoded body as bytes; Content-Encoding and Content-Length tell what was on the wire. */
  const bytesOf = (a: Agent, body: object, acceptEncoding: string) =>
    post(a, body)
      .set("Accept-Encoding", acceptEncoding)
      .buffer(true)
      .parse((res, cb) => {
        const chunks: Buffer[] = [];
        res.on("data", (c: Buffer) => chunks.push(c));
        res.on("end", () => cb(null, Buffer.concat(chunks)));
      });

  it("sends the same JSON in every encoding, first time and asked again, compressed only when accepted", async () => {
    const a = await agentAs(["viewer"]);
    // A target no other test asks, so the first answer is computed here and the later ones are kept.
    const body = { model, targetContext: 98_765, methods: [{ method: "yarn" }, { method: "ntk" }], form: "columns" };
    const first = await bytesOf(a, body, "identity");
    expect(first.status).toBe(200);
    expect(first.headers["content-encoding"]).toBeUndefined();
    expect(first.headers["content-type"]).toMatch(/^application\/json/);
    expect(first.headers.vary).toMatch(/Accept-Encoding/i);
    const json = first.body as Buffer;
    expect(Number(first.headers["content-length"])).toBe(json.length);
    analysisColumnsResponseSchema.parse(JSON.parse(json.toString()));
    for (const [accept, encoding] of [
      ["gzip", "gzip"],
      ["br", "br"],
      ["identity", undefined],
      ["gzip, br", "gzip"], // equal weights: the client's order decides (RFC 9110 §12.5.3 leaves it to the server)
      ["gzip;q=0.5, br", "br"],
    ] as const) {
      const again = await bytesOf(a, body, accept);
      expect(again.status, accept).toBe(200);
      expect(again.headers["content-encoding"], accept).toBe(encoding);
      expect(again.headers.vary).toMatch(/Accept-Encoding/i);
      expect((again.body as Buffer).equals(json), accept).toBe(true);
      // what went over the wire is smaller than the JSON when compressed
      if (encoding) expect(Number(again.headers["content-length"])).toBeLessThan(json.length / 2);
    }
    // The row form of the same question is kept beside it and expands to the same numbers.
    const rows = await bytesOf(a, { ...body, form: undefined }, "gzip");
    expect(expandAnalysis(analysisColumnsResponseSchema.parse(JSON.parse(json.toString())))).toEqual(
      analysisResponseSchema.parse(JSON.parse((rows.body as Buffer).toString())),
    );
  });

  it("derives the form not yet kept from the kept bytes: the same JSON as the engine's answer, byte for byte", async () => {
    const a = await agentAs(["viewer"]);
    // Targets no other test asks. Each question's first form is computed, the second derived from the kept one.
    const ask = (targetContext: number) => ({
      model,
      targetContext,
      methods: [{ method: "yarn" }, { method: "base", base: 5e5 }],
    });
    const engine = (targetContext: number) => analyse(resolvedAnalysisRequestSchema.parse(ask(targetContext)));
    const text = async (body: object) => ((await bytesOf(a, body, "identity")).body as Buffer).toString();
    // columns first, then rows
    expect(await text({ ...ask(77_777), form: "columns" })).toBe(JSON.stringify(packAnalysis(engine(77_777))));
    expect(await text(ask(77_777))).toBe(JSON.stringify(engine(77_777)));
    // rows first, then columns
    expect(await text(ask(77_778))).toBe(JSON.stringify(engine(77_778)));
    expect(await text({ ...ask(77_778), form: "columns" })).toBe(JSON.stringify(packAnalysis(engine(77_778))));
  });
});
