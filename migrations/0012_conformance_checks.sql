CREATE TABLE "conformance_checks" (
	"id" serial PRIMARY KEY NOT NULL,
	"plan_id" integer NOT NULL,
	"revision_id" integer NOT NULL,
	"content_hash" text NOT NULL,
	"by_user_id" integer NOT NULL,
	"via" text NOT NULL,
	"passed" boolean NOT NULL,
	"max_relative_error" double precision,
	"worst_pair" integer,
	"cause" text DEFAULT '' NOT NULL,
	"library" text NOT NULL,
	"library_version" text NOT NULL,
	"rope_type" text NOT NULL,
	"running_length" integer NOT NULL,
	"plan_fingerprint" text,
	"read_fingerprint" text NOT NULL,
	"fingerprint_matches" boolean,
	"upload" jsonb NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "conformance_checks_via_known" CHECK ("conformance_checks"."via" IN ('session', 'token'))
);
--> statement-breakpoint
ALTER TABLE "conformance_checks" ADD CONSTRAINT "conformance_checks_plan_id_plans_id_fk" FOREIGN KEY ("plan_id") REFERENCES "public"."plans"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "conformance_checks" ADD CONSTRAINT "conformance_checks_revision_id_plan_revisions_id_fk" FOREIGN KEY ("revision_id") REFERENCES "public"."plan_revisions"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "conformance_checks" ADD CONSTRAINT "conformance_checks_by_user_id_users_id_fk" FOREIGN KEY ("by_user_id") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "conformance_checks_plan" ON "conformance_checks" USING btree ("plan_id","created_at");