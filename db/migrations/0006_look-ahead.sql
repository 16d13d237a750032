CREATE TABLE "look_ahead_notices" (
	"scenario_id" uuid PRIMARY KEY NOT NULL,
	"enabled" boolean DEFAULT true NOT NULL,
	"recipients" jsonb NOT NULL,
	"hour" integer NOT NULL,
	"last_sent_on" date,
	"last_board" jsonb,
	"updated_by" text NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "project_forecasts" (
	"project_id" uuid PRIMARY KEY NOT NULL,
	"latitude" double precision NOT NULL,
	"longitude" double precision NOT NULL,
	"data" jsonb,
	"fetched_at" timestamp with time zone,
	"last_attempt_at" timestamp with time zone,
	"last_error" text
);
--> statement-breakpoint
ALTER TABLE "projects" ADD COLUMN "latitude" double precision;--> statement-breakpoint
ALTER TABLE "projects" ADD COLUMN "longitude" double precision;--> statement-breakpoint
ALTER TABLE "look_ahead_notices" ADD CONSTRAINT "look_ahead_notices_scenario_id_scenarios_id_fk" FOREIGN KEY ("scenario_id") REFERENCES "public"."scenarios"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "look_ahead_notices" ADD CONSTRAINT "look_ahead_notices_updated_by_users_id_fk" FOREIGN KEY ("updated_by") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "project_forecasts" ADD CONSTRAINT "project_forecasts_project_id_projects_id_fk" FOREIGN KEY ("project_id") REFERENCES "public"."projects"("id") ON DELETE cascade ON UPDATE no action;