ALTER TABLE "model_profiles" ADD COLUMN "layer_groups" jsonb;--> statement-breakpoint
ALTER TABLE "model_profiles" ADD COLUMN "mrope_section" jsonb;--> statement-breakpoint
ALTER TABLE "model_profiles" ADD COLUMN "mrope_interleaved" boolean DEFAULT false NOT NULL;--> statement-breakpoint
ALTER TABLE "model_profiles" ADD COLUMN "kv_latent_dim" integer;