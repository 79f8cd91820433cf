/**
 * Revision states and decisions are closed lists in the database too (migration 0006, CHECK constraints built from
 * REVISION_STATES and DECISIONS in shared/schemas/plans.ts), so a row can never carry a state the response schemas
 * (revisionStateSchema) would reject.
 */
import { describe, expect, it } from "vitest";
import { makeTestApp } from "../../setup/app";
import { createPlan, createProfile } from "../../setup/plans";
import { sqlError as sqlErrorOn, testDb } from "../../setup/db";
import { REVISION_STATES } from "../../../shared/schemas";

const { agentAs } = makeTestApp();
const { pool } = testDb();

const sqlError = (text: string, values: unknown[]) => sqlErrorOn(pool, text, values);

describe("plan states and decisions in the database", () => {
  it("refuses a revision state outside the shared list, accepts each listed one", async () => {
    const a = await agentAs(["researcher", "infra"]);
    const plan = await createPlan(a, (await createProfile(a)).id);
    const bad = await sqlError("UPDATE plan_revisions SET state = $1 WHERE plan_id = $2", ["signed", plan.id]);
    expect(bad).toMatchObject({ code: "23514", constraint: "plan_revisions_state_known" });
    for (const state of REVISION_STATES) {
      expect(
        await sqlError("UPDATE plan_revisions SET state = $1 WHERE plan_id = $2", [state, plan.id]),
        state,
      ).toBeUndefined();
    }
  });

  it("refuses a decision outside approve / request_changes", async () => {
    const a = await agentAs(["researcher", "infra"]);
    const plan = await createPlan(a, (await createProfile(a)).id);
    const bad = await sqlError(
      `INSERT INTO plan_decisions (revision_id, round, approver_id, decision, signed_hash)
       SELECT id, 1, $2, 'maybe', content_hash FROM plan_revisions WHERE plan_id = $1`,
      [plan.id, a.user!.id],
    );
    expect(bad).toMatchObject({ code: "23514", constraint: "plan_decisions_decision_known" });
  });
});
