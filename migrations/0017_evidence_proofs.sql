CREATE TABLE "revision_evidence" (
	"id" serial PRIMARY KEY NOT NULL,
	"plan_id" integer NOT NULL,
	"revision_id" integer NOT NULL,
	"kind" text NOT NULL,
	"file_name" text NOT NULL,
	"format" text NOT NULL,
	"content" "bytea" NOT NULL,
	"checksum" text NOT NULL,
	"size_bytes" integer NOT NULL,
	"rows" jsonb NOT NULL,
	"fingerprint" text NOT NULL,
	"provenance" jsonb NOT NULL,
	"by_user_id" integer NOT NULL,
	"via" text NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "revision_evidence_kind_known" CHECK ("revision_evidence"."kind" IN ('passkey', 'needle', 'ruler', 'perplexity', 'short_regression', 'parity')),
	CONSTRAINT "revision_evidence_format_known" CHECK ("revision_evidence"."format" IN ('csv', 'harness')),
	CONSTRAINT "revision_evidence_checksum_hex" CHECK ("revision_evidence"."checksum" ~ '^[0-9a-f]{64}$')
);
--> statement-breakpoint
CREATE TABLE "revision_proofs" (
	"id" serial PRIMARY KEY NOT NULL,
	"revision_id" integer NOT NULL,
	"approver_id" integer NOT NULL,
	"verdict" text NOT NULL,
	"reason" text DEFAULT '' NOT NULL,
	"content_hash" text NOT NULL,
	"evidence_ids" integer[] NOT NULL,
	"at" timestamp with time zone DEFAULT now() NOT NULL,
	"signature" text NOT NULL,
	"key_id" text NOT NULL,
	CONSTRAINT "revision_proofs_verdict_known" CHECK ("revision_proofs"."verdict" IN ('proven', 'unproven'))
);
--> statement-breakpoint
ALTER TABLE "plan_revisions" ADD COLUMN "proof" text;--> statement-breakpoint
ALTER TABLE "revision_evidence" ADD CONSTRAINT "revision_evidence_plan_id_plans_id_fk" FOREIGN KEY ("plan_id") REFERENCES "public"."plans"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "revision_evidence" ADD CONSTRAINT "revision_evidence_revision_id_plan_revisions_id_fk" FOREIGN KEY ("revision_id") REFERENCES "public"."plan_revisions"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "revision_evidence" ADD CONSTRAINT "revision_evidence_by_user_id_users_id_fk" FOREIGN KEY ("by_user_id") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "revision_proofs" ADD CONSTRAINT "revision_proofs_revision_id_plan_revisions_id_fk" FOREIGN KEY ("revision_id") REFERENCES "public"."plan_revisions"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "revision_proofs" ADD CONSTRAINT "revision_proofs_approver_id_users_id_fk" FOREIGN KEY ("approver_id") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "revision_evidence_revision" ON "revision_evidence" USING btree ("revision_id","id");--> statement-breakpoint
CREATE INDEX "revision_proofs_revision" ON "revision_proofs" USING btree ("revision_id","id");--> statement-breakpoint
ALTER TABLE "plan_revisions" ADD CONSTRAINT "plan_revisions_proof_known" CHECK ("plan_revisions"."proof" IS NULL OR "plan_revisions"."proof" IN ('proven', 'unproven'));--> statement-breakpoint
ALTER TABLE "plan_revisions" ADD CONSTRAINT "plan_revisions_proof_after_approval" CHECK ("plan_revisions"."proof" IS NULL OR "plan_revisions"."state" IN ('approved', 'superseded'));