import crypto from "node:crypto";
import { execFileSync, spawnSync } from "node:child_process";
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import { describe, expect, it } from "vitest";
import { makeTestApp } from "../../setup/app";
import { testDb } from "../../setup/db";
import { createPlan, createProfile, decide, post } from "../../setup/plans";

const { agentAs, agent, deps } = makeTestApp();
const q = (sql: string, params: unknown[]) => testDb().pool.query(sql, params);
const root = path.resolve(import.meta.dirname, "../../..");

/** Two approved plans on one profile, with different targets (so different content hashes). */
async function approvedPair() {
  const researcher = await agentAs(["researcher"]);
  const ap = await agentAs(["approver"]);
  const model = await createProfile(researcher);
  const a = await createPlan(researcher, model.id);
  const b = await createPlan(researcher, model.id, {
    revision: { targetContext: 16384, method: { method: "linear" }, stages: [], acceptance: [], notes: "other" },
  });
  for (const p of [a, b]) {
    await post(researcher, `/api/plans/${p.id}/revisions/1/submit`).expect(200);
    await decide(ap, `/api/plans/${p.id}/revisions/1/decisions`, { decision: "approve", comment: "ok" }).expect(200);
  }
  return { researcher, ap, a, b };
}

// RFC 8785 for a flat object of ASCII strings and integers is JSON with keys sorted and no spaces; built here by hand,
// independently of the canonicalize package the server uses.
const canonicalFlat = (o: Record<string, unknown>) =>
  JSON.stringify(Object.fromEntries(Object.entries(o).sort(([x], [y]) => (x < y ? -1 : 1))));

describe("GET /api/signing-key", () => {
  it("serves the Ed25519 public key without sign-in; the key id is SHA-256 of its DER form, as openssl computes it", async () => {
    const anon = await agent();
    const r = await anon.get("/api/signing-key").expect(200);
    expect(r.body.algorithm).toBe("Ed25519");
    expect(crypto.createPublicKey(r.body.publicKeyPem).asymmetricKeyType).toBe("ed25519");
    const der = execFileSync("openssl", ["pkey", "-pubin", "-outform", "DER"], { input: r.body.publicKeyPem });
    expect(r.body.keyId).toBe(crypto.createHash("sha256").update(der).digest("hex"));
  });

  it("the test key lives in the temp folder, never in the repository's .data", () => {
    expect(deps.config.signingKeyFile.startsWith(os.tmpdir())).toBe(true);
    expect(deps.config.signingKeyFile.startsWith(path.join(root, ".data"))).toBe(false);
    expect(fs.statSync(deps.config.signingKeyFile).mode & 0o777).toBe(0o600);
  });
});

describe("each decision is signed by the server", () => {
  it("stores an Ed25519 signature over the canonical {planId, revision, contentHash, approverId, decision, round, time}", async () => {
    const { a, ap } = await approvedPair();
    const key = (await ap.get("/api/signing-key").expect(200)).body;
    const [row] = (
      await q(
        "SELECT d.*, r.number, r.content_hash FROM plan_decisions d JOIN plan_revisions r ON r.id = d.revision_id WHERE r.plan_id = $1",
        [a.id],
      )
    ).rows;
    expect(row.key_id).toBe(key.keyId);
    const bytes = canonicalFlat({
      planId: a.id,
      revision: 1,
      contentHash: row.content_hash,
      approverId: ap.user!.id,
      decision: "approve",
      round: 1,
      time: new Date(row.at).toISOString(),
    });
    expect(
      crypto.verify(
        null,
        Buffer.from(bytes),
        crypto.createPublicKey(key.publicKeyPem),
        Buffer.from(row.signature, "base64"),
      ),
    ).toBe(true);
    const detail = await ap.get(`/api/plans/${a.id}`).expect(200);
    expect(detail.body.revisions[0].decisions[0]).toMatchObject({ keyId: key.keyId, signatureStatus: "valid" });
  });
});

describe("verify and export check hash, signed hashes and signatures", () => {
  it("content and hash copied together from another revision: verify fails, export answers 409", async () => {
    const { a, b, ap } = await approvedPair();
    const base = `/api/plans/${a.id}/revisions/1`;
    expect((await ap.get(`${base}/verify`).expect(200)).body).toMatchObject({
      ok: true,
      hashIntact: true,
      problems: [],
    });
    await ap.get(`/api/plans/${a.id}/approved/export`).expect(200);

    await q(
      `UPDATE plan_revisions t SET content = s.content, content_hash = s.content_hash
       FROM plan_revisions s WHERE s.plan_id = $2 AND s.number = 1 AND t.plan_id = $1 AND t.number = 1`,
      [a.id, b.id],
    );
    const v = (await ap.get(`${base}/verify`).expect(200)).body;
    expect(v.hashIntact).toBe(true); // the old check alone would have passed
    expect(v.ok).toBe(false);
    expect(v.problems.join(" ")).toMatch(/approval signed/);
    const exp = await ap.get(`/api/plans/${a.id}/approved/export`);
    expect(exp.status).toBe(409);
    expect(exp.body.error.message).toMatch(/integrity/);
    expect((await ap.get(`${base}/report`).expect(200)).text).toContain("INTEGRITY CHECK FAILED");

    // Rewriting the signed hash as well breaks the signature.
    await q(
      "UPDATE plan_decisions d SET signed_hash = r.content_hash FROM plan_revisions r WHERE r.id = d.revision_id AND r.plan_id = $1",
      [a.id],
    );
    const v2 = (await ap.get(`${base}/verify`).expect(200)).body;
    expect(v2.ok).toBe(false);
    expect(v2.decisions[0].signatureStatus).toBe("invalid");
    expect((await ap.get(`/api/plans/${a.id}/approved/export`)).status).toBe(409);
    const detail = await ap.get(`/api/plans/${a.id}`).expect(200);
    expect(detail.body.revisions[0].decisions[0].signatureStatus).toBe("invalid");
  });

  it("a decision with its signature removed fails verify and blocks the export", async () => {
    const { a, ap } = await approvedPair();
    await q(
      "UPDATE plan_decisions d SET signature = NULL FROM plan_revisions r WHERE r.id = d.revision_id AND r.plan_id = $1",
      [a.id],
    );
    const v = (await ap.get(`/api/plans/${a.id}/revisions/1/verify`).expect(200)).body;
    expect(v.ok).toBe(false);
    expect(v.decisions[0].signatureStatus).toBe("missing");
    expect((await ap.get(`/api/plans/${a.id}/approved/export`)).status).toBe(409);
  });
});

/** The shell block that follows `marker` in the README. */
function readmeBlock(marker: string) {
  const readme = fs.readFileSync(path.join(root, "README.md"), "utf8");
  const at = readme.indexOf(`<!-- ${marker} -->`);
  expect(at).toBeGreaterThan(0);
  const m = /```sh\n([\s\S]*?)```/.exec(readme.slice(at));
  return m![1];
}

describe("the README's offline verification", () => {
  it("accepts a real export with openssl and with node, and rejects one whose signed payload was altered", async () => {
    const { a, ap } = await approvedPair();
    const exp = (await ap.get(`/api/plans/${a.id}/approved/export`).expect(200)).body;
    const key = (await ap.get("/api/signing-key").expect(200)).body;
    expect(exp.keyId).toBe(key.keyId);
    expect(exp.signedBy[0]).toMatchObject({
      keyId: key.keyId,
      payload: { planId: a.id, revision: 1, contentHash: exp.contentHash, decision: "approve" },
    });

    const dir = fs.mkdtempSync(path.join(os.tmpdir(), "ropewalk-offline-"));
    try {
      fs.writeFileSync(path.join(dir, "signing-key.json"), JSON.stringify(key));
      const run = (marker: string, doc: unknown) => {
        fs.writeFileSync(path.join(dir, "export.json"), JSON.stringify(doc));
        return spawnSync("bash", ["-c", readmeBlock(marker)], { cwd: dir, encoding: "utf8" });
      };
      const forged = structuredClone(exp);
      forged.signedBy[0].payload.time = "2020-01-01T00:00:00.000Z";
      for (const marker of ["offline-verify:openssl", "offline-verify:node"]) {
        const good = run(marker, exp);
        expect(good.status, `${marker}: ${good.stdout}${good.stderr}`).toBe(0);
        expect(run(marker, forged).status).not.toBe(0);
      }
    } finally {
      fs.rmSync(dir, { recursive: true, force: true });
    }
  });
});
