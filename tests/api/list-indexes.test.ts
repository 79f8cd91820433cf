import { describe, expect, it } from "vitest";
import { testDb } from "../setup/db";
import { listOutbox, listSinkMessages } from "../../server/features/mail/mail.repo";

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
