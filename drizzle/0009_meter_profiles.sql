CREATE TABLE "meter_profiles" (
	"id" text PRIMARY KEY NOT NULL,
	"shop_id" text NOT NULL,
	"name" text NOT NULL,
	"mapping" jsonb NOT NULL,
	"default_mode" "meter_mode" DEFAULT 'dcv' NOT NULL,
	"default_reference" text DEFAULT 'gnd' NOT NULL,
	"power" "power_state" DEFAULT 'on' NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
ALTER TABLE "meter_profiles" ADD CONSTRAINT "meter_profiles_shop_id_shops_id_fk" FOREIGN KEY ("shop_id") REFERENCES "public"."shops"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE UNIQUE INDEX "meter_profiles_shop_name_unique" ON "meter_profiles" USING btree ("shop_id","name");