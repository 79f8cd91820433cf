import { describe, expect, it } from "vitest";
import { ROLES } from "../../shared/schemas";
import { makeTestApp } from "../setup/app";
import { testDb } from "../setup/db";
import { createPlan, createProfile, post, put } from "../setup/plans";
import type { Agent } from "../setup/app";
import { METHOD_CATALOG } from "../../shared/methods";

const { agentAs } = makeTestApp();
const uniq = () => Math.random().toString(36).slice(2, 8);
// An invented accelerator: 1e15 dense FLOP/s, 80 GB, 2 per hour (round numbers so the hand checks stay simple).
const accelerator = (over: object = {}) => ({
  name: `Skiff-${uniq()}`,
  memoryBytes: 80e9,
  peakFlops: 1e15,
  pricePerHour: 2,
  notes: "test",
  ...over,
});
async function makeAccelerator(a: Agent, over: object = {}) {
  return (await post(a, "/api/accelerators", accelerator(over)).expect(201)).body.accelerator as { id: number };
}

describe("accelerator catalog", () => {
  for (const role of ROLES) {
    const may = role === "infra" || role === "admin";
    it(`${role} ${may ? "keeps" : "reads but cannot change"} the catalog`, async () => {
      const a = await agentAs([role]);
      expect((await a.get("/api/accelerators")).status).toBe(200);
      const r = await post(a, "/api/accelerators", accelerator());
      expect(r.status).toBe(may ? 201 : 403);
      if (may) {
        expect(
          (await put(a, `/api/accelerators/${r.body.accelerator.id}`, { pricePerHour: 3 })).body.accelerator
            .pricePerHour,
        ).toBe(3);
        expect((await a.delete(`/api/accelerators/${r.body.accelerator.id}`).set("X-CSRF-Token", a.csrf)).status).toBe(
          204,
        );
      }
    });
  }
  it("bad catalog input → 400 naming the field", async () => {
    const a = await agentAs(["infra"]);
    const r = await post(a, "/api/accelerators", accelerator({ peakFlops: -1 }));
    expect(r.status).toBe(400);
    expect(r.body.error.fields).toHaveProperty("peakFlops");
  });
});

describe("POST /api/budgets/estimate", () => {
  it("resolves a stored model and accelerator; figures follow the formulas", async () => {
    const infra = await agentAs(["infra"]);
    const acc = await makeAccelerator(infra);
    // 32 layers × 32 heads × 128, 8 KV heads, N = 6.5e9 (the sample profile).
    const model = await createProfile(infra);
    const r = await post(infra, "/api/budgets/estimate", {
      model: { modelId: model.id },
      cluster: { acceleratorId: acc.id },
      accelerators: 64,
      utilization: 0.4,
      stages: [{ sequenceLength: 65536, steps: 400, globalBatch: 64 }],
    }).expect(200);
    const s = r.body.stages[0];
    // YaRN recipe tokens (Peng et al. 2023): 400 × 64 × 65 536 = 1 677 721 600 (derived).
    expect(s.tokens).toBe(1_677_721_600);
    // Kaplan et al. 2020, causal: 6N + 6·n_layer·n_ctx·d_attn = 6·6.5e9 + 6·32·65536·4096 (worked by hand),
    // × 4/3 for the default full checkpointing (one more forward pass, a third of the training figure).
    expect(s.flopsPerToken).toBe(((6 * 6.5e9 + 6 * 32 * 65536 * 4096) * 4) / 3);
    // KV cache: 2·32 layers·8 KV heads·128·2 bytes = 131 072 bytes per token.
    expect(s.kvCacheBytesPerToken).toBe(131072);
    // GPU-hours = FLOPs / (peak × MFU × 3600); cost = hours × price.
    const hours = (s.tokens * s.flopsPerToken) / (1e15 * 0.4 * 3600);
    expect(s.acceleratorHours).toBeCloseTo(hours, 6);
    expect(r.body.totals.cost).toBeCloseTo(hours * 2, 6);
    expect(r.body.assumptions.convention).toBe("causal");
    expect(r.body.resolved.acceleratorName).toMatch(/^Skiff-/);
  });

  const bad: [string, object, string][] = [
    ["zero accelerators", { accelerators: 0 }, "accelerators"],
    ["utilisation above 1", { utilization: 1.5 }, "utilization"],
    ["utilisation 0", { utilization: 0 }, "utilization"],
    [
      "non-positive sequence length",
      { stages: [{ sequenceLength: 0, steps: 1, globalBatch: 1 }] },
      "stages.0.sequenceLength",
    ],
    ["unknown accelerator", { cluster: { acceleratorId: 99999999 } }, "cluster.acceleratorId"],
    [
      "more than 32 stages",
      { stages: Array.from({ length: 33 }, () => ({ sequenceLength: 4096, steps: 1, globalBatch: 1 })) },
      "stages",
    ],
  ];
  for (const [label, over, field] of bad) {
    it(`${label} → 400 naming ${field}`, async () => {
      const a = await agentAs(["viewer"]);
      const r = await post(a, "/api/budgets/estimate", {
        model: { parameters: 7e9, layers: 32, attentionHeads: 32, kvHeads: 32, headDim: 128 },
        cluster: { peakFlops: 1e15, memoryBytes: 80e9, pricePerHour: 2 },
        accelerators: 8,
        utilization: 0.4,
        stages: [{ sequenceLength: 8192, steps: 10, globalBatch: 8 }],
        ...over,
      });
      expect(r.status).toBe(400);
      expect(Object.keys(r.body.error.fields)).toContain(field);
    });
  }
});

describe("budget inside a plan revision", () => {
  it("is computed on edit, frozen at submission, and untouched by later catalog price changes", async () => {
    const infra = await agentAs(["infra"]);
    const acc = await makeAccelerator(infra, { pricePerHour: 2 });
    const researcher = await agentAs(["researcher"]);
    const model = await createProfile(researcher);
    const plan = await createPlan(researcher, model.id);
    const base = `/api/plans/${plan.id}/revisions/1`;
    const edited = await put(researcher, base, {
      version: 1,
      budget: { cluster: { acceleratorId: acc.id }, accelerators: 64 },
    }).expect(200);
    const draft = await researcher.get(base).expect(200);
    const cost2 = draft.body.content.budget.estimate.totals.cost;
    expect(draft.body.content.budget.cluster).toMatchObject({ pricePerHour: 2 });
    expect(draft.body.content.budget.estimate.stages).toHaveLength(2);

    // Price changes before submission: the submitted revision carries the price at submission.
    await put(infra, `/api/accelerators/${acc.id}`, { pricePerHour: 3 }).expect(200);
    await post(researcher, `${base}/submit`).expect(200);
    const submitted = await researcher.get(base).expect(200);
    expect(submitted.body.content.budget.cluster.pricePerHour).toBe(3);
    expect(submitted.body.content.budget.estimate.totals.cost).toBeCloseTo(cost2 * 1.5, 6);
    expect(submitted.body.contentHash).not.toBe(edited.body.contentHash);

    // After submission the catalog no longer matters.
    await put(infra, `/api/accelerators/${acc.id}`, { pricePerHour: 10 }).expect(200);
    const later = await researcher.get(base).expect(200);
    expect(later.body.content.budget.estimate.totals.cost).toBe(submitted.body.content.budget.estimate.totals.cost);
    expect((await researcher.get(`${base}/verify`)).body.ok).toBe(true);
    const report = await researcher.get(`${base}/report`).expect(200);
    expect(report.text).toContain("Budget");
    // Method names come from the catalog, as on the plan screens (the plan and its stages use YaRN).
    expect(report.text).toContain(`<td>${METHOD_CATALOG.yarn.label} `);
    expect(report.text).toContain(`<td>${METHOD_CATALOG.yarn.short} `);
  });

  it("budget: null removes the sheet from a draft", async () => {
    const infra = await agentAs(["infra"]);
    const acc = await makeAccelerator(infra);
    const researcher = await agentAs(["researcher"]);
    const plan = await createPlan(researcher, (await createProfile(researcher)).id);
    const base = `/api/plans/${plan.id}/revisions/1`;
    await put(researcher, base, { version: 1, budget: { cluster: { acceleratorId: acc.id }, accelerators: 8 } }).expect(
      200,
    );
    expect((await researcher.get(base)).body.content.budget).toBeDefined();
    await put(researcher, base, { version: 2, budget: null }).expect(200);
    expect((await researcher.get(base)).body.content.budget).toBeUndefined();
  });

  it("a bad budget sheet names the plan's field", async () => {
    const researcher = await agentAs(["researcher"]);
    const model = await createProfile(researcher);
    const plan = await createPlan(researcher, model.id);
    const r = await put(researcher, `/api/plans/${plan.id}/revisions/1`, {
      version: 1,
      budget: { cluster: { acceleratorId: 99999999 }, accelerators: 8 },
    });
    expect(r.status).toBe(400);
    expect(Object.keys(r.body.error.fields)).toContain("budget.cluster.acceleratorId");
    const rows = await testDb().pool.query("SELECT version FROM plan_revisions WHERE plan_id = $1", [plan.id]);
    expect(rows.rows[0].version).toBe(1);
  });
});
