-- The plan list's proof filter reads plans alone (issue 14): the approved revision's proof is stored beside its number
-- (null: not yet decided, or no approved revision), so proof with another filter is one index range for the page and
-- the count, where testing each plan's revision walked every plan when few matched (docs/scale-figures.md).
ALTER TABLE "plans" ADD COLUMN "approved_proof" text;--> statement-breakpoint
-- Existing plans take it from their approved revision once (at most one per plan: plan_revisions_one_approved); the
-- trigger below keeps it from here on.
UPDATE "plans" p SET "approved_proof" = r.proof
FROM plan_revisions r
WHERE r.plan_id = p.id AND r.number = p.approved_number AND r.proof IS NOT NULL;--> statement-breakpoint
CREATE INDEX "plans_proof_idx" ON "plans" USING btree ("approved_proof","latest_state","updated_at","id") WHERE "plans"."approved_number" IS NOT NULL;--> statement-breakpoint
ALTER TABLE "plans" ADD CONSTRAINT "plans_approved_proof_known" CHECK ("plans"."approved_proof" IS NULL OR ("plans"."approved_number" IS NOT NULL AND "plans"."approved_proof" IN ('proven', 'unproven')));--> statement-breakpoint
-- The one function that sets the stored columns (migration 0013's, now with the approved revision's proof). It runs in
-- the statement that inserts, re-states, renumbers, deletes or records a proof on a revision: approval, the supersede
-- that precedes it, a proof decision and a new revision all go through it.
CREATE OR REPLACE FUNCTION plans_keep_latest() RETURNS trigger LANGUAGE plpgsql AS $$
DECLARE
  pid integer := CASE WHEN TG_OP = 'DELETE' THEN OLD.plan_id ELSE NEW.plan_id END;
BEGIN
  UPDATE plans p SET latest_number = l.number, latest_state = l.state, approved_number = a.number,
                     approved_proof = a.proof
  FROM (SELECT number, state FROM plan_revisions WHERE plan_id = pid ORDER BY number DESC LIMIT 1) l,
       (SELECT max(number) AS number, (array_agg(proof ORDER BY number DESC))[1] AS proof
        FROM plan_revisions WHERE plan_id = pid AND state = 'approved') a
  WHERE p.id = pid
    AND (p.latest_number, p.latest_state, p.approved_number, p.approved_proof)
        IS DISTINCT FROM (l.number, l.state, a.number, a.proof);
  RETURN NULL;
END $$;--> statement-breakpoint
DROP TRIGGER "plan_revisions_keep_latest" ON "plan_revisions";--> statement-breakpoint
CREATE TRIGGER plan_revisions_keep_latest
  AFTER INSERT OR DELETE OR UPDATE OF state, number, plan_id, proof ON plan_revisions
  FOR EACH ROW EXECUTE FUNCTION plans_keep_latest();
--> statement-breakpoint
-- The state, the approved revision and its proof are far from independent (a plan whose latest revision is a draft has
-- rarely been approved), so the planner takes them together: without these statistics it multiplies the three
-- selectivities, expects thousands of undecided drafts, and walks plans_updated_idx through every plan to find none
-- (bench:scale: proof=none&state=draft, 100 004 rows and 3 667 buffers; with them plans_proof_idx, 3 buffers). An MCV
-- list over the three columns holds their joint frequencies (PostgreSQL 12+, CREATE STATISTICS).
CREATE STATISTICS "plans_state_proof_stats" (mcv) ON "latest_state", "approved_number", "approved_proof" FROM "plans";--> statement-breakpoint
-- The planner knows nothing of the new column and statistics until plans is analysed; until autovacuum got there it
-- would take approved_proof IS NULL for rare and read every undecided plan through plans_proof_idx to sort them.
ANALYZE "plans";
