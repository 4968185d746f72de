CREATE TABLE "object_versions" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"game_id" uuid NOT NULL,
	"collection" text NOT NULL,
	"object_id" text NOT NULL,
	"version" integer NOT NULL,
	"action" text NOT NULL,
	"restored_from" integer,
	"data" jsonb NOT NULL,
	"changed_by" uuid,
	"changed_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
ALTER TABLE "object_versions" ADD CONSTRAINT "object_versions_game_id_games_id_fk" FOREIGN KEY ("game_id") REFERENCES "public"."games"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "object_versions" ADD CONSTRAINT "object_versions_changed_by_users_id_fk" FOREIGN KEY ("changed_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "object_versions_object" ON "object_versions" USING btree ("game_id","collection","object_id","changed_at");--> statement-breakpoint
CREATE INDEX "object_versions_game" ON "object_versions" USING btree ("game_id","changed_at");--> statement-breakpoint
-- Objects saved before versions were kept start their history at the version they have now.
INSERT INTO "object_versions" ("game_id", "collection", "object_id", "version", "action", "data", "changed_by", "changed_at")
SELECT "game_id", "collection", "id", "version", 'saved', "data", "updated_by", "updated_at" FROM "game_objects";
