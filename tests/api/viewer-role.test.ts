import { describe, expect, it } from "vitest";
import { makeTestApp } from "../setup/app";
import { createPlan, createProfile, post, put } from "../setup/plans";

const { agentAs } = makeTestApp();

/*
 * The viewer role as the Users screen describes it: "reads every plan, drafts included; changes nothing". Reading is
 * open so a plan can be questioned before anyone signs it; every state change stays with the roles that own it.
 */
describe("the viewer role does what its description says", () => {
  it("reads a draft plan and its revision, and changes nothing", async () => {
    const researcher = await agentAs(["researcher"]);
    const viewer = await agentAs(["viewer"]);
    const model = await createProfile(researcher);
    const plan = await createPlan(researcher, model.id);
    const base = `/api/plans/${plan.id}/revisions/1`;

    const detail = await viewer.get(`/api/plans/${plan.id}`).expect(200);
    expect(detail.body.revisions[0].state).toBe("draft");
    const revision = await viewer.get(base).expect(200);
    expect(revision.body.state).toBe("draft");

    expect((await put(viewer, base, { version: 1, notes: "viewer edit" })).status).toBe(403);
    expect((await post(viewer, `${base}/submit`)).status).toBe(403);
    expect((await post(viewer, "/api/plans", { title: "x", modelId: model.id })).status).toBe(403);
    // Nothing moved: the draft is as its author left it.
    const after = await researcher.get(base).expect(200);
    expect(after.body.version).toBe(1);
    expect(after.body.content.notes).toBe("test plan");
  });

  it("a refusal names the roles that would do, as alternatives", async () => {
    const viewer = await agentAs(["viewer"]);
    const refused = await viewer.get("/api/audit").expect(403);
    expect(refused.body.error.message).toBe("This needs the admin or approver role.");
  });
});
