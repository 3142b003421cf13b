CREATE TABLE "shop_rules" (
	"shop_id" text PRIMARY KEY NOT NULL,
	"self_approval" boolean DEFAULT false NOT NULL,
	"correct_others_min_role" "role" DEFAULT 'lead' NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
ALTER TABLE "readings" ADD COLUMN "request_hash" text;--> statement-breakpoint
ALTER TABLE "customer_links" ADD COLUMN "recipient_name" text;--> statement-breakpoint
ALTER TABLE "customer_links" ADD COLUMN "recipient_email" text;--> statement-breakpoint
ALTER TABLE "payments" ADD COLUMN "refund_due" boolean DEFAULT false NOT NULL;--> statement-breakpoint
ALTER TABLE "quotes" ADD COLUMN "decided_via_link_id" text;--> statement-breakpoint
ALTER TABLE "quotes" ADD COLUMN "decided_by_email" text;--> statement-breakpoint
ALTER TABLE "shop_rules" ADD CONSTRAINT "shop_rules_shop_id_shops_id_fk" FOREIGN KEY ("shop_id") REFERENCES "public"."shops"("id") ON DELETE no action ON UPDATE no action;