CREATE TYPE "public"."share_scope" AS ENUM('scenario', 'closure-feed');--> statement-breakpoint
ALTER TABLE "email_outbox" ADD COLUMN "requested_by" text;--> statement-breakpoint
ALTER TABLE "email_outbox" ADD COLUMN "project_id" uuid;--> statement-breakpoint
ALTER TABLE "sessions" ADD COLUMN "created_at" timestamp with time zone DEFAULT now() NOT NULL;--> statement-breakpoint
ALTER TABLE "share_links" ADD COLUMN "scope" "share_scope" DEFAULT 'scenario' NOT NULL;--> statement-breakpoint
ALTER TABLE "email_outbox" ADD CONSTRAINT "email_outbox_requested_by_users_id_fk" FOREIGN KEY ("requested_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "email_outbox" ADD CONSTRAINT "email_outbox_project_id_projects_id_fk" FOREIGN KEY ("project_id") REFERENCES "public"."projects"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "outbox_requested_by_idx" ON "email_outbox" USING btree ("requested_by","created_at");--> statement-breakpoint
CREATE INDEX "outbox_project_idx" ON "email_outbox" USING btree ("project_id","created_at");--> statement-breakpoint
-- Links created by publishing closures are calendar feeds: from now on they open the feed and nothing else.
UPDATE "share_links" SET "scope" = 'closure-feed' WHERE "id" IN (SELECT "share_link_id" FROM "closure_publications");--> statement-breakpoint
-- Session ids are now stored as SHA-256 of the cookie token; the old rows hold raw tokens, so they all end here.
DELETE FROM "sessions";
