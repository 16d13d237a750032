-- Rows written before the column existed say what they did through before/after (no restore existed yet).
ALTER TABLE "progress_history" ADD COLUMN "action" text NOT NULL DEFAULT 'edit';--> statement-breakpoint
UPDATE "progress_history" SET "action" = CASE WHEN "before" IS NULL THEN 'create' WHEN "after" IS NULL THEN 'delete' ELSE 'edit' END;--> statement-breakpoint
-- From now on every write states its action.
ALTER TABLE "progress_history" ALTER COLUMN "action" DROP DEFAULT;
