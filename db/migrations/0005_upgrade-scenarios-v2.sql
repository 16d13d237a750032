-- Scenario format version 2 (sim/MODEL.md "Scenario versions"; the same rule as sim/upgrade.ts upgradeScenario):
-- a version-1 definition gets schemaVersion 2, one stage over every deck lane with no standing closure, closures
-- with 0 h set-up and take-down, and the version-1 holiday stand-down settings. Every other key is kept as it was,
-- so nothing saved is lost; rows already at version 2 are not touched. The function stays for tests and re-runs.
CREATE OR REPLACE FUNCTION pourline_upgrade_scenario_v2(d jsonb) RETURNS jsonb
LANGUAGE sql IMMUTABLE AS $$
  SELECT CASE
    WHEN jsonb_typeof(d) <> 'object' OR d->'schemaVersion' IS DISTINCT FROM '1'::jsonb THEN d
    ELSE
      d
      || jsonb_build_object('schemaVersion', 2)
      || CASE WHEN d ? 'stages' THEN '{}'::jsonb ELSE jsonb_build_object('stages', jsonb_build_array(jsonb_build_object(
           'id', 'whole-deck', 'name', 'Whole deck',
           'lanes', CASE WHEN jsonb_typeof(d->'deck'->'lanes') = 'array' THEN d->'deck'->'lanes' ELSE '[]'::jsonb END,
           'standingLanesClosed', '[]'::jsonb))) END
      || CASE WHEN jsonb_typeof(d->'calendar') = 'object' THEN jsonb_build_object('calendar',
           (d->'calendar')
           || CASE WHEN jsonb_typeof(d->'calendar'->'closures') = 'array' THEN jsonb_build_object('closures', COALESCE((
                SELECT jsonb_agg(CASE WHEN jsonb_typeof(c) = 'object' THEN '{"setupHours": 0, "takedownHours": 0}'::jsonb || c ELSE c END ORDER BY n)
                FROM jsonb_array_elements(d->'calendar'->'closures') WITH ORDINALITY AS e(c, n)), '[]'::jsonb)) ELSE '{}'::jsonb END
           || CASE WHEN jsonb_typeof(d->'calendar'->'holidays') = 'object' THEN jsonb_build_object('holidays',
                '{"standDownStartHour": 15, "standDownThroughMonday": false}'::jsonb || (d->'calendar'->'holidays')) ELSE '{}'::jsonb END)
         ELSE '{}'::jsonb END
  END
$$;
--> statement-breakpoint
UPDATE "scenarios" SET "definition" = pourline_upgrade_scenario_v2("definition") WHERE "definition"->'schemaVersion' = '1'::jsonb;
--> statement-breakpoint
UPDATE "scenario_revisions" SET "definition" = pourline_upgrade_scenario_v2("definition") WHERE "definition"->'schemaVersion' = '1'::jsonb;
