CREATE TABLE "board_drafts" (
	"board_id" text PRIMARY KEY NOT NULL,
	"capture" jsonb NOT NULL,
	"result" jsonb NOT NULL,
	"saved_by" text,
	"saved_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
ALTER TABLE "board_drafts" ADD CONSTRAINT "board_drafts_board_id_board_models_id_fk" FOREIGN KEY ("board_id") REFERENCES "public"."board_models"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "board_drafts" ADD CONSTRAINT "board_drafts_saved_by_users_id_fk" FOREIGN KEY ("saved_by") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;