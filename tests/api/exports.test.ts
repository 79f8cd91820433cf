import { describe, expect, it } from "vitest";
import { makeTestApp, type Agent } from "../setup/app";
import { exportResponseSchema, exportTargetsResponseSchema } from "../../shared/schemas/exports";
import { applyMergePatch } from "../../server/engine/targets";

const { agent, agentAs } = makeTestApp();
const model = { headDim: 128, ropeTheta: 500_000, trainedContext: 8192, attentionHeads: 32, hiddenSize: 4096 };
const good = { model, targetContext: 32_768, method: { method: "yarn" } };

const post = (a: Agent, body: unknown) =>
  a
    .post("/api/exports")
    .set("X-CSRF-Token", a.csrf)
    .send(body as object);

describe("GET /api/export-targets", () => {
  it("lists the six targets with consumer, versions and artifact kind", async () => {
    const a = await agentAs(["researcher"]);
    const r = await a.get("/api/export-targets");
    expect(r.status).toBe(200);
    const body = exportTargetsResponseSchema.parse(r.body);
    expect(body.targets.map((t) => t.id)).toEqual([
      "transformers-v4-early",
      "transformers-v4",
      "transformers-v5",
      "vllm",
      "sglang",
      "llama-cpp",
    ]);
    expect(body.targets[0]).toMatchObject({ consumer: "huggingface/transformers", artifactKind: "config-merge-patch" });
  });
  it("needs a signed-in user", async () => {
    expect((await (await agent()).get("/api/export-targets")).status).toBe(401);
  });
});

describe("POST /api/exports", () => {
  it("returns the plan's θ′, attention factor, fingerprint and per-target artifact, read-back and conformance", async () => {
    const a = await agentAs(["researcher"]);
    const r = await post(a, { ...good, targets: ["transformers-v4-early", "transformers-v5"] });
    expect(r.status, JSON.stringify(r.body)).toBe(200);
    const body = exportResponseSchema.parse(r.body);
    expect(body.rotaryDim).toBe(128);
    expect(body.invFreq).toHaveLength(64);
    expect(body.fingerprint).toMatch(/^[0-9a-f]{64}$/);
    expect(body.attentionFactor).toBeCloseTo(0.1 * Math.log(4) + 1, 15); // YaRN Eq. 22, s = 4
    expect(body.targets.map((t) => t.id)).toEqual(["transformers-v4-early", "transformers-v5"]);
    for (const t of body.targets) {
      expect(t.conformance.status).toBe("exact");
      expect(t.readBack!.invFreq).toHaveLength(64);
      // text is the downloadable bytes: it parses to the content, with floats written as floats
      expect(JSON.parse(t.artifact!.text)).toEqual(t.artifact!.content);
      expect(t.artifact!.text).toMatch(/"factor": 4\.0/);
    }
    const early = body.targets[0].artifact!.content;
    expect(applyMergePatch({ max_position_embeddings: 8192 }, early)).toMatchObject({ max_position_embeddings: 8192 });
  });
  it("all targets when none are named; the same fingerprint for the same plan", async () => {
    const a = await agentAs(["researcher"]);
    const [one, two] = await Promise.all([post(a, good), post(a, good)]);
    expect(one.body.targets).toHaveLength(6);
    expect(one.body.fingerprint).toBe(two.body.fingerprint);
  });
  it("a shape with multimodal sections keeps them in every config patch, NTK-aware (a new base) included", async () => {
    // Their attention reads rope_scaling["mrope_section"] every step (server/engine/targets/hf/compile.ts cites where).
    const a = await agentAs(["researcher"]);
    const r = await post(a, {
      ...good,
      method: { method: "ntk" },
      mropeSection: [16, 24, 24],
      targets: ["transformers-v4-early", "transformers-v4", "transformers-v5"],
    });
    expect(r.status, JSON.stringify(r.body)).toBe(200);
    const [early, v4, v5] = exportResponseSchema.parse(r.body).targets.map((t) => t.artifact!.content);
    const base = { rope_theta: 500_000, rope_scaling: { rope_type: "default", mrope_section: [16, 24, 24] } };
    for (const patch of [early, v4])
      expect(applyMergePatch(base, patch)).toMatchObject({
        rope_scaling: { rope_type: "default", mrope_section: [16, 24, 24] },
      });
    expect(applyMergePatch(base, v5)).toMatchObject({
      rope_parameters: { rope_type: "default", mrope_section: [16, 24, 24] },
    });
    const bad = await post(a, { ...good, mropeSection: [0, 24] });
    expect(bad.status).toBe(400);
    expect(Object.keys(bad.body.error.fields)).toContain("mropeSection.0");
  });
  it("names the bad field in a 400 and never answers 500", async () => {
    const a = await agentAs(["researcher"]);
    const cases: [unknown, string][] = [
      [{ ...good, targets: ["transformers-v3"] }, "targets.0"],
      [{ ...good, targets: [] }, "targets"],
      [{ ...good, method: { method: "yarn", factor: -1 } }, "method.factor"],
      [{ ...good, model: { ...model, headDim: 0 } }, "model.headDim"],
      [{ ...good, targetContext: 0 }, "targetContext"],
      [{ ...good, model: { modelId: 2 ** 31 - 1 } }, ""],
      [{ ...good, method: { method: "longrope", longFactor: [1, 2], shortFactor: [1, 1] } }, "method.longFactor"],
    ];
    for (const [body, field] of cases) {
      const r = await post(a, body);
      if (field === "") {
        expect(r.status).toBe(404);
        continue;
      }
      expect(r.status, JSON.stringify(body)).toBe(400);
      expect(Object.keys(r.body.error.fields ?? {}), JSON.stringify(r.body)).toContain(field);
    }
  });
});
