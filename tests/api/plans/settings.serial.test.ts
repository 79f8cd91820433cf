import { describe, expect, it } from "vitest";
import { makeTestApp } from "../../setup/app";
import { createProfile, post, put } from "../../setup/plans";

const { agentAs } = makeTestApp();

// Serial: the lab-wide setting would disturb plans created by other files running at the same time.
describe("lab-wide approvals minimum", () => {
  it("admins set a lab-wide minimum of approvals", async () => {
    const admin = await agentAs(["admin"]);
    const researcher = await agentAs(["researcher"]);
    const model = await createProfile(researcher);
    await put(admin, "/api/plans/settings", { minRequiredApprovals: 2 }).expect(200);
    try {
      const low = await post(researcher, "/api/plans", { title: "t", modelId: model.id, requiredApprovals: 1, revision: { targetContext: 8192, method: { method: "linear" } } });
      expect(low.status).toBe(400);
      expect(low.body.error.fields).toHaveProperty("requiredApprovals");
      expect((await put(researcher, "/api/plans/settings", { minRequiredApprovals: 1 })).status).toBe(403);
    } finally {
      await put(admin, "/api/plans/settings", { minRequiredApprovals: 1 }).expect(200);
    }
  });
});
