import { describe, expect, it } from "vitest";
import { makeTestApp } from "../../setup/app";
import { ownerTestDb } from "../../setup/db";
import { createPlan, createProfile, twoStageRevision } from "../../setup/plans";

const { agentAs } = makeTestApp();

/*
 * A plan adopting a new base says whether that base reaches the target: the complete supported length under the
 * Men et al. 2024 bound (first m with Σ cos(m·θ_i) < 0), computed when the revision is built and kept beside it.
 * Check values for d = 128: b = 1 000 000 supports 27 115 tokens and b = 500 000 supports 18 438 (derived in
 * docs/rotary-scaling.md and checked against the plain cosine sum in tests/unit/engine/base-bound.test.ts).
 */
const planWithBase = async (base: number, targetContext: number) => {
  const researcher = await agentAs(["researcher"]);
  const model = await createProfile(researcher); // d = 128, base 10 000, trained 4096
  const revision = { ...twoStageRevision(), targetContext, method: { method: "base" as const, base } };
  revision.stages = revision.stages.map((s) => ({ ...s, targetContext: Math.min(s.targetContext, targetContext) }));
  revision.acceptance = revision.acceptance.map((a) => ({ ...a, contextLength: targetContext }));
  const plan = await createPlan(researcher, model.id, { revision });
  return { researcher, plan, url: `/api/plans/${plan.id}/revisions/1` };
};

describe("new-base plans", () => {
  it("a base that falls short says where it fails; the report prints bases with digit grouping", async () => {
    const { researcher, url } = await planWithBase(1_000_000, 32768);
    const rev = (await researcher.get(url).expect(200)).body;
    expect(rev.adoptedBases).toEqual([
      { base: 1_000_000, target: 32768, supportedLength: 27115, reachesTarget: false },
    ]);
    const report = (await researcher.get(`${url}/report`).expect(200)).text;
    expect(report).toContain("New base 1,000,000");
    expect(report).toContain("27,115");
    expect(report).not.toMatch(/base=1000000\b/);
  });

  it("a base large enough reaches the target (complete scan), and a plan keeping its base lists none", async () => {
    const { researcher, url } = await planWithBase(500_000, 16384);
    // 18 438 ≥ 16 384: no position below the target fails.
    expect((await researcher.get(url)).body.adoptedBases).toEqual([
      { base: 500_000, target: 16384, supportedLength: null, reachesTarget: true },
    ]);
    const model = await createProfile(researcher);
    const kept = await createPlan(researcher, model.id);
    expect((await researcher.get(`/api/plans/${kept.id}/revisions/1`)).body.adoptedBases).toEqual([]);
  });

  it("is kept outside the content: a revision from before the column reads the same answer and the same hash", async () => {
    const { researcher, plan, url } = await planWithBase(1_000_000, 32768);
    const before = (await researcher.get(url)).body;
    await ownerTestDb().pool.query("UPDATE plan_revisions SET base_support = NULL WHERE plan_id = $1", [plan.id]);
    const after = (await researcher.get(url)).body;
    expect(after.adoptedBases).toEqual(before.adoptedBases);
    expect(after.contentHash).toBe(before.contentHash);
    expect(JSON.stringify(after.content)).not.toContain("reachesTarget");
    expect((await researcher.get(`${url}/verify`)).body.hashIntact).toBe(true);
  });
});
