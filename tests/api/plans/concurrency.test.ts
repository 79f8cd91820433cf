import { describe, expect, it } from "vitest";
import { makeTestApp } from "../../setup/app";
import { testDb } from "../../setup/db";
import { createPlan, createProfile, decide, post, put } from "../../setup/plans";

const { agentAs } = makeTestApp();
const q = (sql: string, args: unknown[]) => testDb().pool.query(sql, args);

async function submitted(required: number) {
  const researcher = await agentAs(["researcher"]);
  const model = await createProfile(researcher);
  const plan = await createPlan(researcher, model.id, { requiredApprovals: required });
  await post(researcher, `/api/plans/${plan.id}/revisions/1/submit`).expect(200);
  return { researcher, plan, base: `/api/plans/${plan.id}/revisions/1` };
}

describe("concurrent transitions", () => {
  it("two approvers at once on a quorum-1 revision: exactly one approval, state approved", async () => {
    for (let trial = 0; trial < 3; trial++) {
      const { plan, base } = await submitted(1);
      const [a, b] = [await agentAs(["approver"]), await agentAs(["approver"])];
      const results = await Promise.all([
        decide(a, `${base}/decisions`, { decision: "approve" }),
        decide(b, `${base}/decisions`, { decision: "approve" }),
      ]);
      expect(results.map((r) => r.status).sort()).toEqual([200, 409]);
      const rows = await q(
        "SELECT count(*)::int AS n FROM plan_decisions d JOIN plan_revisions r ON r.id = d.revision_id WHERE r.plan_id = $1",
        [plan.id],
      );
      expect(rows.rows[0].n).toBe(1);
      const state = await q("SELECT state FROM plan_revisions WHERE plan_id = $1", [plan.id]);
      expect(state.rows[0].state).toBe("approved");
    }
  });

  it("two edits with the same version: one wins, the other gets 409, no lost write", async () => {
    const researcher = await agentAs(["researcher"]);
    const model = await createProfile(researcher);
    const plan = await createPlan(researcher, model.id);
    const base = `/api/plans/${plan.id}/revisions/1`;
    const [r1, r2] = await Promise.all([
      put(researcher, base, { version: 1, notes: "alpha" }),
      put(researcher, base, { version: 1, notes: "beta" }),
    ]);
    expect([r1.status, r2.status].sort()).toEqual([200, 409]);
    const winner = r1.status === 200 ? "alpha" : "beta";
    const rev = await researcher.get(base);
    expect(rev.body).toMatchObject({ version: 2 });
    expect(rev.body.content.notes).toBe(winner);
  });

  it("a decision racing a withdraw: never a decision on a withdrawn revision", async () => {
    for (let trial = 0; trial < 4; trial++) {
      const { researcher, plan, base } = await submitted(1);
      const ap = await agentAs(["approver"]);
      const [w, d] = await Promise.all([
        post(researcher, `${base}/withdraw`),
        decide(ap, `${base}/decisions`, { decision: "approve" }),
      ]);
      const state = (await q("SELECT state, round FROM plan_revisions WHERE plan_id = $1", [plan.id])).rows[0];
      const decisions = (
        await q(
          "SELECT count(*)::int AS n FROM plan_decisions d JOIN plan_revisions r ON r.id = d.revision_id WHERE r.plan_id = $1",
          [plan.id],
        )
      ).rows[0].n;
      if (w.status === 200) {
        expect(d.status).toBe(409);
        expect(state.state).toBe("draft");
        expect(decisions).toBe(0);
      } else {
        expect(d.status).toBe(200);
        expect(w.status).toBe(409);
        expect(state.state).toBe("approved");
        expect(decisions).toBe(1);
      }
    }
  });
});

describe("integrity", () => {
  it("content tampered in the database → verify reports it and export refuses", async () => {
    const { plan, base } = await submitted(1);
    const ap = await agentAs(["approver"]);
    await decide(ap, `${base}/decisions`, { decision: "approve" }).expect(200);
    const ok = await ap.get(`${base}/verify`).expect(200);
    expect(ok.body.ok).toBe(true);
    await ap.get(`/api/plans/${plan.id}/approved/export`).expect(200);
    await q(`UPDATE plan_revisions SET content = jsonb_set(content, '{targetContext}', '65536') WHERE plan_id = $1`, [
      plan.id,
    ]);
    const bad = await ap.get(`${base}/verify`).expect(200);
    expect(bad.body.ok).toBe(false);
    expect(bad.body.computedHash).not.toBe(bad.body.storedHash);
    const exp = await ap.get(`/api/plans/${plan.id}/approved/export`);
    expect(exp.status).toBe(409);
    expect(exp.body.error.message).toMatch(/integrity/);
    const report = await ap.get(`${base}/report`).expect(200);
    expect(report.text).toContain("INTEGRITY CHECK FAILED");
  });

  it("the hash is SHA-256 of the RFC 8785 canonical content (key order does not matter)", async () => {
    const { hashContent } = await import("../../../server/features/plans/revision-content");
    const crypto = await import("node:crypto");
    // RFC 8785 §3.2.3: members sorted by UTF-16 code units, no whitespace; numbers in ECMAScript form.
    const expected = crypto.createHash("sha256").update('{"a":[1,2.5,"x"],"b":{"c":null,"d":true}}').digest("hex");
    expect(hashContent({ b: { d: true, c: null }, a: [1, 2.5, "x"] })).toBe(expected);
    expect(hashContent({ a: [1, 2.5, "x"], b: { c: null, d: true } })).toBe(expected);
  });
});
