CREATE TABLE "accelerators" (
	"id" serial PRIMARY KEY NOT NULL,
	"name" text NOT NULL,
	"memory_bytes" double precision NOT NULL,
	"peak_flops" double precision NOT NULL,
	"price_per_hour" double precision NOT NULL,
	"notes" text DEFAULT '' NOT NULL,
	"created_by" integer,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "accelerators_name_unique" UNIQUE("name")
);
--> statement-breakpoint
ALTER TABLE "accelerators" ADD CONSTRAINT "accelerators_created_by_users_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;