DROP INDEX "plan_revisions_in_review";--> statement-breakpoint
CREATE INDEX "audit_events_action_idx" ON "audit_events" USING btree ("action" text_pattern_ops,"id");--> statement-breakpoint
CREATE INDEX "mail_outbox_subject_trgm" ON "mail_outbox" USING gin ("subject" gin_trgm_ops);--> statement-breakpoint
CREATE INDEX "mail_outbox_to_trgm" ON "mail_outbox" USING gin (rw_text_list("to_addresses") gin_trgm_ops);--> statement-breakpoint
CREATE INDEX "plan_revisions_proof" ON "plan_revisions" USING btree ("proof","plan_id","number") WHERE "plan_revisions"."proof" IS NOT NULL;--> statement-breakpoint
CREATE INDEX "plan_revisions_unproven" ON "plan_revisions" USING btree ("plan_id","number") WHERE "plan_revisions"."state" = 'approved' AND "plan_revisions"."proof" IS NULL;--> statement-breakpoint
CREATE INDEX "plan_revisions_in_review" ON "plan_revisions" USING btree ("submitted_at","id","author_id","round") WHERE "plan_revisions"."state" = 'in_review';