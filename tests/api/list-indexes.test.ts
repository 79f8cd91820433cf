import { describe, expect, it } from "vitest";
import { ownerTestDb, testDb } from "../setup/db";
import { PgDialect } from "drizzle-orm/pg-core";
import { sql } from "drizzle-orm";
import { listOutbox, listSinkMessages } from "../../server/features/mail/mail.repo";
import { countedPlans, planPageStatement } from "../../server/features/plans/plans.list";
import { planListQuerySchema } from "../../shared/schemas";

// The Mail page's search must be able to use the trigram indexes (migration 0021 for the outbox), or on a busy lab's
// 200 000 outbox rows a search walks every one (2.2 s on bench:scale data before the index). With the other scans
// priced out, the plan shows whether an index can serve the statement the repo actually sends; on a small test
// table the planner would rightly prefer the scan, so this checks the possibility, never a timing (npm run
// bench:scale -- --explain shows the plans on the seeded data).
const { pool } = testDb();

async function planOf(statement: { sql: string; params: unknown[] }) {
  const client = await pool.connect();
  try {
    await client.query("BEGIN");
    // Walking the primary key backwards and filtering each row is the other way to answer; price it out too, so
    // only a bitmap scan (the trigram indexes') remains unless no index matches the search.
    for (const off of ["enable_seqscan", "enable_indexscan", "enable_indexonlyscan"])
      await client.query(`SET LOCAL ${off} = off`);
    const rows = (await client.query<{ "QUERY PLAN": string }>(`EXPLAIN ${statement.sql}`, statement.params)).rows;
    return rows.map((r) => r["QUERY PLAN"]).join("\n");
  } finally {
    await client.query("ROLLBACK");
    client.release();
  }
}

describe("list searches have an index to use", () => {
  it("the outbox search by subject or recipient can use mail_outbox_subject_trgm and mail_outbox_to_trgm", async () => {
    const plan = await planOf(listOutbox(testDb().db, 200, "no-such-words").toSQL());
    expect(plan).toContain("mail_outbox_subject_trgm");
    expect(plan).toContain("mail_outbox_to_trgm");
    expect(plan).not.toMatch(/Seq Scan on mail_outbox/);
  });

  it("the received messages' search keeps its own trigram indexes", async () => {
    const plan = await planOf(listSinkMessages(testDb().db, 200, "no-such-words").toSQL());
    expect(plan).toContain("mail_sink_subject_trgm");
    expect(plan).toContain("mail_sink_to_trgm");
  });
});

describe("the plan list's proof filter with a state is one range of plans_proof_idx", () => {
  // Before migration 0024 the proof was a look-up of each plan's approved revision, so proof=none&state=draft walked
  // every plan to find none (docs/scale-figures.md). With the proof stored on plans, the page (default order) and the
  // capped count start from plans_proof_idx with both filters as its index condition. On a test table of a few rows
  // any index is as good as another, so the plans are asked inside a transaction (rolled back) that first adds a lab's
  // worth of drafts never approved and approved plans, analysed as autovacuum would: bench:scale's shape in small.
  const dialect = new PgDialect();
  const q = (query: Record<string, string>) => planListQuerySchema.parse(query);

  async function planAtScale(statements: { sql: string; params: unknown[] }[]) {
    const client = await ownerTestDb().pool.connect();
    try {
      await client.query("BEGIN");
      const [user] = (
        await client.query(`INSERT INTO users (email, name, password_hash, roles)
          VALUES ('scale-${Date.now()}@ropewalk.test', 'Scale', 'x', '{researcher}') RETURNING id`)
      ).rows;
      const [model] = (
        await client.query(
          `INSERT INTO model_profiles (name, family, head_dim, rope_theta, trained_context, layers, attention_heads,
             kv_heads, hidden_size, parameters, created_by)
           VALUES ('Scale-${Date.now()}', 'Scale', 128, 10000, 4096, 32, 32, 8, 4096, 7e9, $1) RETURNING id`,
          [user.id],
        )
      ).rows;
      // 9 000 drafts never approved, 9 000 approved plans without a proof decision, 2 000 in review.
      await client.query(
        `INSERT INTO plans (title, owner_id, model_id, latest_state, approved_number)
         SELECT 'scale ' || g, $1, $2, (ARRAY['draft', 'approved', 'in_review'])[1 + (g % 20 >= 9)::int + (g % 20 >= 18)::int],
                CASE WHEN g % 20 BETWEEN 9 AND 17 THEN 1 END
         FROM generate_series(1, 20000) g`,
        [user.id, model.id],
      );
      await client.query("ANALYZE plans");
      // At 20 000 rows reading the whole table is still cheap; priced out as above, the choice left is between indexes.
      await client.query("SET LOCAL enable_seqscan = off");
      const plans: string[] = [];
      for (const st of statements) {
        const rows = (await client.query<{ "QUERY PLAN": string }>(`EXPLAIN ${st.sql}`, st.params)).rows;
        plans.push(rows.map((r) => r["QUERY PLAN"]).join("\n"));
      }
      return plans;
    } finally {
      await client.query("ROLLBACK");
      client.release();
    }
  }

  for (const proof of ["none", "proven"]) {
    it(`proof=${proof}&state=draft: the page and the count`, async () => {
      const query = q({ proof, state: "draft" });
      const [page, count] = await planAtScale([
        dialect.sqlToQuery(planPageStatement(query)),
        dialect.sqlToQuery(sql`SELECT count(*) FROM (${countedPlans(query)} LIMIT 10001) c`),
      ]);
      for (const plan of [page!, count!]) {
        // An index (only) scan or a bitmap index scan of plans_proof_idx, with both filters as its condition.
        const cond = /(?:using|Bitmap Index Scan on) plans_proof_idx[^\n]*\n\s*Index Cond: ([^\n]*)/.exec(plan)?.[1];
        expect(cond, plan).toBeDefined();
        expect(cond).toContain(proof === "none" ? "approved_proof IS NULL" : "approved_proof = ");
        expect(cond).toContain("latest_state = ");
        // The revisions are no longer read to choose or count plans.
        expect(plan).not.toMatch(/on plan_revisions/);
      }
    });
  }
});
