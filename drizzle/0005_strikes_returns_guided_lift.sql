CREATE TABLE "reading_strikes" (
	"id" text PRIMARY KEY NOT NULL,
	"shop_id" text NOT NULL,
	"job_id" text NOT NULL,
	"reading_id" text NOT NULL,
	"reason" text NOT NULL,
	"author_id" text NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
ALTER TABLE "jobs" ADD COLUMN "returned_via" text;--> statement-breakpoint
ALTER TABLE "jobs" ADD COLUMN "proposal_note" text;--> statement-breakpoint
ALTER TABLE "jobs" ADD COLUMN "guided_lifted_by" text;--> statement-breakpoint
ALTER TABLE "reading_strikes" ADD CONSTRAINT "reading_strikes_shop_id_shops_id_fk" FOREIGN KEY ("shop_id") REFERENCES "public"."shops"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "reading_strikes" ADD CONSTRAINT "reading_strikes_job_id_jobs_id_fk" FOREIGN KEY ("job_id") REFERENCES "public"."jobs"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "reading_strikes" ADD CONSTRAINT "reading_strikes_reading_id_readings_id_fk" FOREIGN KEY ("reading_id") REFERENCES "public"."readings"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "reading_strikes" ADD CONSTRAINT "reading_strikes_author_id_users_id_fk" FOREIGN KEY ("author_id") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE UNIQUE INDEX "reading_strikes_reading_unique" ON "reading_strikes" USING btree ("reading_id");--> statement-breakpoint
CREATE INDEX "reading_strikes_job_idx" ON "reading_strikes" USING btree ("job_id");--> statement-breakpoint
ALTER TABLE "jobs" ADD CONSTRAINT "jobs_guided_lifted_by_users_id_fk" FOREIGN KEY ("guided_lifted_by") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;