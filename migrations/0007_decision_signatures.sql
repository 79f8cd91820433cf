ALTER TABLE "plan_decisions" ADD COLUMN "signature" text;--> statement-breakpoint
ALTER TABLE "plan_decisions" ADD COLUMN "key_id" text;