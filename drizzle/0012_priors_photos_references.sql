CREATE TABLE "reference_readings" (
	"id" text PRIMARY KEY NOT NULL,
	"set_id" text NOT NULL,
	"mode" text NOT NULL,
	"power" text NOT NULL,
	"red" text NOT NULL,
	"black" text NOT NULL,
	"red_net" text NOT NULL,
	"black_net" text NOT NULL,
	"value" double precision,
	"over_limit" boolean DEFAULT false NOT NULL
);
--> statement-breakpoint
CREATE TABLE "reference_sets" (
	"id" text PRIMARY KEY NOT NULL,
	"shop_id" text NOT NULL,
	"board_id" text NOT NULL,
	"version_id" text NOT NULL,
	"job_id" text,
	"serial" text,
	"note" text,
	"created_by" text NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "upload_refusals" (
	"id" text PRIMARY KEY NOT NULL,
	"shop_id" text NOT NULL,
	"job_id" text NOT NULL,
	"name" text,
	"size" integer NOT NULL,
	"reason" text NOT NULL,
	"created_by" text NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
ALTER TABLE "fault_codes" ADD COLUMN "weights" jsonb DEFAULT '{}'::jsonb NOT NULL;--> statement-breakpoint
ALTER TABLE "uploads" ADD COLUMN "width" integer;--> statement-breakpoint
ALTER TABLE "uploads" ADD COLUMN "height" integer;--> statement-breakpoint
ALTER TABLE "uploads" ADD COLUMN "original_size" integer;--> statement-breakpoint
ALTER TABLE "reference_readings" ADD CONSTRAINT "reference_readings_set_id_reference_sets_id_fk" FOREIGN KEY ("set_id") REFERENCES "public"."reference_sets"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "reference_sets" ADD CONSTRAINT "reference_sets_shop_id_shops_id_fk" FOREIGN KEY ("shop_id") REFERENCES "public"."shops"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "reference_sets" ADD CONSTRAINT "reference_sets_board_id_board_models_id_fk" FOREIGN KEY ("board_id") REFERENCES "public"."board_models"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "reference_sets" ADD CONSTRAINT "reference_sets_version_id_board_model_versions_id_fk" FOREIGN KEY ("version_id") REFERENCES "public"."board_model_versions"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "reference_sets" ADD CONSTRAINT "reference_sets_created_by_users_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "upload_refusals" ADD CONSTRAINT "upload_refusals_shop_id_shops_id_fk" FOREIGN KEY ("shop_id") REFERENCES "public"."shops"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "upload_refusals" ADD CONSTRAINT "upload_refusals_job_id_jobs_id_fk" FOREIGN KEY ("job_id") REFERENCES "public"."jobs"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "upload_refusals" ADD CONSTRAINT "upload_refusals_created_by_users_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "reference_readings_set_idx" ON "reference_readings" USING btree ("set_id");--> statement-breakpoint
CREATE INDEX "reference_sets_board_idx" ON "reference_sets" USING btree ("shop_id","board_id");--> statement-breakpoint
CREATE UNIQUE INDEX "reference_sets_job_unique" ON "reference_sets" USING btree ("job_id");--> statement-breakpoint
CREATE INDEX "upload_refusals_job_idx" ON "upload_refusals" USING btree ("job_id","created_at");