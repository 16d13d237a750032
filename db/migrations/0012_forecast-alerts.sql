ALTER TABLE "project_members" ADD COLUMN "forecast_alerts" boolean DEFAULT false NOT NULL;--> statement-breakpoint
ALTER TABLE "projects" ADD COLUMN "plan_announced_run_id" uuid;--> statement-breakpoint
ALTER TABLE "projects" ADD CONSTRAINT "projects_plan_announced_run_id_simulation_runs_id_fk" FOREIGN KEY ("plan_announced_run_id") REFERENCES "public"."simulation_runs"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
-- What stands today counts as announced: deploying this must not e-mail forecasts everyone has already seen.
UPDATE "projects" p SET "plan_announced_run_id" = (
  SELECT r."id" FROM "simulation_runs" r
  WHERE r."scenario_id" = p."plan_scenario_id" AND r."verification" IN ('server', 'verified')
  ORDER BY r."created_at" DESC, r."id" DESC LIMIT 1
);
