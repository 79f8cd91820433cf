import fs from "node:fs";
import path from "node:path";
import { describe, expect, it } from "vitest";
import { makeTestApp, type Agent } from "../../setup/app";
import { testDb } from "../../setup/db";
import { createProfile, decide, post, twoStageRevision } from "../../setup/plans";

/*
 * Lineage (issue 11): plans on a model that already ships scaling, and stage chains. Check values are worked by hand
 * beside each assertion. The consumers' reading (one block, computed from the pre-trained base frequencies and the
 * pre-trained length in original_max_position_embeddings) is cited in shared/lineage.ts and
 * server/features/models/lineage-lengths.ts.
 */
const { agentAs } = makeTestApp();
const fixture = (n: string) => fs.readFileSync(path.join(import.meta.dirname, "../../fixtures/configs", n));

/** already-scaled-yarn.json: pre-trained 8192, YaRN ×4, served 32768. */
async function importScaled(a: Agent) {
  const r = await a
    .post("/api/models/import?save=true")
    .set("X-CSRF-Token", a.csrf)
    .field("overrides", JSON.stringify({ name: `laid-rope ${Math.random().toString(36).slice(2, 8)}` }))
    .attach("file", fixture("already-scaled-yarn.json"), "config.json");
  if (r.status !== 200 && r.status !== 201) throw new Error(`import: ${r.status} ${JSON.stringify(r.body)}`);
  return r.body.saved as { id: number; pretrainedContext: number; servedContext: number };
}

const stage = (targetContext: number, method: Record<string, unknown>) => ({
  targetContext,
  method,
  steps: 100,
  globalBatch: 32,
  sequenceLength: targetContext,
  learningRate: 2e-5,
  dataMix: "",
});

/** From served 32768: stage 1 ×2 on the served length (→ 65536), stage 2 to 131072 with the factor left empty. */
const fromServed = () => ({
  targetContext: 131072,
  extendsFrom: "served",
  method: { method: "yarn", factor: 4 },
  stages: [stage(65536, { method: "yarn", factor: 2 }), stage(131072, { method: "yarn" })],
  acceptance: [],
  notes: "",
});

async function approved(a: Agent, modelId: number, revision: object) {
  const r = await post(a, "/api/plans", {
    title: `Lineage ${Math.random().toString(36).slice(2, 7)}`,
    modelId,
    revision,
  });
  if (r.status !== 201) throw new Error(`plan: ${r.status} ${JSON.stringify(r.body)}`);
  await post(a, `/api/plans/${r.body.id}/revisions/1/submit`).expect(200);
  const ap = await agentAs(["approver"]);
  await decide(ap, `/api/plans/${r.body.id}/revisions/1/decisions`, { decision: "approve" }).expect(200);
  return r.body.id as number;
}

describe("a plan that extends from the served length of an already-scaled model", () => {
  it("exports ×4 on top of the shipped ×4 as factor 16 over original 8192, never compounding or dropping it", async () => {
    const a = await agentAs(["researcher"]);
    const model = await importScaled(a);
    expect(model).toMatchObject({ pretrainedContext: 8192, servedContext: 32768 });
    const id = await approved(a, model.id, fromServed());
    const r = await a.get(`/api/plans/${id}/approved/export`).expect(200);
    // 4 × 32768/8192 = 16 = 131072/8192: the factor and both lengths agree, as loaders derive them from each other.
    expect(r.body.config).toMatchObject({
      rope_scaling: { rope_type: "yarn", factor: 16, original_max_position_embeddings: 8192 },
      max_position_embeddings: 131072,
    });
    expect(r.body).toMatchObject({
      extendsFrom: "served",
      startContext: 32768,
      method: { method: "yarn", factor: 16 },
    });
    // YaRN's default attention factor 0.1·ln 16 + 1 = 1.277259 (Peng et al. 2023, eq. 22; from memory).
    expect(r.body.attentionFactor).toBeCloseTo(1.277259, 5);
    // the revision keeps the author's ×4, as typed
    const rev = await a.get(`/api/plans/${id}/revisions/1`).expect(200);
    expect(rev.body.content.method).toEqual({ method: "yarn", factor: 4 });
    expect(rev.body.content.model.lineage).toEqual({
      servedContext: 32768,
      shipped: { method: "yarn", factor: 4, betaFast: 32, betaSlow: 1 },
    });
  });

  it("each stage's export is right for a checkpoint that finished the stage before it", async () => {
    const a = await agentAs(["researcher"]);
    const model = await importScaled(a);
    const id = await approved(a, model.id, fromServed());
    // stage 1: the served checkpoint (YaRN ×4 over 8192) stretched ×2 → ×8 over 8192, max 65536 = 8 × 8192
    const s1 = await a.get(`/api/plans/${id}/approved/export?stage=1&target=transformers-v4`).expect(200);
    expect(s1.body).toMatchObject({ stage: 1, startContext: 32768, targetContext: 65536 });
    expect(s1.body.config.rope_scaling).toMatchObject({ factor: 8, original_max_position_embeddings: 8192 });
    expect(s1.body.target.artifact.content).toMatchObject({
      rope_scaling: { rope_type: "yarn", factor: 8, original_max_position_embeddings: 8192 },
      max_position_embeddings: 65536,
    });
    expect(s1.body.target.conformance.status).toBe("exact");
    // stage 2: the stage-1 checkpoint (trained at 65536) → 131072 with the factor left empty: 131072/8192 = 16
    const s2 = await a.get(`/api/plans/${id}/approved/export?stage=2&target=transformers-v5`).expect(200);
    expect(s2.body).toMatchObject({ stage: 2, startContext: 65536, targetContext: 131072 });
    expect(s2.body.config.rope_scaling).toMatchObject({ factor: 16, original_max_position_embeddings: 8192 });
    expect(s2.body.target.conformance.status).toBe("exact");
    // POST /api/exports with the same stage (its target and method, from the served length) compiles the same block
    const fresh = await post(a, "/api/exports", {
      model: { modelId: model.id },
      targetContext: 65536,
      method: { method: "yarn", factor: 2 },
      extendsFrom: "served",
      targets: ["transformers-v4"],
    }).expect(200);
    expect(fresh.body.fingerprint).toBe(s1.body.fingerprint);
    expect(fresh.body.targets[0].artifact.text).toBe(s1.body.target.artifact.text);
  });

  it("keeping the model as shipped exports the config's own block", async () => {
    const a = await agentAs(["researcher"]);
    const model = await importScaled(a);
    const id = await approved(a, model.id, {
      targetContext: 32768,
      extendsFrom: "served",
      method: { method: "yarn", betaFast: 32, betaSlow: 1 },
      stages: [],
      acceptance: [],
      notes: "kept as shipped",
    });
    const r = await a.get(`/api/plans/${id}/approved/export`).expect(200);
    expect(r.body.config).toMatchObject({
      rope_scaling: {
        rope_type: "yarn",
        factor: 4,
        original_max_position_embeddings: 8192,
        beta_fast: 32,
        beta_slow: 1,
      },
      max_position_embeddings: 32768,
    });
  });

  it("refuses what would drop the shipped scaling or go back along the chain, naming the field; nothing is written", async () => {
    const a = await agentAs(["researcher"]);
    const model = await importScaled(a);
    const plain = await createProfile(a);
    const count = async () => Number((await testDb().pool.query("SELECT count(*) FROM plans")).rows[0].count);
    const before = await count();
    const cases: [number, object, string][] = [
      [model.id, { ...fromServed(), method: { method: "default" } }, "method.method"],
      [model.id, { ...fromServed(), targetContext: 16384, stages: [] }, "targetContext"],
      [model.id, { ...fromServed(), stages: [stage(16384, { method: "yarn" })] }, "stages.0.targetContext"],
      [plain.id, { ...twoStageRevision(), extendsFrom: "served" }, "extendsFrom"],
      [plain.id, { ...twoStageRevision(), stages: [...twoStageRevision().stages].reverse() }, "stages.1.targetContext"],
      [model.id, { ...fromServed(), extendsFrom: "halfway" }, "revision.extendsFrom"],
    ];
    for (const [modelId, revision, field] of cases) {
      const r = await post(a, "/api/plans", { title: "refused", modelId, revision });
      expect(r.status, field).toBe(400);
      expect(Object.keys(r.body.error.fields), field).toContain(field);
    }
    expect(await count()).toBe(before);
  });
});

describe("stage chains from the pre-trained length", () => {
  it("stage n's factor is its target over the pre-trained length: 16384/4096 = 4, then 32768/4096 = 8", async () => {
    const a = await agentAs(["researcher"]);
    const plain = await createProfile(a);
    const id = await approved(a, plain.id, twoStageRevision());
    const s1 = await a.get(`/api/plans/${id}/approved/export?stage=1`).expect(200);
    const s2 = await a.get(`/api/plans/${id}/approved/export?stage=2`).expect(200);
    expect(s1.body.config).toMatchObject({
      rope_scaling: { factor: 4, original_max_position_embeddings: 4096 },
      max_position_embeddings: 16384,
    });
    expect(s2.body.config).toMatchObject({
      rope_scaling: { factor: 8, original_max_position_embeddings: 4096 },
      max_position_embeddings: 32768,
    });
    // a model that ships no scaling says nothing about lineage in its export
    expect(s1.body.extendsFrom).toBeUndefined();
  });
});
