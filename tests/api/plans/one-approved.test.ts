/**
 * A plan holds at most one approved revision (migration 0022, unique partial index plan_revisions_one_approved):
 * approving a revision supersedes the plan's earlier sign-off, and the plan list's proof counts
 * (server/features/plans/plans.list.ts) rely on there being only one.
 */
import fs from "node:fs";
import path from "node:path";
import { describe, expect, it } from "vitest";
import { MIGRATIONS_DIR } from "../../../server/db/migrate";
import { seedDemo } from "../../../server/db/seed";
import { makeTestApp, testConfig } from "../../setup/app";
import { sqlError as sqlErrorOn, testDb } from "../../setup/db";
import { createPlan, createProfile, decide, post } from "../../setup/plans";
import { scratchDatabase } from "../../setup/scratch-db";

const { agentAs } = makeTestApp();
const { pool } = testDb();

const sqlError = (text: string, values: unknown[]) => sqlErrorOn(pool, text, values);

const approvedOf = async (planId: number) =>
  (
    await pool.query("SELECT number FROM plan_revisions WHERE plan_id = $1 AND state = 'approved' ORDER BY number", [
      planId,
    ])
  ).rows.map((r) => r.number as number);

describe("one approved revision per plan", () => {
  it("a second sign-off supersedes the first; the database refuses a second approved revision", async () => {
    const researcher = await agentAs(["researcher"]);
    const approver = await agentAs(["approver"]);
    const model = await createProfile(researcher);
    const plan = await createPlan(researcher, model.id);
    const base = `/api/plans/${plan.id}`;
    await post(researcher, `${base}/revisions/1/submit`).expect(200);
    await decide(approver, `${base}/revisions/1/decisions`, { decision: "approve" }).expect(200);
    await post(researcher, `${base}/revisions`).expect(201);
    await post(researcher, `${base}/revisions/2/submit`).expect(200);
    // The workflow supersedes revision 1 before it approves revision 2, so the index never sees two.
    await decide(approver, `${base}/revisions/2/decisions`, { decision: "approve" }).expect(200);
    expect(await approvedOf(plan.id)).toEqual([2]);
    const states = await pool.query("SELECT number, state FROM plan_revisions WHERE plan_id = $1 ORDER BY number", [
      plan.id,
    ]);
    expect(states.rows).toEqual([
      { number: 1, state: "superseded" },
      { number: 2, state: "approved" },
    ]);

    // Behind the services' back: turning the superseded revision approved again, or inserting another approved one.
    const back = await sqlError("UPDATE plan_revisions SET state = 'approved' WHERE plan_id = $1 AND number = 1", [
      plan.id,
    ]);
    expect(back).toMatchObject({ code: "23505", constraint: "plan_revisions_one_approved" });
    const inserted = await sqlError(
      `INSERT INTO plan_revisions (plan_id, number, state, author_id, content, content_hash, engine_version)
       SELECT plan_id, 3, 'approved', author_id, content, content_hash, engine_version
       FROM plan_revisions WHERE plan_id = $1 AND number = 2`,
      [plan.id],
    );
    expect(inserted).toMatchObject({ code: "23505", constraint: "plan_revisions_one_approved" });
    expect(await approvedOf(plan.id)).toEqual([2]);
    // Other plans are not held back: the index is per plan, and other states are not in it.
    const other = await createPlan(researcher, model.id);
    await post(researcher, `/api/plans/${other.id}/revisions/1/submit`).expect(200);
    await decide(approver, `/api/plans/${other.id}/revisions/1/decisions`, { decision: "approve" }).expect(200);
    expect(await approvedOf(other.id)).toEqual([1]);
  });

  it("the migration applies on a database seeded with the demo scenario", async () => {
    const s = await scratchDatabase();
    try {
      // The demo scenario is written by today's application, so it is seeded on a database migrated to the end (a
      // database cut before a later migration lacks that migration's columns); the index is then dropped and the
      // migration's own statements applied over the demo's rows.
      await s.migrate();
      await seedDemo({ config: testConfig(), pool: s.app.pool, db: s.app.db });
      const q = (text: string) => s.owner.pool.query(text).then((r) => r.rows);
      // The demo scenario holds a plan whose earlier sign-off was superseded by a later one.
      expect(await q("SELECT 1 FROM plan_revisions WHERE state = 'superseded' LIMIT 1")).toHaveLength(1);
      await q("DROP INDEX plan_revisions_one_approved");
      const journal = JSON.parse(fs.readFileSync(path.join(MIGRATIONS_DIR, "meta/_journal.json"), "utf8"));
      const entry = journal.entries.find((e: { tag: string }) => e.tag.endsWith("_one_approved_revision"));
      expect(entry).toBeTruthy();
      const migration = fs.readFileSync(path.join(MIGRATIONS_DIR, `${entry.tag}.sql`), "utf8");
      for (const statement of migration.split("--> statement-breakpoint")) await q(statement);
      expect(await q("SELECT indexdef FROM pg_indexes WHERE indexname = 'plan_revisions_one_approved'")).toEqual([
        {
          indexdef:
            "CREATE UNIQUE INDEX plan_revisions_one_approved ON public.plan_revisions USING btree (plan_id) WHERE (state = 'approved'::text)",
        },
      ]);
      // Every plan's approved revision is still the one the stored approved_number names.
      expect(
        await q(`SELECT p.id FROM plans p WHERE p.approved_number IS DISTINCT FROM
                   (SELECT number FROM plan_revisions r WHERE r.plan_id = p.id AND r.state = 'approved')`),
      ).toEqual([]);
    } finally {
      await s.drop();
    }
  });
});
