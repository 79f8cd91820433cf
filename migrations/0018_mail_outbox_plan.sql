ALTER TABLE "mail_outbox" ADD COLUMN "plan_id" integer;--> statement-breakpoint
ALTER TABLE "mail_outbox" ADD COLUMN "revision" integer;--> statement-breakpoint
ALTER TABLE "mail_outbox" ADD CONSTRAINT "mail_outbox_plan_id_plans_id_fk" FOREIGN KEY ("plan_id") REFERENCES "public"."plans"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "mail_outbox_plan" ON "mail_outbox" USING btree ("plan_id","revision");