import { describe, expect, it } from "vitest";
import { makeTestApp } from "../../setup/app";
import { testDb } from "../../setup/db";
import { createPlan, createProfile, decide, post, put } from "../../setup/plans";

const { agentAs } = makeTestApp();

async function submittedPlan(required = 1) {
  const researcher = await agentAs(["researcher"]);
  const model = await createProfile(researcher);
  const plan = await createPlan(researcher, model.id, { requiredApprovals: required });
  await post(researcher, `/api/plans/${plan.id}/revisions/1/submit`).expect(200);
  return { researcher, plan, model, base: `/api/plans/${plan.id}/revisions/1` };
}

describe("sign-off rules", () => {
  it("only the author submits; only drafts are submitted; only approvers decide", async () => {
    const researcher = await agentAs(["researcher"]);
    const other = await agentAs(["researcher"]);
    const model = await createProfile(researcher);
    const plan = await createPlan(researcher, model.id);
    const base = `/api/plans/${plan.id}/revisions/1`;
    expect((await post(other, `${base}/submit`)).status).toBe(403);
    const infra = await agentAs(["infra"]);
    expect((await post(infra, `${base}/submit`)).status).toBe(403);
    const approver = await agentAs(["approver"]);
    const early = await decide(approver, `${base}/decisions`, { decision: "approve" });
    expect(early.status).toBe(409);
    expect(early.body.error.message).toContain("draft");
    await post(researcher, `${base}/submit`).expect(200);
    const again = await post(researcher, `${base}/submit`);
    expect(again.status).toBe(409);
    expect(again.body.error.fields.state).toBe("in_review");
    for (const role of ["researcher", "infra", "viewer", "admin"] as const) {
      const a = await agentAs([role]);
      expect((await decide(a, `${base}/decisions`, { decision: "approve" })).status).toBe(403);
    }
  });

  it("nobody decides on their own revision, and an approver decides once", async () => {
    const author = await agentAs(["researcher", "approver"]);
    const model = await createProfile(author);
    const plan = await createPlan(author, model.id, { requiredApprovals: 2 });
    const base = `/api/plans/${plan.id}/revisions/1`;
    await post(author, `${base}/submit`).expect(200);
    const self = await decide(author, `${base}/decisions`, { decision: "approve" });
    expect(self.status).toBe(403);
    const ap = await agentAs(["approver"]);
    await decide(ap, `${base}/decisions`, { decision: "approve" }).expect(200);
    const twice = await decide(ap, `${base}/decisions`, { decision: "approve" });
    expect(twice.status).toBe(409);
    const rows = await testDb().pool.query(
      "SELECT count(*)::int AS n FROM plan_decisions d JOIN plan_revisions r ON r.id = d.revision_id WHERE r.plan_id = $1",
      [plan.id],
    );
    expect(rows.rows[0].n).toBe(1);
  });

  it("changes requested ends the revision; the author starts a new draft from it", async () => {
    const { researcher, plan, base } = await submittedPlan(2);
    const ap = await agentAs(["approver"]);
    const r = await decide(ap, `${base}/decisions`, {
      decision: "request_changes",
      comment: "stage 2 batch too small",
    }).expect(200);
    expect(r.body.state).toBe("changes_requested");
    expect((await put(researcher, base, { version: 1, notes: "late edit" })).status).toBe(409);
    const ap2 = await agentAs(["approver"]);
    expect((await decide(ap2, `${base}/decisions`, { decision: "approve" })).status).toBe(409);
    const r2 = await post(researcher, `/api/plans/${plan.id}/revisions`).expect(201);
    expect(r2.body.number).toBe(2);
    const rev2 = await researcher.get(`/api/plans/${plan.id}/revisions/2`).expect(200);
    expect(rev2.body.state).toBe("draft");
    expect(rev2.body.content.stages).toHaveLength(2);
    // Only one open revision at a time.
    expect((await post(researcher, `/api/plans/${plan.id}/revisions`)).status).toBe(409);
  });

  it("withdraw returns a revision to draft; approvals of the closed round no longer count", async () => {
    const { researcher, plan, base } = await submittedPlan(2);
    const ap1 = await agentAs(["approver"]);
    await decide(ap1, `${base}/decisions`, { decision: "approve" }).expect(200);
    const w = await post(researcher, `${base}/withdraw`).expect(200);
    expect(w.body).toMatchObject({ state: "draft", version: 2 });
    await put(researcher, base, { version: 2, notes: "tightened acceptance" }).expect(200);
    await post(researcher, `${base}/submit`).expect(200);
    const ap2 = await agentAs(["approver"]);
    const d = await decide(ap2, `${base}/decisions`, { decision: "approve" }).expect(200);
    expect(d.body).toMatchObject({ state: "in_review", approvals: 1 });
    // ap1 may decide again in the new round, on the new hash.
    const d2 = await decide(ap1, `${base}/decisions`, { decision: "approve" }).expect(200);
    expect(d2.body.state).toBe("approved");
    const detail = await researcher.get(`/api/plans/${plan.id}`).expect(200);
    const decisions = detail.body.revisions[0].decisions;
    expect(decisions).toHaveLength(3);
    expect(new Set(decisions.map((x: { signedHash: string }) => x.signedHash)).size).toBe(2);
    const other = await agentAs(["researcher"]);
    expect((await post(other, `${base}/withdraw`)).status).toBe(403);
  });

  it("edits need the author and the current version", async () => {
    const researcher = await agentAs(["researcher"]);
    const model = await createProfile(researcher);
    const plan = await createPlan(researcher, model.id);
    const base = `/api/plans/${plan.id}/revisions/1`;
    const other = await agentAs(["researcher"]);
    expect((await put(other, base, { version: 1, notes: "x" })).status).toBe(403);
    await put(researcher, base, { version: 1, notes: "first" }).expect(200);
    const stale = await put(researcher, base, { version: 1, notes: "second" });
    expect(stale.status).toBe(409);
    expect(stale.body.error.fields.version).toContain("2");
    const rev = await researcher.get(base);
    expect(rev.body.content.notes).toBe("first");
  });

  it("export needs an approved revision", async () => {
    const { researcher, plan, base } = await submittedPlan(1);
    expect((await researcher.get(`/api/plans/${plan.id}/approved/export`)).status).toBe(409);
    expect((await researcher.get(`${base}/export`)).status).toBe(409);
  });
});

describe("bad plan input → 400 naming the field, nothing written", () => {
  const count = async () => (await testDb().pool.query("SELECT count(*)::int AS n FROM plans")).rows[0].n as number;
  const cases: [string, (modelId: number) => object, string][] = [
    [
      "target below the trained context for linear",
      (m) => ({ title: "t", modelId: m, revision: { targetContext: 2048, method: { method: "linear" } } }),
      "targetContext",
    ],
    [
      "stage target below trained context",
      (m) => ({
        title: "t",
        modelId: m,
        revision: {
          targetContext: 8192,
          method: { method: "linear" },
          stages: [
            {
              targetContext: 1024,
              method: { method: "yarn" },
              steps: 1,
              globalBatch: 1,
              sequenceLength: 1024,
              learningRate: 1e-5,
            },
          ],
        },
      }),
      "stages.0.targetContext",
    ],
    [
      "betaFast <= betaSlow",
      (m) => ({
        title: "t",
        modelId: m,
        revision: { targetContext: 8192, method: { method: "yarn", betaFast: 1, betaSlow: 2 } },
      }),
      "revision.method.betaFast",
    ],
    [
      "unknown method",
      (m) => ({ title: "t", modelId: m, revision: { targetContext: 8192, method: { method: "magic" } } }),
      "revision.method.method",
    ],
    [
      "missing title",
      (m) => ({ modelId: m, revision: { targetContext: 8192, method: { method: "linear" } } }),
      "title",
    ],
    [
      "three approvals too many",
      (m) => ({
        title: "t",
        modelId: m,
        requiredApprovals: 4,
        revision: { targetContext: 8192, method: { method: "linear" } },
      }),
      "requiredApprovals",
    ],
    [
      "unknown model",
      () => ({ title: "t", modelId: 99999999, revision: { targetContext: 8192, method: { method: "linear" } } }),
      "modelId",
    ],
    [
      "acceptance beyond target",
      (m) => ({
        title: "t",
        modelId: m,
        revision: {
          targetContext: 8192,
          method: { method: "linear" },
          acceptance: [{ evaluation: "e", contextLength: 16384, metric: "m", comparison: ">=", threshold: 1 }],
        },
      }),
      "acceptance.0.contextLength",
    ],
  ];
  for (const [label, body, field] of cases) {
    it(label, async () => {
      const researcher = await agentAs(["researcher"]);
      const model = await createProfile(researcher);
      const before = await count();
      const r = await post(researcher, "/api/plans", body(model.id));
      expect(r.status).toBe(400);
      expect(Object.keys(r.body.error.fields)).toContain(field);
      expect(await count()).toBe(before);
    });
  }
});

describe("profiles in use", () => {
  // Retired, not refused: see tests/api/retire.test.ts for the rest of the rule.
  it("deleting a profile a plan uses retires it and names the plan", async () => {
    const researcher = await agentAs(["researcher"]);
    const model = await createProfile(researcher);
    const plan = await createPlan(researcher, model.id, { title: "Keeps its profile" });
    const r = await researcher.delete(`/api/models/${model.id}`).set("X-CSRF-Token", researcher.csrf);
    expect(r.status).toBe(200);
    expect(r.body.usedBy).toEqual([{ id: plan.id, title: "Keeps its profile" }]);
    expect((await researcher.get(`/api/models/${model.id}`).expect(200)).body.model.retiredAt).toEqual(
      expect.any(String),
    );
  });
});

describe("plan owners for the list filter", () => {
  it("lists each owner once, for every signed-in role", async () => {
    const researcher = await agentAs(["researcher"]);
    const model = await createProfile(researcher);
    await createPlan(researcher, model.id);
    await createPlan(researcher, model.id);
    const viewer = await agentAs(["viewer"]);
    const r = await viewer.get("/api/plans/owners").expect(200);
    expect(r.body.owners.filter((o: { id: number }) => o.id === researcher.user!.id)).toEqual([
      { id: researcher.user!.id, name: researcher.user!.name },
    ]);
  });
});
