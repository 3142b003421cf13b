CREATE TABLE "password_resets" (
	"id" text PRIMARY KEY NOT NULL,
	"user_id" text NOT NULL,
	"token_hash" text NOT NULL,
	"expires_at" timestamp with time zone NOT NULL,
	"used_at" timestamp with time zone,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
ALTER TABLE "sessions" ADD COLUMN "created_at" timestamp with time zone DEFAULT now() NOT NULL;--> statement-breakpoint
ALTER TABLE "shops" ADD COLUMN "address" text;--> statement-breakpoint
ALTER TABLE "shops" ADD COLUMN "phone" text;--> statement-breakpoint
ALTER TABLE "shops" ADD COLUMN "email" text;--> statement-breakpoint
ALTER TABLE "shops" ADD COLUMN "tax_number" text;--> statement-breakpoint
ALTER TABLE "shops" ADD COLUMN "logo_upload_id" text;--> statement-breakpoint
ALTER TABLE "shops" ADD COLUMN "session_idle_hours" integer DEFAULT 12 NOT NULL;--> statement-breakpoint
ALTER TABLE "shops" ADD COLUMN "session_max_days" integer DEFAULT 30 NOT NULL;--> statement-breakpoint
ALTER TABLE "users" ADD COLUMN "deactivated_at" timestamp with time zone;--> statement-breakpoint
ALTER TABLE "password_resets" ADD CONSTRAINT "password_resets_user_id_users_id_fk" FOREIGN KEY ("user_id") REFERENCES "public"."users"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
CREATE UNIQUE INDEX "password_resets_token_unique" ON "password_resets" USING btree ("token_hash");--> statement-breakpoint
CREATE INDEX "password_resets_user_idx" ON "password_resets" USING btree ("user_id");--> statement-breakpoint
CREATE INDEX "sessions_user_idx" ON "sessions" USING btree ("user_id");