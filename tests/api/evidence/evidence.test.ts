import crypto from "node:crypto";
import request from "supertest";
import { describe, expect, it } from "vitest";
import { makeTestApp } from "../../setup/app";
import { testDb } from "../../setup/db";
import { post } from "../../setup/plans";
import { approvedPlanWith, criterion, fullProvenance, upload } from "../../setup/evidence";

const { app, agentAs } = makeTestApp();

const PASSKEY = [
  "context_length,depth,trials,correct",
  "4096,0,10,10",
  "32768,0,10,10",
  "32768,0.5,10,9",
  "32768,1,20,18",
];
const NEEDLE = ["context_length,depth,trials,correct", "4096,0,10,10", "32768,0,10,8", "32768,1,10,6", "65536,0,10,0"];
const RULER = [
  "context_length,task,score",
  "4096,niah,0.95",
  "4096,vt,0.85",
  "16384,niah,0.9",
  "16384,vt,0.7",
  "32768,niah,0.8",
  "32768,vt,0.6",
];
const PERPLEXITY = ["context_length,perplexity", "4096,8.0", "32768,8.4"];
const REGRESSION = ["benchmark,baseline,tuned", "mmlu,0.62,0.61", "hellaswag,0.80,0.785"];

const rows = async (sql: string, args: unknown[]) => (await testDb().pool.query(sql, args)).rows;

describe("evidence: upload, verdict per criterion, download", () => {
  it("each kind against hand-worked values", async () => {
    const p = await approvedPlanWith(agentAs, [
      criterion("passkey", 32768, ">=", 0.9),
      criterion("needle", 32768, ">=", 0.75, { aggregate: "mean" }),
      criterion("needle", 32768, ">=", 0.75, { aggregate: "min" }),
      criterion("ruler", 32768, ">=", 0.75),
      criterion("perplexity", 32768, "<=", 1.1, { measure: "ratio" }),
      criterion("short_regression", 4096, "<=", 0.02, { benchmarks: ["mmlu", "hellaswag"] }),
      criterion("parity", 32768, "<=", 1e-6),
    ]);
    const files = {
      passkey: PASSKEY,
      needle: NEEDLE,
      ruler: RULER,
      perplexity: PERPLEXITY,
      short_regression: REGRESSION,
    };
    const ids: number[] = [];
    for (const [kind, lines] of Object.entries(files)) {
      const r = await upload(p.researcher, p.planId, { kind, fingerprint: p.fingerprint, file: lines.join("\n") });
      expect(r.status, JSON.stringify(r.body)).toBe(201);
      const text = lines.join("\n");
      expect(r.body.evidence).toMatchObject({
        kind,
        checksum: crypto.createHash("sha256").update(text).digest("hex"),
        format: "csv",
        via: "session",
      });
      expect(r.body.evidence.rows).toHaveLength(lines.length - 1);
      ids.push(r.body.evidence.id);
    }
    const list = await p.researcher.get(`/api/plans/${p.planId}/revisions/1/evidence`).expect(200);
    expect(list.body.evidence.map((e: { id: number }) => e.id)).toEqual(ids);
    const c = list.body.criteria;
    // passkey: Σcorrect/Σtrials at 32768 = (10 + 9 + 18) / (10 + 10 + 20) = 37/40 = 0.925 ≥ 0.9 (the 4096 row is not counted)
    expect(c[0]).toMatchObject({ index: 0, kind: "passkey", status: "pass", evidenceIds: [ids[0]] });
    expect(c[0].observed).toBeCloseTo(0.925, 12);
    // needle cells ≤ 32768: 10/10, 8/10, 6/10 (the 65536 cell is beyond the length): mean 0.8 passes, min 0.6 fails
    expect(c[1]).toMatchObject({ status: "pass" });
    expect(c[1].observed).toBeCloseTo(0.8, 12);
    expect(c[2]).toMatchObject({ status: "fail" });
    expect(c[2].observed).toBeCloseTo(0.6, 12);
    // ruler means: 4096 → 0.9, 16384 → 0.8, 32768 → 0.7 < 0.75: fails, effective length at 0.75 is 16384
    expect(c[3]).toMatchObject({ status: "fail", effectiveLength: 16384 });
    expect(c[3].observed).toBeCloseTo(0.7, 12);
    // perplexity ratio 8.4 / 8.0 = 1.05 ≤ 1.1 (the trained length is the profile's 4096)
    expect(c[4]).toMatchObject({ status: "pass", trainedPerplexity: 8 });
    expect(c[4].observed).toBeCloseTo(1.05, 12);
    // short regression: losses 0.62 − 0.61 = 0.01 and 0.80 − 0.785 = 0.015; the largest, 0.015, is ≤ 0.02
    expect(c[5]).toMatchObject({ status: "pass" });
    expect(c[5].observed).toBeCloseTo(0.015, 12);
    // parity reads the probe checks, and none was recorded
    expect(c[6]).toMatchObject({ status: "no_data", observed: null });

    const audit = await rows("SELECT detail FROM audit_events WHERE action = 'evidence.uploaded' AND subject_id = $1", [
      String(p.planId),
    ]);
    expect(audit).toHaveLength(5);

    const file = await p.researcher.get(`/api/plans/${p.planId}/revisions/1/evidence/${ids[0]}/file`).expect(200);
    expect(file.text).toBe(PASSKEY.join("\n"));
    expect(file.headers["content-disposition"]).toContain("passkey.csv");
    const stored = await rows(
      "SELECT checksum, encode(sha256(content), 'hex') AS actual FROM revision_evidence WHERE id = $1",
      [ids[0]],
    );
    expect(stored[0].actual).toBe(stored[0].checksum);
  });

  it("inputs shorter than the criterion's length make it insufficient, with the reason", async () => {
    const p = await approvedPlanWith(agentAs, [criterion("passkey", 32768, ">=", 0.9)]);
    // 32768 × (1 − 0.05) = 31129.6, so a shortest input of 24000 tokens falls short
    const provenance = fullProvenance({ buckets: [{ contextLength: 32768, meanTokens: 30000, minTokens: 24000 }] });
    await upload(p.researcher, p.planId, {
      kind: "passkey",
      fingerprint: p.fingerprint,
      provenance,
      file: PASSKEY.join("\n"),
    }).expect(201);
    const list = await p.researcher.get(`/api/plans/${p.planId}/revisions/1/evidence`).expect(200);
    expect(list.body.criteria[0].status).toBe("insufficient");
    expect(list.body.criteria[0].reason).toContain("as short as 24000 tokens");
    expect(list.body.criteria[0].warnings).toHaveLength(1);
  });

  it("the evaluation harness's results JSON maps onto ruler rows (one metric per length)", async () => {
    const p = await approvedPlanWith(agentAs, [criterion("ruler", 32768, ">=", 0.5)]);
    const harness = {
      results: {
        niah_single_1: { alias: "niah_single_1", "4096,none": 1.0, "32768,none": 0.6, "65536,none": -1 },
        ruler_vt: { alias: "ruler_vt", "4096,none": 0.9, "32768,none": 0.5 },
      },
    };
    const r = await upload(p.researcher, p.planId, {
      kind: "ruler",
      fingerprint: p.fingerprint,
      file: JSON.stringify(harness),
      fileName: "results.json",
    });
    expect(r.status, JSON.stringify(r.body)).toBe(201);
    expect(r.body.evidence).toMatchObject({ format: "harness", fileName: "results.json" });
    expect(r.body.evidence.rows).toHaveLength(4); // the −1 (no samples at 65536) is dropped
    const list = await p.researcher.get(`/api/plans/${p.planId}/revisions/1/evidence`).expect(200);
    // mean at 32768 = (0.6 + 0.5) / 2 = 0.55 ≥ 0.5; at 4096 0.95, so the effective length at 0.5 is 32768
    expect(list.body.criteria[0]).toMatchObject({ status: "pass", effectiveLength: 32768 });
    expect(list.body.criteria[0].observed).toBeCloseTo(0.55, 12);
  });

  it("a token with evidence:write uploads as a pipeline would; a token without it is refused", async () => {
    const p = await approvedPlanWith(agentAs, [criterion("perplexity", 32768, "<=", 9)]);
    const made = await post(p.researcher, "/api/tokens", { name: "training job", scopes: ["evidence:write"] }).expect(
      201,
    );
    const other = await post(p.researcher, "/api/tokens", { name: "reader", scopes: ["export:read"] }).expect(201);
    const send = (token: string) =>
      request(app)
        .post(`/api/plans/${p.planId}/revisions/1/evidence`)
        .set("Authorization", `Bearer ${token}`)
        .field("kind", "perplexity")
        .field("fingerprint", p.fingerprint)
        .field("provenance", JSON.stringify(fullProvenance()))
        .attach("file", Buffer.from(PERPLEXITY.join("\n")), "ppl.csv");
    expect((await send(other.body.token)).status).toBe(403);
    const r = await send(made.body.token);
    expect(r.status, JSON.stringify(r.body)).toBe(201);
    expect(r.body.evidence.via).toBe("token");
    const back = await request(app)
      .get(`/api/plans/${p.planId}/revisions/1/evidence`)
      .set("Authorization", `Bearer ${made.body.token}`)
      .expect(200);
    // 8.4 ≤ 9
    expect(back.body.criteria[0]).toMatchObject({ status: "pass", observed: 8.4 });
  });
});
