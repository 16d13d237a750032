-- Runs stored before this column were computed under the first revision of the model rules; later inserts name theirs (no default).
ALTER TABLE "simulation_runs" ADD COLUMN "model_revision" integer NOT NULL DEFAULT 1;--> statement-breakpoint
ALTER TABLE "simulation_runs" ALTER COLUMN "model_revision" DROP DEFAULT;
