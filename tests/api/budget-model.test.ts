import { describe, expect, it } from "vitest";
import { makeTestApp } from "../setup/app";
import { ownerTestDb } from "../setup/db";
import { createPlan, createProfile, decide, post, put } from "../setup/plans";
import { budgetV1 } from "../fixtures/budget-v1";
import { hashContent } from "../../server/features/plans/revision-content";

const { agentAs } = makeTestApp();
const uniq = () => Math.random().toString(36).slice(2, 8);
const cluster = { peakFlops: 1e15, memoryBytes: 80e9, pricePerHour: 2 };
const stage128k = { sequenceLength: 131_072, steps: 10, globalBatch: 64 };

describe("estimate with budget model 2", () => {
  it("reads the vocabulary from an imported profile's config; the request can add it otherwise", async () => {
    const editor = await agentAs(["researcher"]);
    // A hand-written config of a round shape (not a released model), imported and saved with its file.
    const config = {
      architectures: ["LlamaForCausalLM"],
      hidden_size: 4096,
      num_attention_heads: 32,
      num_key_value_heads: 8,
      num_hidden_layers: 32,
      intermediate_size: 11008,
      max_position_embeddings: 4096,
      rope_theta: 10000,
      vocab_size: 128_256,
      torch_dtype: "bfloat16",
    };
    const saved = await editor
      .post("/api/models/import?save=true")
      .set("X-CSRF-Token", editor.csrf)
      .field("overrides", JSON.stringify({ name: `Hawser-${uniq()}`, parameters: 8e9 }))
      .attach("file", Buffer.from(JSON.stringify(config)), "config.json");
    expect(saved.status).toBe(201);
    const imported = saved.body.saved as { id: number };
    const plain = await createProfile(editor);
    const body = (model: object) => ({ model, cluster, accelerators: 64, stages: [stage128k] });
    const a = await post(editor, "/api/budgets/estimate", body({ modelId: imported.id })).expect(200);
    // 131 072 × 128 256 × 4 bytes = 67 243 081 728 (stated convention; memory.test.ts)
    expect(a.body.stages[0].trainingMemory.logits).toBe(67_243_081_728);
    expect(a.body.assumptions.vocabSize).toBe(128_256);
    const b = await post(editor, "/api/budgets/estimate", body({ modelId: plain.id })).expect(200);
    expect(b.body.assumptions.vocabSize).toBeNull();
    expect(b.body.stages[0].warnings.join(" ")).toMatch(/vocabulary size is not given/);
    const c = await post(editor, "/api/budgets/estimate", body({ modelId: plain.id, vocabSize: 32_000 })).expect(200);
    expect(c.body.stages[0].trainingMemory.logits).toBe(131_072 * 32_000 * 4);
    expect(typeof c.body.currency).toBe("string");
  });

  it("an imported layered profile's local-window layers hold at most their window (kv-cache.test.ts arithmetic)", async () => {
    const researcher = await agentAs(["researcher"]);
    // A hand-written layered config (round shape, not a released model): 3 local layers then 1 global, 8 times.
    const config = {
      architectures: ["LlamaForCausalLM"],
      hidden_size: 4096,
      num_attention_heads: 32,
      num_key_value_heads: 8,
      head_dim: 128,
      num_hidden_layers: 32,
      max_position_embeddings: 8192,
      rope_theta: 10000,
      sliding_window: 4096,
      layer_types: Array.from({ length: 32 }, (_, i) => (i % 4 === 3 ? "full_attention" : "sliding_attention")),
      vocab_size: 32_000,
    };
    const saved = await researcher
      .post("/api/models/import?save=true")
      .set("X-CSRF-Token", researcher.csrf)
      .field("overrides", JSON.stringify({ name: `Marline-${uniq()}`, parameters: 8e9 }))
      .attach("file", Buffer.from(JSON.stringify(config)), "config.json");
    expect(saved.status).toBe(201);
    const r = await post(researcher, "/api/budgets/estimate", {
      model: { modelId: saved.body.saved.id },
      cluster,
      accelerators: 64,
      stages: [stage128k],
    }).expect(200);
    // 8 full layers × 4096 bytes × 131 072 + 24 local layers × 4096 bytes × 4096 = 4 697 620 480
    expect(r.body.stages[0].kvCacheBytesPerSequence).toBe(4_697_620_480);
    expect(r.body.resolved.model.layerGroups).toHaveLength(2);
  });

  it("a measured throughput above the peak is a 400 naming measuredTokensPerSecond, not a 500", async () => {
    const viewer = await agentAs(["viewer"]);
    const r = await post(viewer, "/api/budgets/estimate", {
      model: { parameters: 7e9, layers: 32, attentionHeads: 32, kvHeads: 8, headDim: 128 },
      cluster,
      accelerators: 8,
      measuredTokensPerSecond: 1e8,
      stages: [{ sequenceLength: 8192, steps: 10, globalBatch: 8 }],
    });
    expect(r.status).toBe(400);
    expect(r.body.error.fields).toHaveProperty("measuredTokensPerSecond");
    // Far below the peak: hours would grow without bound, refused like a utilisation under 0.001.
    const slow = await post(viewer, "/api/budgets/estimate", {
      model: { parameters: 7e9, layers: 32, attentionHeads: 32, kvHeads: 8, headDim: 128 },
      cluster,
      accelerators: 8,
      measuredTokensPerSecond: 0.001,
      stages: [{ sequenceLength: 8192, steps: 10, globalBatch: 8 }],
    });
    expect(slow.status).toBe(400);
    expect(slow.body.error.fields.measuredTokensPerSecond).toMatch(/under 0\.1%/);
  });

  it("a context-parallel degree that does not divide the plan's stages names budget.contextParallel", async () => {
    const researcher = await agentAs(["researcher"]);
    const plan = await createPlan(researcher, (await createProfile(researcher)).id);
    // the stages are 16 384 and 32 768 tokens; 2 × 3 = 6 divides neither
    const r = await put(researcher, `/api/plans/${plan.id}/revisions/1`, {
      version: 1,
      budget: { cluster, accelerators: 64, contextParallel: 3 },
    });
    expect(r.status).toBe(400);
    expect(r.body.error.fields).toHaveProperty("budget.contextParallel");
  });
});

describe("frozen budgets keep the model they were signed with", () => {
  it("a new revision freezes budget model 2 with its currency", async () => {
    const researcher = await agentAs(["researcher"]);
    const plan = await createPlan(researcher, (await createProfile(researcher)).id);
    const base = `/api/plans/${plan.id}/revisions/1`;
    await put(researcher, base, {
      version: 1,
      budget: { cluster, accelerators: 64, contextParallel: 2, lossChunks: 4, vocabSize: 32_000 },
    }).expect(200);
    const b = (await researcher.get(base).expect(200)).body.content.budget;
    expect(b.budgetModel).toBe(2);
    expect(b.currency).toMatch(/^[A-Z]{3}$/);
    expect(b.estimate.assumptions).toMatchObject({ contextParallel: 2, lossChunks: 4, vocabSize: 32_000 });
    const report = await researcher.get(`${base}/report`).expect(200);
    expect(report.text).toContain('id="budget-convention-activations"');
    expect(report.text.match(/id="budget-convention-activations"/g)).toHaveLength(1);
  });

  it("a revision frozen under budget model 1 still verifies, and shows its old figures as signed", async () => {
    const researcher = await agentAs(["researcher"]);
    const approver = await agentAs(["approver"]);
    const plan = await createPlan(researcher, (await createProfile(researcher)).id);
    const base = `/api/plans/${plan.id}/revisions/1`;
    await post(researcher, `${base}/submit`).expect(200);
    // As a database administrator would find a revision stored before budget model 2: its content carries the old
    // budget and its hash covers it. (Written in review, so the approval below signs that hash.)
    const owner = ownerTestDb();
    const row = await owner.pool.query("SELECT id, content FROM plan_revisions WHERE plan_id = $1", [plan.id]);
    const content = { ...row.rows[0].content, budget: budgetV1() };
    const hash = hashContent(content);
    await owner.pool.query("UPDATE plan_revisions SET content = $1, content_hash = $2 WHERE id = $3", [
      content,
      hash,
      row.rows[0].id,
    ]);
    await decide(approver, `${base}/decisions`, { decision: "approve", comment: "ok" }).expect(200);

    const verify = (await researcher.get(`${base}/verify`).expect(200)).body;
    expect(verify).toMatchObject({ ok: true, hashIntact: true, storedHash: hash, computedHash: hash });
    const shown = (await researcher.get(base).expect(200)).body.content.budget;
    expect(shown).toEqual(budgetV1());
    const report = await researcher.get(`${base}/report`).expect(200);
    expect(report.text).toContain("recomputation 0");
    expect(report.text).toContain("Activations per accelerator, full recomputation");
    expect(report.text).not.toContain("budget-convention-");
  });
});

describe("workspace currency", () => {
  it("only an admin changes it; a bad code is a 400 naming currency and writes nothing", async () => {
    const infra = await agentAs(["infra"]);
    expect((await put(infra, "/api/budgets/currency", { currency: "EUR" })).status).toBe(403);
    const admin = await agentAs(["admin"]);
    const before = (await admin.get("/api/budgets/currency").expect(200)).body.currency;
    const r = await put(admin, "/api/budgets/currency", { currency: `e${uniq()}` });
    expect(r.status).toBe(400);
    expect(r.body.error.fields).toHaveProperty("currency");
    expect((await admin.get("/api/budgets/currency").expect(200)).body.currency).toBe(before);
  });
});
