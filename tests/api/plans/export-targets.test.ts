import request from "supertest";
import { describe, expect, it } from "vitest";
import { makeTestApp } from "../../setup/app";
import { ownerTestDb, testDb } from "../../setup/db";
import { createPlan, createProfile, decide, post } from "../../setup/plans";
import { exportEnvelopeSchema } from "../../../shared/schemas/plans";
import { backfillFingerprints } from "../../../server/db/backfill-fingerprints";

const { app, agentAs } = makeTestApp();

async function approvedPlan() {
  const researcher = await agentAs(["researcher"]);
  const model = await createProfile(researcher);
  const plan = await createPlan(researcher, model.id);
  await post(researcher, `/api/plans/${plan.id}/revisions/1/submit`).expect(200);
  const ap = await agentAs(["approver"]);
  await decide(ap, `/api/plans/${plan.id}/revisions/1/decisions`, { decision: "approve" }).expect(200);
  return { plan, researcher };
}

/** The sample profile (tests/fixtures/profiles.ts) as POST /api/exports takes it inline. */
const inlineModel = {
  headDim: 128,
  ropeTheta: 10000,
  trainedContext: 4096,
  attentionHeads: 32,
  hiddenSize: 4096,
  kvHeads: 8,
  layers: 32,
};

describe("revision fingerprints", () => {
  it("every revision carries the fingerprint of its final block, the same one POST /api/exports computes", async () => {
    const { plan, researcher } = await approvedPlan();
    const rev = await researcher.get(`/api/plans/${plan.id}/revisions/1`).expect(200);
    expect(rev.body.rotaryFingerprint).toMatch(/^[0-9a-f]{64}$/);
    const detail = await researcher.get(`/api/plans/${plan.id}`).expect(200);
    expect(detail.body.revisions[0].rotaryFingerprint).toBe(rev.body.rotaryFingerprint);
    const fresh = await post(researcher, "/api/exports", {
      model: inlineModel,
      targetContext: 32768,
      method: { method: "yarn" },
      targets: ["transformers-v4"],
    }).expect(200);
    expect(fresh.body.fingerprint).toBe(rev.body.rotaryFingerprint);
  });

  it("a revision made before the column existed gets its fingerprint from its stored content; its hash still verifies", async () => {
    const { plan, researcher } = await approvedPlan();
    const before = await researcher.get(`/api/plans/${plan.id}/revisions/1`).expect(200);
    const owner = ownerTestDb();
    await owner.pool.query("UPDATE plan_revisions SET rotary_fingerprint = NULL WHERE plan_id = $1", [plan.id]);
    // read before the backfill: computed from content on the fly
    const unfilled = await researcher.get(`/api/plans/${plan.id}/revisions/1`).expect(200);
    expect(unfilled.body.rotaryFingerprint).toBe(before.body.rotaryFingerprint);
    expect(await backfillFingerprints(owner.db)).toBeGreaterThanOrEqual(1);
    const row = await testDb().pool.query(
      "SELECT rotary_fingerprint, content_hash FROM plan_revisions WHERE plan_id = $1",
      [plan.id],
    );
    expect(row.rows[0].rotary_fingerprint).toBe(before.body.rotaryFingerprint);
    expect(row.rows[0].content_hash).toBe(before.body.contentHash);
    const verify = await researcher.get(`/api/plans/${plan.id}/revisions/1/verify`).expect(200);
    expect(verify.body.ok).toBe(true);
  });
});

describe("GET /api/plans/:id/approved/export?target=&stage=", () => {
  it("carries the fingerprint; with a target, that consumer's artifact, read-back and conformance", async () => {
    const { plan, researcher } = await approvedPlan();
    const plain = await researcher.get(`/api/plans/${plan.id}/approved/export`).expect(200);
    expect(plain.body).toMatchObject({ stage: null, fingerprint: expect.stringMatching(/^[0-9a-f]{64}$/) });
    expect(plain.body.target).toBeUndefined();
    const r = await researcher.get(`/api/plans/${plan.id}/approved/export?target=transformers-v4-early`).expect(200);
    const body = exportEnvelopeSchema.parse(r.body);
    expect(body.target!.id).toBe("transformers-v4-early");
    expect(body.target!.conformance.status).toBe("exact");
    // the 4.4x rules read the yarn ramp from max_position_embeddings: the patch keeps the trained length there
    expect(body.target!.artifact!.content).toMatchObject({ max_position_embeddings: 4096 });
    expect(body.target!.artifact!.text).toMatch(/"factor": 8\.0/);
  });

  it("every stage has its own block and fingerprint; a stage that does not exist is a 400 naming stage", async () => {
    const { plan, researcher } = await approvedPlan();
    const s1 = await researcher.get(`/api/plans/${plan.id}/approved/export?stage=1&target=transformers-v5`).expect(200);
    const s2 = await researcher.get(`/api/plans/${plan.id}/approved/export?stage=2&target=transformers-v5`).expect(200);
    const final = await researcher.get(`/api/plans/${plan.id}/approved/export`).expect(200);
    expect(s1.body).toMatchObject({ stage: 1, targetContext: 16384 });
    expect(s1.body.target.artifact.content.max_position_embeddings).toBe(16384);
    expect(s1.body.fingerprint).not.toBe(s2.body.fingerprint);
    expect(s2.body.fingerprint).toBe(final.body.fingerprint); // stage 2 stretches to the final target with the same method
    for (const [q, field] of [
      ["stage=3", "stage"],
      ["stage=0", "stage"],
      ["stage=x", "stage"],
      ["target=torch", "target"],
    ]) {
      const bad = await researcher.get(`/api/plans/${plan.id}/approved/export?${q}`);
      expect(bad.status, q).toBe(400);
      expect(Object.keys(bad.body.error.fields), q).toContain(field);
    }
  });

  it("works with an export:read token, and the audit records the target and stage", async () => {
    const { plan } = await approvedPlan();
    const infra = await agentAs(["infra"]);
    const created = await post(infra, "/api/tokens", { name: "pipeline", scopes: ["export:read"] }).expect(201);
    const r = await request(app)
      .get(`/api/plans/${plan.id}/approved/export?target=transformers-v4&stage=2&download=1`)
      .set("Authorization", `Bearer ${created.body.token}`)
      .expect(200);
    expect(r.headers["content-disposition"]).toContain(`ropewalk-plan-${plan.id}-r1-stage2-transformers-v4.json`);
    expect(r.body.target.conformance.status).toBe("exact");
    const audit = await testDb().pool.query(
      "SELECT detail FROM audit_events WHERE action = 'revision.exported' AND subject_id = $1",
      [String(plan.id)],
    );
    expect(audit.rows.map((a) => a.detail)).toContainEqual(
      expect.objectContaining({ via: "token", target: "transformers-v4", stage: 2 }),
    );
  });
});
