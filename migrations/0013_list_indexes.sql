-- Lists whose cost does not grow with the tables (issue 14): stored latest state on plans, indexes for each sort key and
-- filter, and trigram indexes for the ILIKE '%…%' searches.
-- pg_trgm is a trusted extension since PostgreSQL 13, so the owner role (which owns the database) may create it.
CREATE EXTENSION IF NOT EXISTS pg_trgm;--> statement-breakpoint
-- array_to_string is only STABLE (it goes through type output functions in general), so an index cannot use it; for
-- text[] the result never changes, which is what IMMUTABLE promises. The Mail page's search uses the same expression.
CREATE OR REPLACE FUNCTION rw_text_list(text[]) RETURNS text
  LANGUAGE sql IMMUTABLE PARALLEL SAFE STRICT
  AS $$ SELECT array_to_string($1, ' ') $$;--> statement-breakpoint
ALTER TABLE "plans" ADD COLUMN "latest_number" integer DEFAULT 1 NOT NULL;--> statement-breakpoint
ALTER TABLE "plans" ADD COLUMN "latest_state" text DEFAULT 'draft' NOT NULL;--> statement-breakpoint
ALTER TABLE "plans" ADD COLUMN "approved_number" integer;--> statement-breakpoint
-- Existing plans take their stored state from their revisions once; the trigger below keeps it from here on.
UPDATE "plans" p SET
  "latest_number" = l.number,
  "latest_state" = l.state,
  "approved_number" = (SELECT max(r.number) FROM plan_revisions r WHERE r.plan_id = p.id AND r.state = 'approved')
FROM (SELECT DISTINCT ON (plan_id) plan_id, number, state FROM plan_revisions ORDER BY plan_id, number DESC) l
WHERE l.plan_id = p.id;--> statement-breakpoint
CREATE INDEX "audit_events_actor_idx" ON "audit_events" USING btree ("actor_id","id");--> statement-breakpoint
CREATE INDEX "users_name_idx" ON "users" USING btree (lower("name"),"id");--> statement-breakpoint
CREATE INDEX "users_name_trgm" ON "users" USING gin ("name" gin_trgm_ops);--> statement-breakpoint
CREATE INDEX "model_profiles_name_lower_idx" ON "model_profiles" USING btree (lower("name"),"id");--> statement-breakpoint
CREATE INDEX "model_profiles_name_trgm" ON "model_profiles" USING gin ("name" gin_trgm_ops);--> statement-breakpoint
CREATE INDEX "mail_sink_subject_trgm" ON "mail_sink_messages" USING gin ("subject" gin_trgm_ops);--> statement-breakpoint
CREATE INDEX "mail_sink_to_trgm" ON "mail_sink_messages" USING gin (rw_text_list("to_addresses") gin_trgm_ops);--> statement-breakpoint
CREATE INDEX "plan_revisions_in_review" ON "plan_revisions" USING btree ("submitted_at","id") WHERE "plan_revisions"."state" = 'in_review';--> statement-breakpoint
CREATE INDEX "plans_updated_idx" ON "plans" USING btree ("updated_at","id");--> statement-breakpoint
CREATE INDEX "plans_created_idx" ON "plans" USING btree ("created_at","id");--> statement-breakpoint
CREATE INDEX "plans_title_idx" ON "plans" USING btree (lower("title"),"id");--> statement-breakpoint
CREATE INDEX "plans_state_idx" ON "plans" USING btree ("latest_state","id");--> statement-breakpoint
CREATE INDEX "plans_state_updated_idx" ON "plans" USING btree ("latest_state","updated_at","id");--> statement-breakpoint
CREATE INDEX "plans_owner_idx" ON "plans" USING btree ("owner_id","updated_at","id");--> statement-breakpoint
CREATE INDEX "plans_model_idx" ON "plans" USING btree ("model_id","updated_at","id");--> statement-breakpoint
CREATE INDEX "plans_title_trgm" ON "plans" USING gin ("title" gin_trgm_ops);--> statement-breakpoint
CREATE INDEX "plans_purpose_trgm" ON "plans" USING gin ("purpose" gin_trgm_ops);--> statement-breakpoint
ALTER TABLE "plans" ADD CONSTRAINT "plans_latest_state_known" CHECK ("plans"."latest_state" IN ('draft', 'in_review', 'approved', 'changes_requested', 'superseded'));--> statement-breakpoint
-- The stored state changes in the very transaction (and statement) that inserts, re-states, renumbers or deletes a
-- revision, whichever code path does it, so lists never read a stale state. It is the latest revision's number and
-- state, and the newest approved revision's number (null when none is approved).
CREATE OR REPLACE FUNCTION plans_keep_latest() RETURNS trigger LANGUAGE plpgsql AS $$
DECLARE
  pid integer := CASE WHEN TG_OP = 'DELETE' THEN OLD.plan_id ELSE NEW.plan_id END;
BEGIN
  UPDATE plans p SET latest_number = l.number, latest_state = l.state, approved_number = a.number
  FROM (SELECT number, state FROM plan_revisions WHERE plan_id = pid ORDER BY number DESC LIMIT 1) l,
       (SELECT max(number) AS number FROM plan_revisions WHERE plan_id = pid AND state = 'approved') a
  WHERE p.id = pid
    AND (p.latest_number, p.latest_state, p.approved_number) IS DISTINCT FROM (l.number, l.state, a.number);
  RETURN NULL;
END $$;--> statement-breakpoint
CREATE TRIGGER plan_revisions_keep_latest
  AFTER INSERT OR DELETE OR UPDATE OF state, number, plan_id ON plan_revisions
  FOR EACH ROW EXECUTE FUNCTION plans_keep_latest();
