import { describe, expect, it } from "vitest";
import { makeTestApp } from "../../setup/app";
import { testDb } from "../../setup/db";
import { createPlan, createProfile, decide, post, put } from "../../setup/plans";

const { agentAs } = makeTestApp();
const q = (sql: string, params: unknown[]) => testDb().pool.query(sql, params);
const decisionCount = async (planId: number) =>
  (
    await q(
      "SELECT count(*)::int AS n FROM plan_decisions d JOIN plan_revisions r ON r.id = d.revision_id WHERE r.plan_id = $1",
      [planId],
    )
  ).rows[0].n;

async function inReview() {
  const researcher = await agentAs(["researcher"]);
  const model = await createProfile(researcher);
  const plan = await createPlan(researcher, model.id);
  const base = `/api/plans/${plan.id}/revisions/1`;
  await post(researcher, `${base}/submit`).expect(200);
  return { researcher, plan, base };
}

describe("a decision is bound to the content hash the approver read", () => {
  it("without contentHash the request is refused, naming the field, and nothing is written", async () => {
    const { plan, base } = await inReview();
    const ap = await agentAs(["approver"]);
    const r = await post(ap, `${base}/decisions`, { decision: "approve" });
    expect(r.status).toBe(400);
    expect(Object.keys(r.body.error.fields)).toContain("contentHash");
    expect(await decisionCount(plan.id)).toBe(0);
  });

  it("the author withdrew, changed the method and resubmitted while the dialog was open: 409 hash_mismatch, nothing written", async () => {
    const { researcher, plan, base } = await inReview();
    const ap = await agentAs(["approver"]);
    const seen = (await ap.get(base).expect(200)).body.contentHash as string;
    const w = await post(researcher, `${base}/withdraw`).expect(200);
    await put(researcher, base, { version: w.body.version, method: { method: "linear" } }).expect(200);
    await post(researcher, `${base}/submit`).expect(200);
    const now = (await ap.get(base).expect(200)).body.contentHash as string;
    expect(now).not.toBe(seen);

    const r = await post(ap, `${base}/decisions`, { decision: "approve", contentHash: seen });
    expect(r.status).toBe(409);
    expect(r.body.error.code).toBe("hash_mismatch");
    expect(r.body.error.message).toContain(now.slice(0, 12));
    expect(await decisionCount(plan.id)).toBe(0);
    const audit = await q(
      "SELECT count(*)::int AS n FROM audit_events WHERE subject_type = 'plan' AND subject_id = $1 AND action LIKE 'decision.%'",
      [String(plan.id)],
    );
    expect(audit.rows[0].n).toBe(0);

    // The hash now on screen is accepted, and that is the hash recorded.
    await post(ap, `${base}/decisions`, { decision: "approve", contentHash: now }).expect(200);
    const rows = await q(
      "SELECT d.signed_hash FROM plan_decisions d JOIN plan_revisions r ON r.id = d.revision_id WHERE r.plan_id = $1",
      [plan.id],
    );
    expect(rows.rows.map((x) => x.signed_hash)).toEqual([now]);
  });

  it("a malformed hash is a 400 naming contentHash", async () => {
    const { base } = await inReview();
    const ap = await agentAs(["approver"]);
    const r = await post(ap, `${base}/decisions`, { decision: "approve", contentHash: "e7b5" });
    expect(r.status).toBe(400);
    expect(r.body.error.fields.contentHash).toBeTruthy();
  });
});

describe("a revision sent back cannot come back unchanged", () => {
  it("resubmitting content byte-identical to the round that was sent back answers 409 with a plain reason", async () => {
    const { researcher, plan, base } = await inReview();
    const ap = await agentAs(["approver"]);
    await decide(ap, `${base}/decisions`, { decision: "request_changes", comment: "stage 2 batch too small" }).expect(
      200,
    );
    const sentBack = (await researcher.get(base).expect(200)).body.contentHash as string;
    const r2 = await post(researcher, `/api/plans/${plan.id}/revisions`).expect(201);
    const again = await post(researcher, `/api/plans/${plan.id}/revisions/2/submit`);
    expect(again.status).toBe(409);
    expect(again.body.error.message).toMatch(/sent back/);
    expect(again.body.error.message).toContain(sentBack.slice(0, 12));
    expect((await researcher.get(`/api/plans/${plan.id}/revisions/2`).expect(200)).body.state).toBe("draft");

    // After a real change it goes through.
    await put(researcher, `/api/plans/${plan.id}/revisions/2`, {
      version: r2.body.version,
      notes: "stage 2 batch raised",
    }).expect(200);
    await post(researcher, `/api/plans/${plan.id}/revisions/2/submit`).expect(200);
  });
});
