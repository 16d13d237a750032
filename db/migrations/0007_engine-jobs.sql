CREATE TABLE "engine_jobs" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"kind" text NOT NULL,
	"project_id" uuid NOT NULL,
	"scenario_id" uuid NOT NULL,
	"scenario_version" integer NOT NULL,
	"seed" text NOT NULL,
	"iterations" integer NOT NULL,
	"data_date" date,
	"run_id" uuid,
	"search_id" uuid,
	"boss_job_id" uuid,
	"singleton_key" text NOT NULL,
	"status" text DEFAULT 'queued' NOT NULL,
	"done_units" integer DEFAULT 0 NOT NULL,
	"total_units" integer NOT NULL,
	"time_limit_seconds" integer NOT NULL,
	"error" text,
	"created_by" text,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"started_at" timestamp with time zone,
	"finished_at" timestamp with time zone
);
--> statement-breakpoint
CREATE TABLE "engine_leases" (
	"boss_job_id" uuid PRIMARY KEY NOT NULL,
	"worker_id" uuid NOT NULL,
	"started_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "engine_workers" (
	"id" uuid PRIMARY KEY NOT NULL,
	"host" text NOT NULL,
	"pid" integer NOT NULL,
	"threads" integer NOT NULL,
	"started_at" timestamp with time zone DEFAULT now() NOT NULL,
	"heartbeat_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "plan_search_variants" (
	"search_id" uuid NOT NULL,
	"idx" integer NOT NULL,
	"choice" jsonb,
	"label" text NOT NULL,
	"status" text DEFAULT 'pending' NOT NULL,
	"outcome" jsonb,
	"problem" text,
	"boss_job_id" uuid NOT NULL,
	"finished_at" timestamp with time zone,
	CONSTRAINT "plan_search_variants_search_id_idx_pk" PRIMARY KEY("search_id","idx")
);
--> statement-breakpoint
CREATE TABLE "plan_searches" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"project_id" uuid NOT NULL,
	"scenario_id" uuid NOT NULL,
	"scenario_version" integer NOT NULL,
	"name" text NOT NULL,
	"spec" jsonb NOT NULL,
	"method" text NOT NULL,
	"grid_size" integer NOT NULL,
	"created_by" text NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
ALTER TABLE "simulation_runs" ADD COLUMN "verification" text DEFAULT 'pending' NOT NULL;--> statement-breakpoint
ALTER TABLE "simulation_runs" ADD COLUMN "result_key" text;--> statement-breakpoint
ALTER TABLE "engine_jobs" ADD CONSTRAINT "engine_jobs_project_id_projects_id_fk" FOREIGN KEY ("project_id") REFERENCES "public"."projects"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "engine_jobs" ADD CONSTRAINT "engine_jobs_scenario_id_scenarios_id_fk" FOREIGN KEY ("scenario_id") REFERENCES "public"."scenarios"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "engine_jobs" ADD CONSTRAINT "engine_jobs_run_id_simulation_runs_id_fk" FOREIGN KEY ("run_id") REFERENCES "public"."simulation_runs"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "engine_jobs" ADD CONSTRAINT "engine_jobs_search_id_plan_searches_id_fk" FOREIGN KEY ("search_id") REFERENCES "public"."plan_searches"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "engine_jobs" ADD CONSTRAINT "engine_jobs_created_by_users_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "engine_leases" ADD CONSTRAINT "engine_leases_worker_id_engine_workers_id_fk" FOREIGN KEY ("worker_id") REFERENCES "public"."engine_workers"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "plan_search_variants" ADD CONSTRAINT "plan_search_variants_search_id_plan_searches_id_fk" FOREIGN KEY ("search_id") REFERENCES "public"."plan_searches"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "plan_searches" ADD CONSTRAINT "plan_searches_project_id_projects_id_fk" FOREIGN KEY ("project_id") REFERENCES "public"."projects"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "plan_searches" ADD CONSTRAINT "plan_searches_scenario_id_scenarios_id_fk" FOREIGN KEY ("scenario_id") REFERENCES "public"."scenarios"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "plan_searches" ADD CONSTRAINT "plan_searches_created_by_users_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE UNIQUE INDEX "engine_jobs_singleton_idx" ON "engine_jobs" USING btree ("singleton_key") WHERE status in ('queued', 'running', 'completed');--> statement-breakpoint
CREATE INDEX "engine_jobs_scenario_idx" ON "engine_jobs" USING btree ("scenario_id","created_at");--> statement-breakpoint
CREATE INDEX "plan_searches_scenario_idx" ON "plan_searches" USING btree ("scenario_id","created_at");--> statement-breakpoint
CREATE UNIQUE INDEX "runs_result_key_idx" ON "simulation_runs" USING btree ("result_key");