import { describe, expect, it } from "vitest";
import { testDb } from "../setup/db";
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

async function planOf(
  statement: { sql: string; params: unknown[] },
  off = ["enable_seqscan", "enable_indexscan", "enable_indexonlyscan"],
) {
  const client = await pool.connect();
  try {
    await client.query("BEGIN");
    // Walking the primary key backwards and filtering each row is the other way to answer; price it out too, so
    // only a bitmap scan (the trigram indexes') remains unless no index matches the search.
    for (const o of off) await client.query(`SET LOCAL ${o} = off`);
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
  // capped count can start from plans_proof_idx with both filters as its index condition; the other scans are priced
  // out as above, so this checks the index can serve the statements the list sends.
  const dialect = new PgDialect();
  const q = (query: Record<string, string>) => planListQuerySchema.parse(query);

  for (const proof of ["none", "proven"]) {
    it(`proof=${proof}&state=draft: the page and the count`, async () => {
      const query = q({ proof, state: "draft" });
      const page = await planOf(dialect.sqlToQuery(planPageStatement(query)), ["enable_seqscan", "enable_bitmapscan"]);
      const count = await planOf(dialect.sqlToQuery(sql`SELECT count(*) FROM (${countedPlans(query)} LIMIT 10001) c`), [
        "enable_seqscan",
        "enable_bitmapscan",
      ]);
      for (const plan of [page, count]) {
        expect(plan).toMatch(/Index (Only )?Scan (Backward )?using plans_proof_idx on plans \w+/);
        const cond = /using plans_proof_idx on plans \w+[^\n]*\n\s*Index Cond: ([^\n]*)/.exec(plan)?.[1] ?? "";
        expect(cond).toContain(proof === "none" ? "approved_proof IS NULL" : "approved_proof = ");
        expect(cond).toContain("latest_state = ");
        // The revisions are no longer read to choose or count plans.
        expect(plan).not.toMatch(/on plan_revisions/);
      }
    });
  }
});
