import { describe, expect, it } from "vitest";
import { makeTestApp } from "../../setup/app";
import { createPlan, createProfile, decide, post, put } from "../../setup/plans";

const { agentAs } = makeTestApp();

describe("plan lifecycle", () => {
  it("draft → submit → two approvals (quorum 2) → approved; export; new revision → approved supersedes", async () => {
    const researcher = await agentAs(["researcher"]);
    const [ap1, ap2] = [await agentAs(["approver"]), await agentAs(["approver"])];
    const model = await createProfile(researcher);
    const plan = await createPlan(researcher, model.id, { requiredApprovals: 2 });
    expect(plan.revisions[0]).toMatchObject({ number: 1, state: "draft", version: 1 });
    expect(plan.revisions[0].contentHash).toMatch(/^[0-9a-f]{64}$/);
    const base = `/api/plans/${plan.id}/revisions/1`;

    const rev = await researcher.get(base).expect(200);
    expect(rev.body.content.results.stages).toHaveLength(2);
    expect(rev.body.content.model.name).toBe(model.name);

    await post(researcher, `${base}/submit`).expect(200);
    const d1 = await decide(ap1, `${base}/decisions`, { decision: "approve", comment: "bands look right" }).expect(200);
    expect(d1.body).toMatchObject({ state: "in_review", approvals: 1 });
    const d2 = await decide(ap2, `${base}/decisions`, { decision: "approve", comment: "" }).expect(200);
    expect(d2.body).toMatchObject({ state: "approved", approvals: 2 });

    const detail = await researcher.get(`/api/plans/${plan.id}`).expect(200);
    expect(detail.body.revisions[0].decisions.map((d: { signedHash: string }) => d.signedHash)).toEqual([
      plan.revisions[0].contentHash,
      plan.revisions[0].contentHash,
    ]);

    const exp = await researcher.get(`/api/plans/${plan.id}/approved/export`).expect(200);
    expect(exp.body.revision).toBe(1);
    expect(exp.body.config.rope_scaling).toMatchObject({
      rope_type: "yarn",
      factor: 8,
      original_max_position_embeddings: 4096,
    });
    expect(exp.body.config.max_position_embeddings).toBe(32768);

    const r2 = await post(researcher, `/api/plans/${plan.id}/revisions`).expect(201);
    expect(r2.body).toMatchObject({ number: 2, version: 1 });
    const edited = await put(researcher, `/api/plans/${plan.id}/revisions/2`, {
      version: 1,
      method: { method: "linear" },
    }).expect(200);
    expect(edited.body.version).toBe(2);
    await post(researcher, `/api/plans/${plan.id}/revisions/2/submit`).expect(200);
    await decide(ap1, `/api/plans/${plan.id}/revisions/2/decisions`, { decision: "approve" }).expect(200);
    await decide(ap2, `/api/plans/${plan.id}/revisions/2/decisions`, { decision: "approve" }).expect(200);
    const after = await researcher.get(`/api/plans/${plan.id}`).expect(200);
    expect(after.body.revisions.map((r: { state: string }) => r.state)).toEqual(["superseded", "approved"]);
    const exp2 = await researcher.get(`/api/plans/${plan.id}/approved/export`).expect(200);
    expect(exp2.body.config.rope_scaling.rope_type).toBe("linear");

    const diff = await researcher.get(`/api/plans/${plan.id}/revisions/1/diff/2`).expect(200);
    expect(diff.body.fields.map((f: { path: string }) => f.path)).toContain("method.method");
  });
});
