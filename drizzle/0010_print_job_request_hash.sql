ALTER TABLE "print_jobs" ADD COLUMN "request_sha256" text;--> statement-breakpoint
CREATE INDEX "print_jobs_request" ON "print_jobs" USING btree ("game_id","request_sha256");