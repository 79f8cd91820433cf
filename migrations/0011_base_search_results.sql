CREATE TABLE "base_search_results" (
	"engine_version" text NOT NULL,
	"rotary_dim" integer NOT NULL,
	"target_context" bigint NOT NULL,
	"grid_from" double precision NOT NULL,
	"grid_to" double precision NOT NULL,
	"grid_per_decade" integer NOT NULL,
	"answer" jsonb,
	"claimed_at" timestamp with time zone DEFAULT now() NOT NULL,
	"computed_at" timestamp with time zone,
	CONSTRAINT "base_search_results_pk" PRIMARY KEY("engine_version","rotary_dim","target_context","grid_from","grid_to","grid_per_decade")
);
