ALTER TABLE "projects" ADD COLUMN "closure_weekly_day" integer;--> statement-breakpoint
ALTER TABLE "projects" ADD COLUMN "closure_weekly_hour" integer;--> statement-breakpoint
ALTER TABLE "projects" ADD COLUMN "closure_weekly_last_on" date;--> statement-breakpoint
ALTER TABLE "projects" ADD COLUMN "closure_weekly_note" text;--> statement-breakpoint
ALTER TABLE "projects" ADD CONSTRAINT "projects_closure_weekly_day_check" CHECK ("closure_weekly_day" BETWEEN 0 AND 6);--> statement-breakpoint
ALTER TABLE "projects" ADD CONSTRAINT "projects_closure_weekly_hour_check" CHECK ("closure_weekly_hour" BETWEEN 0 AND 23);--> statement-breakpoint
ALTER TABLE "projects" ADD CONSTRAINT "projects_closure_weekly_both" CHECK (("closure_weekly_day" IS NULL) = ("closure_weekly_hour" IS NULL));
