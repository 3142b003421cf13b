ALTER TABLE "shops" ADD COLUMN "meter_profile" text;--> statement-breakpoint
ALTER TABLE "jobs" ADD COLUMN "meter_profile" text;