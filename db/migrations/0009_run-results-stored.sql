-- The stored copy of each run's results that GET /api/runs/:id sends (db/stored-results.ts). Rows stored before this
-- migration keep the four columns null; the route fills them on a row's first read (gzip cannot be made in SQL).
ALTER TABLE "simulation_runs" ADD COLUMN "results_deflate" "bytea";--> statement-breakpoint
ALTER TABLE "simulation_runs" ADD COLUMN "results_crc32" bigint;--> statement-breakpoint
ALTER TABLE "simulation_runs" ADD COLUMN "results_length" integer;--> statement-breakpoint
ALTER TABLE "simulation_runs" ADD COLUMN "results_etag" text;--> statement-breakpoint
ALTER TABLE "simulation_runs" ADD CONSTRAINT "runs_stored_results_whole" CHECK (num_nonnulls("simulation_runs"."results_deflate", "simulation_runs"."results_crc32", "simulation_runs"."results_length", "simulation_runs"."results_etag") in (0, 4));