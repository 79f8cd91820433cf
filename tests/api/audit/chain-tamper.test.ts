import bcrypt from "bcryptjs";
import request from "supertest";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { createApp } from "../../../server/app";
import { verifyAuditChain } from "../../../server/platform/audit-chain";
import { recordAudit } from "../../../server/platform/audit";
import { insertUser } from "../../../server/features/users/users.repo";
import { testConfig } from "../../setup/app";
import { scratchDatabase } from "../../setup/scratch-db";

// Tampering happens in databases of their own: the shared test database's chain must stay whole for everyone else.

/** What someone with the owner's rights can do behind the app's back: set the append-only trigger aside. */
async function asOwnerWithoutTrigger(pool: import("pg").Pool, statement: string, params: unknown[]) {
  const c = await pool.connect();
  try {
    await c.query("BEGIN");
    await c.query("ALTER TABLE audit_events DISABLE TRIGGER audit_events_append_only");
    await c.query(statement, params);
    await c.query("ALTER TABLE audit_events ENABLE TRIGGER audit_events_append_only");
    await c.query("COMMIT");
  } finally {
    c.release();
  }
}

describe("a rewritten audit trail is caught", () => {
  let s: Awaited<ReturnType<typeof scratchDatabase>>;
  let admin: ReturnType<typeof request.agent>;
  const ids: number[] = [];

  beforeAll(async () => {
    s = await scratchDatabase();
    await s.migrate();
    const password = "scratch-password-1";
    await insertUser(s.app.db, {
      email: "scratch-admin@example.test",
      name: "Scratch Admin",
      roles: ["admin"],
      passwordHash: await bcrypt.hash(password, 4),
    });
    for (let k = 0; k < 5; k++)
      await recordAudit(s.app.db, {
        actorId: null,
        action: "test.tamper",
        subjectType: "test",
        subjectId: k,
        detail: { k },
      });
    ids.push(
      ...(await s.owner.pool.query("SELECT id::float8 AS id FROM audit_events ORDER BY id")).rows.map(
        (r) => r.id as number,
      ),
    );
    const app = createApp({ config: testConfig(), pool: s.app.pool, db: s.app.db });
    admin = request.agent(app);
    const csrf = (await admin.get("/api/auth/session").expect(200)).body.csrfToken;
    const login = await admin
      .post("/api/auth/login")
      .set("X-CSRF-Token", csrf)
      .send({ email: "scratch-admin@example.test", password })
      .expect(200);
    expect(login.body.csrfToken).toBeTruthy();
  });
  afterAll(async () => s?.drop());

  it("is whole before anyone touches it", async () => {
    const r = await admin.get("/api/audit/verify").expect(200);
    const total = (await s.owner.pool.query("SELECT count(*)::int AS n FROM audit_events")).rows[0].n;
    expect(total).toBe(ids.length + 1); // the admin's sign-in is recorded too
    expect(r.body).toEqual({ ok: true, count: total });
  });

  it("a row deleted by the owner role breaks the link of the row after it", async () => {
    const second = ids[1];
    await asOwnerWithoutTrigger(s.owner.pool, "DELETE FROM audit_events WHERE id = $1", [ids[2]]);
    const r = await admin.get("/api/audit/verify").expect(200);
    expect(r.body).toEqual({
      ok: false,
      count: 2,
      brokenAt: { id: ids[3], reason: "previous_hash_mismatch", previousId: second },
    });
  });

  it("a row changed in place (even with its own hash left alone) is named by its hash", async () => {
    await asOwnerWithoutTrigger(s.owner.pool, "UPDATE audit_events SET detail = '{\"k\": 99}' WHERE id = $1", [ids[0]]);
    const r = await admin.get("/api/audit/verify").expect(200);
    expect(r.body).toEqual({
      ok: false,
      count: 0,
      brokenAt: { id: ids[0], reason: "hash_mismatch", previousId: null },
    });
  });
});

describe("rows written before the chain existed", () => {
  it("are linked by the migration exactly as the server would have linked them", async () => {
    const s = await scratchDatabase();
    try {
      // Build the database up to the migration before the chain.
      await s.migrateBefore("_audit_hash_chain");

      // Awkward text on purpose: quotes, backslashes, control characters, non-ASCII and astral characters, numbers.
      const rows = [
        [
          "user.created",
          null,
          "user",
          "7",
          { email: "a@example.test", roles: ["admin"], by: "demo seed" },
          "2024-02-29 23:59:59.123456+00",
        ],
        [
          "plan.note",
          null,
          "plan",
          'q"uo\\te\ttab\u0001',
          { é: "✓ 𝄞", nested: { z: [1, 2.5, -0.001, 1e-7, true, null], a: "" } },
          "2025-01-01 00:00:00+00",
        ],
        ["x", null, "y", null, {}, "2025-06-01 12:34:56.000001+02"],
      ] as const;
      for (const [action, actor, st, sid, detail, at] of rows) {
        await s.owner.pool.query(
          "INSERT INTO audit_events (action, actor_id, subject_type, subject_id, detail, at) VALUES ($1, $2, $3, $4, $5, $6)",
          [action, actor, st, sid, JSON.stringify(detail), at],
        );
      }
      await s.migrate();
      expect(await verifyAuditChain(s.app.db)).toEqual({ ok: true, count: 3 });
      // ...and the server appends to the backfilled chain seamlessly.
      await recordAudit(s.app.db, { actorId: null, action: "after", subjectType: "test" });
      expect(await verifyAuditChain(s.app.db)).toEqual({ ok: true, count: 4 });
      const first = (await s.app.pool.query("SELECT prev_hash FROM audit_events ORDER BY id LIMIT 1")).rows[0]
        .prev_hash;
      expect(first).toBe("0".repeat(64));
    } finally {
      await s.drop();
    }
  });
});
