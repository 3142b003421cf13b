CREATE TABLE "fault_dictionaries" (
	"version_id" text NOT NULL,
	"engine_version" text NOT NULL,
	"state" text NOT NULL,
	"parts_done" integer DEFAULT 0 NOT NULL,
	"parts_total" integer DEFAULT 0 NOT NULL,
	"faults" jsonb DEFAULT '[]'::jsonb NOT NULL,
	"error" text,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "fault_dictionaries_version_id_engine_version_pk" PRIMARY KEY("version_id","engine_version")
);
--> statement-breakpoint
CREATE TABLE "fault_dictionary_pairs" (
	"id" bigserial PRIMARY KEY NOT NULL,
	"version_id" text NOT NULL,
	"engine_version" text NOT NULL,
	"fault_key" text NOT NULL,
	"test_keys" jsonb NOT NULL,
	"predictions" "bytea" NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "fault_dictionary_rows" (
	"version_id" text NOT NULL,
	"engine_version" text NOT NULL,
	"position" integer NOT NULL,
	"test" jsonb NOT NULL,
	"predictions" "bytea" NOT NULL,
	CONSTRAINT "fault_dictionary_rows_version_id_engine_version_position_pk" PRIMARY KEY("version_id","engine_version","position")
);
--> statement-breakpoint
ALTER TABLE "fault_dictionaries" ADD CONSTRAINT "fault_dictionaries_version_id_board_model_versions_id_fk" FOREIGN KEY ("version_id") REFERENCES "public"."board_model_versions"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "fault_dictionary_pairs_version" ON "fault_dictionary_pairs" USING btree ("version_id","engine_version");