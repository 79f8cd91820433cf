ALTER TABLE "model_profiles" ADD COLUMN "retired_at" timestamp with time zone;--> statement-breakpoint
ALTER TABLE "accelerators" ADD COLUMN "retired_at" timestamp with time zone;