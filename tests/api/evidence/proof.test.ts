import { describe, expect, it } from "vitest";
import { makeTestApp } from "../../setup/app";
import { ownerTestDb, testDb } from "../../setup/db";
import { post } from "../../setup/plans";
import { approvedPlanWith, criterion, upload } from "../../setup/evidence";

const { agentAs } = makeTestApp();

const PASSKEY = "context_length,depth,trials,correct\n32768,0,10,10\n32768,1,10,9"; // 19/20 = 0.95
const q = async (sql: string, args: unknown[]) => (await testDb().pool.query(sql, args)).rows;

describe("proof: an approved revision whose criteria pass is proven; one that fails is not", () => {
  it("proven: signed over the content hash and the evidence read; audited; mailed to the plan's people", async () => {
    const p = await approvedPlanWith(agentAs, [criterion("passkey", 32768, ">=", 0.9)]);
    const ev = await upload(p.researcher, p.planId, {
      kind: "passkey",
      fingerprint: p.fingerprint,
      file: PASSKEY,
    }).expect(201);
    const url = `/api/plans/${p.planId}/revisions/1/proof`;
    const body = { verdict: "proven", contentHash: p.contentHash, evidenceIds: [ev.body.evidence.id] };

    // evidence the approver did not read (here: none) is refused
    const stale = await post(p.approver, url, { ...body, evidenceIds: [] });
    expect(stale.status).toBe(409);
    expect(stale.body.error.code).toBe("evidence_changed");
    expect((await post(p.researcher, url, body)).status).toBe(403);

    const r = await post(p.approver, url, body);
    expect(r.status, JSON.stringify(r.body)).toBe(200);
    expect(r.body).toMatchObject({ revision: 1, proof: "proven" });
    const list = await p.researcher.get(`/api/plans/${p.planId}/revisions/1/evidence`).expect(200);
    expect(list.body.proof).toBe("proven");
    expect(list.body.proofs[0]).toMatchObject({
      verdict: "proven",
      contentHash: p.contentHash,
      evidenceIds: [ev.body.evidence.id],
      signatureStatus: "valid",
    });
    const audit = await q("SELECT detail FROM audit_events WHERE action = 'revision.proven' AND subject_id = $1", [
      String(p.planId),
    ]);
    expect(audit[0].detail).toMatchObject({
      revision: 1,
      evidenceIds: [ev.body.evidence.id],
      contentHash: p.contentHash,
    });
    const mail = await q("SELECT subject FROM mail_outbox WHERE kind = 'plan.proven' AND body LIKE $1", [
      `%/plans/${p.planId}?%`,
    ]);
    expect(mail).toHaveLength(1);
    // the signed record (printable report) carries the proof state and the decision's signature
    const report = await p.researcher.get(`/api/plans/${p.planId}/revisions/1/report`).expect(200);
    expect(report.text).toContain("<h2>Proof</h2>");
    expect(report.text).toContain('data-proof="proven"');
    expect(report.text).toMatch(/<td class="ok">signature holds/);

    // a tampered evidence list no longer verifies
    await ownerTestDb().pool.query("UPDATE revision_proofs SET evidence_ids = '{2147483000}' WHERE id = $1", [
      r.body.decision.id,
    ]);
    const after = await p.researcher.get(`/api/plans/${p.planId}/revisions/1/evidence`).expect(200);
    expect(after.body.proofs[0].signatureStatus).toBe("invalid");
    const tampered = await p.researcher.get(`/api/plans/${p.planId}/revisions/1/report`).expect(200);
    expect(tampered.text).toMatch(/<td class="bad">SIGNATURE DOES NOT HOLD/);
  });

  it("failing criteria cannot be proven (409 naming them); not proven needs a reason", async () => {
    const p = await approvedPlanWith(agentAs, [criterion("passkey", 32768, ">=", 0.99)]);
    const ev = await upload(p.researcher, p.planId, {
      kind: "passkey",
      fingerprint: p.fingerprint,
      file: PASSKEY,
    }).expect(201);
    const url = `/api/plans/${p.planId}/revisions/1/proof`;
    const base = { contentHash: p.contentHash, evidenceIds: [ev.body.evidence.id] };
    const r = await post(p.approver, url, { ...base, verdict: "proven" });
    expect(r.status).toBe(409);
    expect(r.body.error.code).toBe("criteria_not_met");
    expect(r.body.error.message).toContain("#1 (fail)");

    const noReason = await post(p.approver, url, { ...base, verdict: "unproven" });
    expect(noReason.status).toBe(400);
    expect(noReason.body.error.fields).toHaveProperty("reason");

    const ok = await post(p.approver, url, { ...base, verdict: "unproven", reason: "0.95 at 32k, the bar is 0.99" });
    expect(ok.status, JSON.stringify(ok.body)).toBe(200);
    expect(ok.body.proof).toBe("unproven");
    const [rev] = await q("SELECT proof FROM plan_revisions WHERE plan_id = $1 AND number = 1", [p.planId]);
    expect(rev.proof).toBe("unproven");
    const mail = await q("SELECT body FROM mail_outbox WHERE kind = 'plan.unproven' AND body LIKE $1", [
      `%/plans/${p.planId}?%`,
    ]);
    expect(mail[0].body).toContain("the bar is 0.99");
    const listed = await p.researcher.get("/api/plans?proof=unproven&pageSize=100").expect(200);
    expect(JSON.stringify(listed.body)).toContain(`"id":${p.planId},`);
    // Each listed plan carries its approved revision's proof, so the list can show it beside the state.
    const item = (listed.body.plans as { id: number; proof: string | null }[]).find((x) => x.id === p.planId);
    expect(item?.proof).toBe("unproven");
    const undecided = await approvedPlanWith(agentAs, []);
    const none = await p.researcher.get("/api/plans?proof=none&pageSize=100").expect(200);
    const undecidedItem = (none.body.plans as { id: number; proof: string | null }[]).find(
      (x) => x.id === undecided.planId,
    );
    expect(undecidedItem?.proof).toBeNull();
    const proven = await p.researcher.get("/api/plans?proof=proven&pageSize=100").expect(200);
    expect(JSON.stringify(proven.body)).not.toContain(`"id":${p.planId},`);
  });

  it("the database refuses an unknown proof state, and a proof on a revision that was never approved", async () => {
    const p = await approvedPlanWith(agentAs, []);
    await expect(
      ownerTestDb().pool.query("UPDATE plan_revisions SET proof = 'certified' WHERE plan_id = $1", [p.planId]),
    ).rejects.toThrow(/plan_revisions_proof_known/);
    await expect(
      ownerTestDb().pool.query("UPDATE plan_revisions SET proof = 'proven', state = 'draft' WHERE plan_id = $1", [
        p.planId,
      ]),
    ).rejects.toThrow(/plan_revisions_proof_after_approval/);
  });
});
