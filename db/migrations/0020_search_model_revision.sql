-- Searches started before this column computed their plans under the first revision of the model rules; later ones name theirs (no default).
ALTER TABLE "plan_searches" ADD COLUMN "model_revision" integer NOT NULL DEFAULT 1;--> statement-breakpoint
ALTER TABLE "plan_searches" ALTER COLUMN "model_revision" DROP DEFAULT;
