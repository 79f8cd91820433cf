import { describe, expect, it } from "vitest";
import { makeTestApp } from "../../setup/app";
import { testDb } from "../../setup/db";
import { createPlan, createProfile } from "../../setup/plans";
import { approvedPlanWith, criterion, upload } from "../../setup/evidence";

const { agentAs } = makeTestApp();

const stored = async (planId: number) =>
  Number(
    (await testDb().pool.query("SELECT count(*) AS n FROM revision_evidence WHERE plan_id = $1", [planId])).rows[0].n,
  );

/** Each bad upload of issue 12, the 400's field naming where it went wrong. */
const CASES: { name: string; kind: string; file?: string | Buffer; provenance?: string; field: RegExp }[] = [
  { name: "wrong columns", kind: "passkey", file: "length,depth,trials,correct\n4096,0,10,10", field: /^row 1$/ },
  {
    name: "text in a numeric cell",
    kind: "passkey",
    file: "context_length,depth,trials,correct\n4096,0,ten,10",
    field: /^row 2, column trials$/,
  },
  {
    name: "negative trials",
    kind: "needle",
    file: "context_length,depth,trials,correct\n4096,0,-1,0",
    field: /^row 2, column trials$/,
  },
  {
    name: "correct above trials",
    kind: "passkey",
    file: "context_length,depth,trials,correct\n4096,0,5,6",
    field: /^row 2, column correct$/,
  },
  {
    name: "depth outside [0, 1]",
    kind: "needle",
    file: "context_length,depth,trials,correct\n4096,1.5,5,5",
    field: /^row 2, column depth$/,
  },
  {
    name: "duplicate rows",
    kind: "passkey",
    file: "context_length,depth,trials,correct\n4096,0,5,5\n4096,0,5,4",
    field: /^row 3$/,
  },
  { name: "an empty file", kind: "perplexity", file: "", field: /^file$/ },
  { name: "a harness JSON without results", kind: "ruler", file: '{"config": {}}', field: /^file$/ },
  {
    name: "a provenance that is not JSON",
    kind: "perplexity",
    file: "context_length,perplexity\n4096,8",
    provenance: "engine=vllm",
    field: /^provenance$/,
  },
  { name: "no file part", kind: "perplexity", field: /^file$/ },
  { name: "an unknown kind", kind: "vibes", file: "x", field: /^kind$/ },
];

describe("evidence: bad uploads are 400s naming row and column, and store nothing", () => {
  it.each(CASES)("$name", async ({ kind, file, provenance, field }) => {
    const p = await approvedPlanWith(agentAs, [criterion("passkey", 32768, ">=", 0.9)]);
    const r = await upload(p.researcher, p.planId, { kind, fingerprint: p.fingerprint, file, provenance });
    expect(r.status, JSON.stringify(r.body)).toBe(400);
    expect(
      Object.keys(r.body.error.fields ?? {}).some((k) => field.test(k)),
      JSON.stringify(r.body),
    ).toBe(true);
    expect(await stored(p.planId)).toBe(0);
  });

  it("a 50 MB file is a 400 naming the file part", async () => {
    const p = await approvedPlanWith(agentAs, [criterion("passkey", 32768, ">=", 0.9)]);
    const big = Buffer.alloc(50 * 1024 * 1024, "1");
    const r = await upload(p.researcher, p.planId, { kind: "passkey", fingerprint: p.fingerprint, file: big });
    expect(r.status, JSON.stringify(r.body)).toBe(400);
    expect(r.body.error.fields).toHaveProperty("file");
    expect(await stored(p.planId)).toBe(0);
  });

  it("another model's fingerprint is a 409 fingerprint_mismatch", async () => {
    const p = await approvedPlanWith(agentAs, [criterion("passkey", 32768, ">=", 0.9)]);
    const r = await upload(p.researcher, p.planId, {
      kind: "passkey",
      fingerprint: "0".repeat(64),
      file: "context_length,depth,trials,correct\n32768,0,5,5",
    });
    expect(r.status).toBe(409);
    expect(r.body.error.code).toBe("fingerprint_mismatch");
    expect(await stored(p.planId)).toBe(0);
  });

  it("a draft or a revision in review takes no evidence (409); an approver who is not on the plan may not upload", async () => {
    const researcher = await agentAs(["researcher"]);
    const model = await createProfile(researcher);
    const plan = await createPlan(researcher, model.id);
    const rev = await researcher.get(`/api/plans/${plan.id}/revisions/1`).expect(200);
    const r = await upload(researcher, plan.id, {
      kind: "passkey",
      fingerprint: rev.body.rotaryFingerprint,
      file: "context_length,depth,trials,correct\n32768,0,5,5",
    });
    expect(r.status).toBe(409);
    expect(r.body.error.code).toBe("not_approved");

    const p = await approvedPlanWith(agentAs, [criterion("passkey", 32768, ">=", 0.9)]);
    const stranger = await agentAs(["researcher"]);
    const s = await upload(stranger, p.planId, {
      kind: "passkey",
      fingerprint: p.fingerprint,
      file: "context_length,depth,trials,correct\n32768,0,5,5",
    });
    expect(s.status).toBe(403);
    expect(await stored(p.planId)).toBe(0);
  });
});
