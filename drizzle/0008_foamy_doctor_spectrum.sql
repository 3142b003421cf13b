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
ALTER TABLE "upload_refusals" ADD CONSTRAINT "upload_refusals_shop_id_shops_id_fk" FOREIGN KEY ("shop_id") REFERENCES "public"."shops"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "upload_refusals" ADD CONSTRAINT "upload_refusals_job_id_jobs_id_fk" FOREIGN KEY ("job_id") REFERENCES "public"."jobs"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "upload_refusals" ADD CONSTRAINT "upload_refusals_created_by_users_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "upload_refusals_job_idx" ON "upload_refusals" USING btree ("job_id","created_at");