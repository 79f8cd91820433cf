import { describe, expect, it } from "vitest";
import { makeTestApp } from "../setup/app";
import { ownerTestDb, testDb } from "../setup/db";
import { createPlan, createProfile, decide, post, put } from "../setup/plans";

const { agentAs } = makeTestApp();
const cluster = { peakFlops: 1e15, memoryBytes: 80e9, pricePerHour: 2 };

// Changes the lab-wide currency: serial, and puts it back.
describe("workspace currency (serial: lab-wide)", () => {
  it("admin changes it, audited; estimates carry it; frozen revisions keep the one they were costed in", async () => {
    const admin = await agentAs(["admin"]);
    const researcher = await agentAs(["researcher"]);
    const plan = await createPlan(researcher, (await createProfile(researcher)).id);
    const base = `/api/plans/${plan.id}/revisions/1`;
    const before = (await researcher.get("/api/budgets/currency").expect(200)).body.currency as string;
    await put(researcher, base, { version: 1, budget: { cluster, accelerators: 8 } }).expect(200);
    const frozen = (await researcher.get(base)).body;

    const to = before === "EUR" ? "GBP" : "EUR";
    expect((await put(admin, "/api/budgets/currency", { currency: to }).expect(200)).body).toEqual({ currency: to });
    const audit = await testDb().pool.query(
      "SELECT detail FROM audit_events WHERE action = 'settings.changed' AND subject_id = 'currency' ORDER BY id DESC LIMIT 1",
    );
    expect(audit.rows[0].detail).toEqual({ from: before, to });
    const estimate = await researcher
      .post("/api/budgets/estimate")
      .set("X-CSRF-Token", researcher.csrf)
      .send({
        model: { parameters: 7e9, layers: 32, attentionHeads: 32, kvHeads: 8, headDim: 128 },
        cluster,
        accelerators: 8,
        stages: [{ sequenceLength: 8192, steps: 10, globalBatch: 8 }],
      })
      .expect(200);
    expect(estimate.body.currency).toBe(to);
    const later = (await researcher.get(base)).body;
    expect(later.content.budget.currency).toBe(before);
    expect(later.contentHash).toBe(frozen.contentHash);

    // The database refuses anything but three capital letters, whoever writes.
    await expect(
      ownerTestDb().pool.query(`UPDATE settings SET value = '"euro"'::jsonb WHERE key = 'currency'`),
    ).rejects.toThrow(/settings_currency_code/);
    await put(admin, "/api/budgets/currency", { currency: before }).expect(200);
  });

  it("a revision comparison names the currency each side was costed in", async () => {
    const admin = await agentAs(["admin"]);
    const researcher = await agentAs(["researcher"]);
    const approver = await agentAs(["approver"]);
    const plan = await createPlan(researcher, (await createProfile(researcher)).id);
    const first = `/api/plans/${plan.id}/revisions/1`;
    const before = (await researcher.get("/api/budgets/currency").expect(200)).body.currency as string;
    await put(researcher, first, { version: 1, budget: { cluster, accelerators: 8 } }).expect(200);
    await post(researcher, `${first}/submit`).expect(200);
    await decide(approver, `${first}/decisions`, { decision: "request_changes", comment: "more hosts" }).expect(200);
    await post(researcher, `/api/plans/${plan.id}/revisions`).expect(201);

    const to = before === "EUR" ? "GBP" : "EUR";
    await put(admin, "/api/budgets/currency", { currency: to }).expect(200);
    try {
      const second = `/api/plans/${plan.id}/revisions/2`;
      const { version } = (await researcher.get(second)).body;
      await put(researcher, second, { version, budget: { cluster, accelerators: 16 } }).expect(200);
      const diff = (await researcher.get(`${first}/diff/2`).expect(200)).body;
      expect(diff.budget.totals).toMatchObject({ currencyFrom: before, currencyTo: to });
    } finally {
      await put(admin, "/api/budgets/currency", { currency: before }).expect(200);
    }
  });
});
