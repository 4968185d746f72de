ALTER TABLE "games" ADD COLUMN "press_profile_id" uuid;--> statement-breakpoint
ALTER TABLE "printer_profiles" ADD COLUMN "output" text DEFAULT 'plain' NOT NULL;--> statement-breakpoint
ALTER TABLE "printer_profiles" ADD COLUMN "intent" text DEFAULT 'relative' NOT NULL;--> statement-breakpoint
ALTER TABLE "printer_profiles" ADD COLUMN "icc_profile" "bytea";--> statement-breakpoint
ALTER TABLE "printer_profiles" ADD COLUMN "icc_name" text;--> statement-breakpoint
ALTER TABLE "printer_profiles" ADD COLUMN "press_condition" text;--> statement-breakpoint
ALTER TABLE "printer_profiles" ADD COLUMN "press_condition_info" text;--> statement-breakpoint
ALTER TABLE "printer_profiles" ADD COLUMN "press_registry" text;--> statement-breakpoint
ALTER TABLE "printer_profiles" ADD COLUMN "ink_limit_pct" integer;--> statement-breakpoint
ALTER TABLE "games" ADD CONSTRAINT "games_press_profile_id_printer_profiles_id_fk" FOREIGN KEY ("press_profile_id") REFERENCES "public"."printer_profiles"("id") ON DELETE set null ON UPDATE no action;