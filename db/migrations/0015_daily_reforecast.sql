ALTER TABLE "projects" ADD COLUMN "daily_reforecast_hour" integer;--> statement-breakpoint
ALTER TABLE "projects" ADD COLUMN "daily_reforecast_by" text;--> statement-breakpoint
ALTER TABLE "projects" ADD COLUMN "daily_reforecast_last_on" date;--> statement-breakpoint
ALTER TABLE "projects" ADD COLUMN "daily_reforecast_note" text;--> statement-breakpoint
ALTER TABLE "projects" ADD CONSTRAINT "projects_daily_reforecast_by_users_id_fk" FOREIGN KEY ("daily_reforecast_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "projects" ADD CONSTRAINT "projects_daily_reforecast_hour_check" CHECK ("daily_reforecast_hour" BETWEEN 0 AND 23);
