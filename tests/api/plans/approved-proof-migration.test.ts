/**
 * Migration 0024 stores the approved revision's proof on plans (approved_proof) for the plan list's proof filter. Its
 * backfill must give every existing plan what the revisions say, and the trigger must keep it from then on.
 */
import { describe, expect, it } from "vitest";
import { scratchDatabase } from "../../setup/scratch-db";

describe("migration 0024 (plans.approved_proof)", () => {
  it("backfills each plan from its approved revision, then the trigger follows proof decisions", async () => {
    const s = await scratchDatabase();
    try {
      // Build the database up to the migration before this one.
      await s.migrateBefore("_approved_proof");
      const q = (text: string) => s.owner.pool.query(text).then((r) => r.rows);
      // Plans as the workflow leaves them (written in SQL: the application's schema already has the new column).
      // 1: approved, proven | 2: approved, undecided | 3: proven revision 1 superseded by an undecided revision 2
      // 4: approved and unproven, then a new draft | 5: never approved.
      await q(
        `INSERT INTO users (email, name, password_hash, roles) VALUES ('mig24@ropewalk.test', 'Mig', 'x', '{researcher}')`,
      );
      await q(`INSERT INTO model_profiles (name, family, head_dim, rope_theta, trained_context, layers, attention_heads,
                 kv_heads, hidden_size, parameters, created_by)
               SELECT 'Mig-24', 'Mig', 128, 10000, 4096, 32, 32, 8, 4096, 7e9, id FROM users`);
      await q(`INSERT INTO plans (title, owner_id, model_id) SELECT 'mig ' || g, u.id, m.id
               FROM generate_series(1, 5) g, users u, model_profiles m ORDER BY g`);
      const revs: [number, number, string, string | null][] = [
        [1, 1, "approved", "proven"],
        [2, 1, "approved", null],
        [3, 1, "superseded", "proven"],
        [3, 2, "approved", null],
        [4, 1, "approved", "unproven"],
        [4, 2, "draft", null],
        [5, 1, "draft", null],
      ];
      for (const [plan, n, state, proof] of revs)
        await s.owner.pool.query(
          `INSERT INTO plan_revisions (plan_id, number, state, proof, author_id, content, content_hash, engine_version)
           SELECT p.id, $2, $3, $4, p.owner_id, '{}', 'h', 'e' FROM plans p WHERE p.title = 'mig ' || $1`,
          [plan, n, state, proof],
        );
      // The migration adds the column and fills it from the revisions.
      await s.migrate();
      const stored = () =>
        q(`SELECT substr(p.title, 5)::int AS plan, p.approved_number, p.approved_proof,
                  (SELECT proof FROM plan_revisions r WHERE r.plan_id = p.id AND r.state = 'approved') AS derived
           FROM plans p ORDER BY p.id`);
      expect(await stored()).toEqual([
        { plan: 1, approved_number: 1, approved_proof: "proven", derived: "proven" },
        { plan: 2, approved_number: 1, approved_proof: null, derived: null },
        { plan: 3, approved_number: 2, approved_proof: null, derived: null },
        { plan: 4, approved_number: 1, approved_proof: "unproven", derived: "unproven" },
        { plan: 5, approved_number: null, approved_proof: null, derived: null },
      ]);
      // The planner is given the columns' joint frequencies (migration 0024's comment says why).
      expect(await q("SELECT stxkind FROM pg_statistic_ext WHERE stxname = 'plans_state_proof_stats'")).toEqual([
        { stxkind: "{m}" },
      ]);
      // From here the trigger keeps it: a proof decision on plan 2's approved revision.
      await q(
        `UPDATE plan_revisions SET proof = 'proven' WHERE number = 1 AND plan_id = (SELECT id FROM plans WHERE title = 'mig 2')`,
      );
      expect((await stored())[1]).toMatchObject({ approved_proof: "proven", derived: "proven" });
      // The database refuses a proof without an approved revision.
      await expect(q(`UPDATE plans SET approved_proof = 'proven' WHERE title = 'mig 5'`)).rejects.toThrow(
        /plans_approved_proof_known/,
      );
    } finally {
      await s.drop();
    }
  });
});
