CREATE TABLE "model_profiles" (
	"id" serial PRIMARY KEY NOT NULL,
	"name" text NOT NULL,
	"family" text NOT NULL,
	"head_dim" integer NOT NULL,
	"partial_rotary_factor" double precision DEFAULT 1 NOT NULL,
	"rope_theta" double precision NOT NULL,
	"trained_context" integer NOT NULL,
	"max_position_embeddings" integer,
	"layers" integer NOT NULL,
	"attention_heads" integer NOT NULL,
	"kv_heads" integer NOT NULL,
	"hidden_size" integer NOT NULL,
	"parameters" double precision NOT NULL,
	"parameters_total" double precision,
	"bytes_per_element" double precision DEFAULT 2 NOT NULL,
	"provenance" text DEFAULT '' NOT NULL,
	"current_scaling" jsonb,
	"source_file_name" text,
	"source_config" text,
	"import_warnings" jsonb DEFAULT '[]'::jsonb NOT NULL,
	"created_by" integer,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "model_profiles_name_unique" UNIQUE("name")
);
--> statement-breakpoint
ALTER TABLE "model_profiles" ADD CONSTRAINT "model_profiles_created_by_users_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;