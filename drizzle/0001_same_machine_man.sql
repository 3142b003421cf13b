CREATE TYPE "public"."customer_kind" AS ENUM('contractor', 'field-technician');--> statement-breakpoint
CREATE TYPE "public"."job_status" AS ENUM('received', 'diagnosing', 'awaiting-review', 'approved', 'repaired', 'verified', 'returned');--> statement-breakpoint
CREATE TYPE "public"."meter_mode" AS ENUM('dcv', 'ohm', 'diode', 'continuity');--> statement-breakpoint
CREATE TYPE "public"."power_state" AS ENUM('on', 'off');--> statement-breakpoint
CREATE TYPE "public"."job_priority" AS ENUM('low', 'normal', 'high');--> statement-breakpoint
CREATE TYPE "public"."reading_phase" AS ENUM('diagnosis', 'verification');--> statement-breakpoint
CREATE TYPE "public"."repair_action" AS ENUM('replaced', 'removed', 'reflowed', 'cleaned');--> statement-breakpoint
CREATE TYPE "public"."review_decision" AS ENUM('approve', 'send-back');--> statement-breakpoint
CREATE TABLE "invitations" (
	"id" text PRIMARY KEY NOT NULL,
	"shop_id" text NOT NULL,
	"email" text NOT NULL,
	"name" text NOT NULL,
	"role" "role" NOT NULL,
	"token_hash" text NOT NULL,
	"invited_by" text NOT NULL,
	"expires_at" timestamp with time zone NOT NULL,
	"accepted_at" timestamp with time zone,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "customers" (
	"id" text PRIMARY KEY NOT NULL,
	"shop_id" text NOT NULL,
	"name" text NOT NULL,
	"company" text,
	"email" text,
	"phone" text,
	"kind" "customer_kind" NOT NULL,
	"notes" text,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "board_model_versions" (
	"id" text PRIMARY KEY NOT NULL,
	"board_id" text NOT NULL,
	"version" integer NOT NULL,
	"document" jsonb NOT NULL,
	"expected_readings" jsonb NOT NULL,
	"note" text,
	"created_by" text,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "board_models" (
	"id" text PRIMARY KEY NOT NULL,
	"shop_id" text NOT NULL,
	"key" text NOT NULL,
	"name" text NOT NULL,
	"current_version" integer NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "fault_codes" (
	"id" text PRIMARY KEY NOT NULL,
	"shop_id" text NOT NULL,
	"board_id" text,
	"code" text NOT NULL,
	"title" text NOT NULL,
	"description" text,
	"sections" text[] DEFAULT '{}' NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "diagnosis_snapshots" (
	"id" text PRIMARY KEY NOT NULL,
	"shop_id" text NOT NULL,
	"job_id" text NOT NULL,
	"engine_version" text NOT NULL,
	"proposed_part" text,
	"output" jsonb NOT NULL,
	"created_by" text NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "jobs" (
	"id" text PRIMARY KEY NOT NULL,
	"shop_id" text NOT NULL,
	"number" integer NOT NULL,
	"customer_id" text NOT NULL,
	"unit_description" text NOT NULL,
	"serial" text,
	"board_id" text NOT NULL,
	"board_version_id" text NOT NULL,
	"fault_code" text,
	"symptom" text NOT NULL,
	"status" "job_status" DEFAULT 'received' NOT NULL,
	"sent_back" boolean DEFAULT false NOT NULL,
	"proposed_part" text,
	"assignee_id" text,
	"priority" "job_priority" DEFAULT 'normal' NOT NULL,
	"received_at" timestamp with time zone DEFAULT now() NOT NULL,
	"due_at" timestamp with time zone,
	"closed_at" timestamp with time zone,
	"created_by" text NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "readings" (
	"id" text PRIMARY KEY NOT NULL,
	"shop_id" text NOT NULL,
	"job_id" text NOT NULL,
	"idempotency_key" text NOT NULL,
	"mode" "meter_mode" NOT NULL,
	"red" text NOT NULL,
	"black" text NOT NULL,
	"red_net" text NOT NULL,
	"black_net" text NOT NULL,
	"power" "power_state" NOT NULL,
	"lifted" text[] DEFAULT '{}' NOT NULL,
	"value" double precision,
	"over_limit" boolean DEFAULT false NOT NULL,
	"unit" text NOT NULL,
	"beep" boolean,
	"raw" text NOT NULL,
	"instrument" text,
	"phase" "reading_phase" DEFAULT 'diagnosis' NOT NULL,
	"supersedes" text,
	"verdict" jsonb,
	"author_id" text NOT NULL,
	"taken_at" timestamp with time zone DEFAULT now() NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "repair_actions" (
	"id" text PRIMARY KEY NOT NULL,
	"shop_id" text NOT NULL,
	"job_id" text NOT NULL,
	"part" text NOT NULL,
	"action" "repair_action" NOT NULL,
	"replacement_value" text,
	"marking" text,
	"notes" text,
	"upload_ids" text[] DEFAULT '{}' NOT NULL,
	"author_id" text NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "reviews" (
	"id" text PRIMARY KEY NOT NULL,
	"shop_id" text NOT NULL,
	"job_id" text NOT NULL,
	"reviewer_id" text NOT NULL,
	"decision" "review_decision" NOT NULL,
	"comment" text DEFAULT '' NOT NULL,
	"proposed_part" text,
	"snapshot_id" text,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "uploads" (
	"id" text PRIMARY KEY NOT NULL,
	"shop_id" text NOT NULL,
	"job_id" text,
	"content_type" text NOT NULL,
	"size" integer NOT NULL,
	"sha256" text NOT NULL,
	"name" text,
	"storage_key" text NOT NULL,
	"created_by" text NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
ALTER TABLE "shops" ADD COLUMN "next_job_number" integer DEFAULT 1001 NOT NULL;--> statement-breakpoint
ALTER TABLE "invitations" ADD CONSTRAINT "invitations_shop_id_shops_id_fk" FOREIGN KEY ("shop_id") REFERENCES "public"."shops"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "invitations" ADD CONSTRAINT "invitations_invited_by_users_id_fk" FOREIGN KEY ("invited_by") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "customers" ADD CONSTRAINT "customers_shop_id_shops_id_fk" FOREIGN KEY ("shop_id") REFERENCES "public"."shops"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "board_model_versions" ADD CONSTRAINT "board_model_versions_board_id_board_models_id_fk" FOREIGN KEY ("board_id") REFERENCES "public"."board_models"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "board_model_versions" ADD CONSTRAINT "board_model_versions_created_by_users_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "board_models" ADD CONSTRAINT "board_models_shop_id_shops_id_fk" FOREIGN KEY ("shop_id") REFERENCES "public"."shops"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "fault_codes" ADD CONSTRAINT "fault_codes_shop_id_shops_id_fk" FOREIGN KEY ("shop_id") REFERENCES "public"."shops"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "fault_codes" ADD CONSTRAINT "fault_codes_board_id_board_models_id_fk" FOREIGN KEY ("board_id") REFERENCES "public"."board_models"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "diagnosis_snapshots" ADD CONSTRAINT "diagnosis_snapshots_shop_id_shops_id_fk" FOREIGN KEY ("shop_id") REFERENCES "public"."shops"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "diagnosis_snapshots" ADD CONSTRAINT "diagnosis_snapshots_job_id_jobs_id_fk" FOREIGN KEY ("job_id") REFERENCES "public"."jobs"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "diagnosis_snapshots" ADD CONSTRAINT "diagnosis_snapshots_created_by_users_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "jobs" ADD CONSTRAINT "jobs_shop_id_shops_id_fk" FOREIGN KEY ("shop_id") REFERENCES "public"."shops"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "jobs" ADD CONSTRAINT "jobs_customer_id_customers_id_fk" FOREIGN KEY ("customer_id") REFERENCES "public"."customers"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "jobs" ADD CONSTRAINT "jobs_board_id_board_models_id_fk" FOREIGN KEY ("board_id") REFERENCES "public"."board_models"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "jobs" ADD CONSTRAINT "jobs_board_version_id_board_model_versions_id_fk" FOREIGN KEY ("board_version_id") REFERENCES "public"."board_model_versions"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "jobs" ADD CONSTRAINT "jobs_assignee_id_users_id_fk" FOREIGN KEY ("assignee_id") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "jobs" ADD CONSTRAINT "jobs_created_by_users_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "readings" ADD CONSTRAINT "readings_shop_id_shops_id_fk" FOREIGN KEY ("shop_id") REFERENCES "public"."shops"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "readings" ADD CONSTRAINT "readings_job_id_jobs_id_fk" FOREIGN KEY ("job_id") REFERENCES "public"."jobs"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "readings" ADD CONSTRAINT "readings_author_id_users_id_fk" FOREIGN KEY ("author_id") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "repair_actions" ADD CONSTRAINT "repair_actions_shop_id_shops_id_fk" FOREIGN KEY ("shop_id") REFERENCES "public"."shops"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "repair_actions" ADD CONSTRAINT "repair_actions_job_id_jobs_id_fk" FOREIGN KEY ("job_id") REFERENCES "public"."jobs"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "repair_actions" ADD CONSTRAINT "repair_actions_author_id_users_id_fk" FOREIGN KEY ("author_id") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "reviews" ADD CONSTRAINT "reviews_shop_id_shops_id_fk" FOREIGN KEY ("shop_id") REFERENCES "public"."shops"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "reviews" ADD CONSTRAINT "reviews_job_id_jobs_id_fk" FOREIGN KEY ("job_id") REFERENCES "public"."jobs"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "reviews" ADD CONSTRAINT "reviews_reviewer_id_users_id_fk" FOREIGN KEY ("reviewer_id") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "reviews" ADD CONSTRAINT "reviews_snapshot_id_diagnosis_snapshots_id_fk" FOREIGN KEY ("snapshot_id") REFERENCES "public"."diagnosis_snapshots"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "uploads" ADD CONSTRAINT "uploads_shop_id_shops_id_fk" FOREIGN KEY ("shop_id") REFERENCES "public"."shops"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "uploads" ADD CONSTRAINT "uploads_job_id_jobs_id_fk" FOREIGN KEY ("job_id") REFERENCES "public"."jobs"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "uploads" ADD CONSTRAINT "uploads_created_by_users_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE UNIQUE INDEX "invitations_token_unique" ON "invitations" USING btree ("token_hash");--> statement-breakpoint
CREATE INDEX "invitations_shop_idx" ON "invitations" USING btree ("shop_id");--> statement-breakpoint
CREATE INDEX "customers_shop_idx" ON "customers" USING btree ("shop_id","name");--> statement-breakpoint
CREATE UNIQUE INDEX "board_model_versions_unique" ON "board_model_versions" USING btree ("board_id","version");--> statement-breakpoint
CREATE UNIQUE INDEX "board_models_shop_key_unique" ON "board_models" USING btree ("shop_id","key");--> statement-breakpoint
CREATE INDEX "fault_codes_shop_idx" ON "fault_codes" USING btree ("shop_id","board_id");--> statement-breakpoint
CREATE INDEX "diagnosis_snapshots_job_idx" ON "diagnosis_snapshots" USING btree ("job_id","created_at");--> statement-breakpoint
CREATE UNIQUE INDEX "jobs_shop_number_unique" ON "jobs" USING btree ("shop_id","number");--> statement-breakpoint
CREATE INDEX "jobs_shop_status_idx" ON "jobs" USING btree ("shop_id","status");--> statement-breakpoint
CREATE INDEX "jobs_assignee_idx" ON "jobs" USING btree ("assignee_id");--> statement-breakpoint
CREATE UNIQUE INDEX "readings_job_key_unique" ON "readings" USING btree ("job_id","idempotency_key");--> statement-breakpoint
CREATE UNIQUE INDEX "readings_supersedes_unique" ON "readings" USING btree ("supersedes") WHERE "readings"."supersedes" is not null;--> statement-breakpoint
CREATE INDEX "readings_job_idx" ON "readings" USING btree ("job_id","created_at");--> statement-breakpoint
CREATE INDEX "repair_actions_job_idx" ON "repair_actions" USING btree ("job_id","created_at");--> statement-breakpoint
CREATE INDEX "reviews_job_idx" ON "reviews" USING btree ("job_id","created_at");--> statement-breakpoint
CREATE INDEX "uploads_shop_idx" ON "uploads" USING btree ("shop_id","job_id");