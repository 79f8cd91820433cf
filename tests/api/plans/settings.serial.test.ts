import { describe, expect, it } from "vitest";
import { makeTestApp } from "../../setup/app";
import { createProfile, decide, post, put } from "../../setup/plans";

const { agentAs } = makeTestApp();

// Serial: the lab-wide setting would disturb plans created by other files running at the same time.
describe("lab-wide approvals minimum", () => {
  it("admins set a lab-wide minimum of approvals", async () => {
    const admin = await agentAs(["admin"]);
    const researcher = await agentAs(["researcher"]);
    const model = await createProfile(researcher);
    // A plan made under a minimum of 1 and submitted before the minimum rises.
    const early = await post(researcher, "/api/plans", {
      title: "early",
      modelId: model.id,
      requiredApprovals: 1,
      revision: { targetContext: 8192, method: { method: "linear" } },
    }).expect(201);
    await post(researcher, `/api/plans/${early.body.id}/revisions/1/submit`).expect(200);
    await put(admin, "/api/plans/settings", { minRequiredApprovals: 2 }).expect(200);
    try {
      // The raised minimum applies to decisions from now on, and the queue says so.
      const approver = await agentAs(["approver"]);
      const queue = await approver.get("/api/plans/review-queue").expect(200);
      expect(queue.body.items.find((i: { planId: number }) => i.planId === early.body.id).requiredApprovals).toBe(2);
      const first = await decide(approver, `/api/plans/${early.body.id}/revisions/1/decisions`, {
        decision: "approve",
      }).expect(200);
      expect(first.body.state).toBe("in_review");
      const low = await post(researcher, "/api/plans", {
        title: "t",
        modelId: model.id,
        requiredApprovals: 1,
        revision: { targetContext: 8192, method: { method: "linear" } },
      });
      expect(low.status).toBe(400);
      expect(low.body.error.fields).toHaveProperty("requiredApprovals");
      expect((await put(researcher, "/api/plans/settings", { minRequiredApprovals: 1 })).status).toBe(403);
    } finally {
      await put(admin, "/api/plans/settings", { minRequiredApprovals: 1 }).expect(200);
    }
  });
});
