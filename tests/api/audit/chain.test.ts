import { createHash } from "node:crypto";
import { describe, expect, it } from "vitest";
import { verifyAuditChain } from "../../../server/platform/audit-chain";
import { recordAudit } from "../../../server/platform/audit";
import { makeTestApp } from "../../setup/app";
import { testDb } from "../../setup/db";

interface Row {
  id: number;
  at: string;
  actor_id: number | null;
  action: string;
  subject_type: string;
  subject_id: string | null;
  detail: string;
  prev_hash: string;
  hash: string;
}

const rowsFrom = async (fromId: number) =>
  (
    await testDb().pool.query<Row>(
      `SELECT id::float8 AS id, to_char(at AT TIME ZONE 'UTC', 'YYYY-MM-DD"T"HH24:MI:SS.US"Z"') AS at, actor_id, action, subject_type,
          subject_id, detail::text AS detail, prev_hash, hash FROM audit_events WHERE id >= $1 ORDER BY id`,
      [fromId],
    )
  ).rows;

/**
 * The envelope written out by hand, independently of the canonicalize package: RFC 8785 (JSON Canonicalization
 * Scheme) sorts keys by UTF-16 code units, and prints no whitespace; JSON.stringify of a string or an integer
 * gives the RFC 8785 form for the values used here (ASCII text, safe integers).
 */
function handHash(r: Row) {
  const j = JSON.stringify;
  const text =
    `{"action":${j(r.action)},"actorId":${j(r.actor_id)},"at":${j(r.at)},"detail":${j(r.detail)},"id":${r.id},` +
    `"prevHash":${j(r.prev_hash)},"subjectId":${j(r.subject_id)},"subjectType":${j(r.subject_type)}}`;
  return createHash("sha256").update(text).digest("hex");
}

describe("audit hash chain", () => {
  it("each new row stores its predecessor's hash and the SHA-256 of its canonical fields", async () => {
    const { db } = testDb();
    const first = await db.transaction(async (tx) => {
      await recordAudit(tx, {
        actorId: null,
        action: "test.chain",
        subjectType: "test",
        subjectId: 1,
        detail: { b: 2, a: 'x\n"y"', n: [1, 2.5] },
      });
      return (await tx.execute<{ id: number }>("SELECT max(id)::float8 AS id FROM audit_events")).rows[0].id;
    });
    await recordAudit(db, { actorId: null, action: "test.chain", subjectType: "test", subjectId: null }); // no transaction given
    const rows = await rowsFrom(first);
    expect(rows.length).toBeGreaterThanOrEqual(2);
    expect(rows[0].detail).toBe('{"a": "x\\n\\"y\\"", "b": 2, "n": [1, 2.5]}'); // jsonb's own text, as hashed
    for (const [i, r] of rows.entries()) {
      expect(r.hash).toMatch(/^[0-9a-f]{64}$/);
      expect(r.hash, `row ${r.id}`).toBe(handHash(r));
      if (i > 0) expect(r.prev_hash).toBe(rows[i - 1].hash);
    }
  });

  it("concurrent appends queue on the chain lock instead of forking it", async () => {
    const { db } = testDb();
    const before = (await testDb().pool.query("SELECT coalesce(max(id), 0)::float8 AS id FROM audit_events")).rows[0]
      .id as number;
    await Promise.all(
      Array.from({ length: 12 }, (_, k) =>
        db.transaction(async (tx) => {
          await recordAudit(tx, { actorId: null, action: "test.race", subjectType: "test", subjectId: k });
          await tx.execute("SELECT pg_sleep(0.01)"); // hold the transaction open a little, as a real change does
        }),
      ),
    );
    const forks = await testDb().pool.query(
      "SELECT prev_hash, count(*)::int AS n FROM audit_events GROUP BY prev_hash HAVING count(*) > 1",
    );
    expect(forks.rows).toEqual([]);
    const rows = await rowsFrom(before + 1);
    expect(rows.filter((r) => r.action === "test.race")).toHaveLength(12);
    const report = await verifyAuditChain(db);
    expect(report).toMatchObject({ ok: true });
  });

  it("GET /api/audit/verify: ok with the count for admins, 403 for everyone else", async () => {
    const t = makeTestApp();
    const admin = await t.agentAs(["admin"]);
    const r = await admin.get("/api/audit/verify").expect(200);
    expect(r.body.ok).toBe(true);
    expect(r.body.brokenAt).toBeUndefined();
    const total = (await testDb().pool.query("SELECT count(*)::int AS n FROM audit_events")).rows[0].n as number;
    expect(r.body.count).toBeGreaterThan(0);
    expect(r.body.count).toBeLessThanOrEqual(total); // rows committed after the check began are not counted
    for (const role of ["approver", "researcher", "infra", "viewer"] as const) {
      expect((await (await t.agentAs([role])).get("/api/audit/verify")).status, role).toBe(403);
    }
    expect((await (await t.agent()).get("/api/audit/verify")).status).toBe(401);
  });
});
