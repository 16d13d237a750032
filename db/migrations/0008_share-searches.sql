ALTER TYPE "public"."share_scope" ADD VALUE 'search';--> statement-breakpoint
ALTER TABLE "share_links" ADD COLUMN "search_id" uuid;--> statement-breakpoint
ALTER TABLE "share_links" ADD CONSTRAINT "share_links_search_id_plan_searches_id_fk" FOREIGN KEY ("search_id") REFERENCES "public"."plan_searches"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "share_links_search_idx" ON "share_links" USING btree ("search_id");--> statement-breakpoint
ALTER TABLE "share_links" ADD CONSTRAINT "share_links_search_scope" CHECK (("share_links"."scope"::text = 'search') = ("share_links"."search_id" is not null));