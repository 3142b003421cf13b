CREATE TABLE "bin_parts" (
	"id" text PRIMARY KEY NOT NULL,
	"shop_id" text NOT NULL,
	"value" text NOT NULL,
	"nominal" double precision,
	"package" text NOT NULL,
	"rating" text,
	"marking" text,
	"quantity" integer NOT NULL,
	"drawer" text NOT NULL,
	"minimum" integer DEFAULT 0 NOT NULL,
	"unit_cents" bigint DEFAULT 0 NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "bin_takes" (
	"id" text PRIMARY KEY NOT NULL,
	"shop_id" text NOT NULL,
	"bin_part_id" text NOT NULL,
	"job_id" text NOT NULL,
	"repair_id" text NOT NULL,
	"quantity" integer NOT NULL,
	"taken_by" text NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "service_terms" (
	"shop_id" text PRIMARY KEY NOT NULL,
	"warranty_days" integer DEFAULT 90 NOT NULL,
	"labour_rate_cents" bigint DEFAULT 0 NOT NULL,
	"repair_minutes" integer DEFAULT 60 NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
ALTER TABLE "jobs" ADD COLUMN "unit_serial" text;--> statement-breakpoint
ALTER TABLE "bin_parts" ADD CONSTRAINT "bin_parts_shop_id_shops_id_fk" FOREIGN KEY ("shop_id") REFERENCES "public"."shops"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "bin_takes" ADD CONSTRAINT "bin_takes_shop_id_shops_id_fk" FOREIGN KEY ("shop_id") REFERENCES "public"."shops"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "bin_takes" ADD CONSTRAINT "bin_takes_bin_part_id_bin_parts_id_fk" FOREIGN KEY ("bin_part_id") REFERENCES "public"."bin_parts"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "bin_takes" ADD CONSTRAINT "bin_takes_job_id_jobs_id_fk" FOREIGN KEY ("job_id") REFERENCES "public"."jobs"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "bin_takes" ADD CONSTRAINT "bin_takes_repair_id_repair_actions_id_fk" FOREIGN KEY ("repair_id") REFERENCES "public"."repair_actions"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "bin_takes" ADD CONSTRAINT "bin_takes_taken_by_users_id_fk" FOREIGN KEY ("taken_by") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "service_terms" ADD CONSTRAINT "service_terms_shop_id_shops_id_fk" FOREIGN KEY ("shop_id") REFERENCES "public"."shops"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "bin_parts_shop_idx" ON "bin_parts" USING btree ("shop_id","drawer");--> statement-breakpoint
CREATE INDEX "bin_takes_job_idx" ON "bin_takes" USING btree ("job_id");--> statement-breakpoint
CREATE INDEX "bin_takes_part_idx" ON "bin_takes" USING btree ("bin_part_id");--> statement-breakpoint
CREATE INDEX "jobs_shop_serial_idx" ON "jobs" USING btree ("shop_id",lower("serial"));--> statement-breakpoint
CREATE INDEX "jobs_shop_unit_serial_idx" ON "jobs" USING btree ("shop_id",lower("unit_serial"));--> statement-breakpoint
ALTER TABLE "bin_parts" ADD CONSTRAINT "bin_parts_quantity_not_negative" CHECK ("bin_parts"."quantity" >= 0);
