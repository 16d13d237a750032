ALTER TABLE "progress_history" ALTER COLUMN "after" DROP NOT NULL;--> statement-breakpoint
ALTER TABLE "progress_entries" ADD COLUMN "deleted_at" timestamp with time zone;--> statement-breakpoint
ALTER TABLE "progress_entries" ADD COLUMN "deleted_by" text;--> statement-breakpoint
ALTER TABLE "progress_entries" ADD CONSTRAINT "progress_entries_deleted_by_users_id_fk" FOREIGN KEY ("deleted_by") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;