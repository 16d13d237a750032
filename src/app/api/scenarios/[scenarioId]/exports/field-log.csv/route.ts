import { AppError, handler } from "@/lib/server/errors";
import { requireScenario } from "@/lib/server/access";
import { fileName } from "@/lib/server/exports";
import { validateDefinition } from "@/lib/server/scenario-input";
import { fieldLogCsv } from "@/lib/exports/field-log-csv";
import { listDeletedProgress, listProgress } from "@db/queries/progress";

/**
 * The scenario's field log as CSV, every recorded shift in the order worked (any member; archived projects too);
 * `?deleted=include`: the deleted shifts too, each row marked recorded or deleted (src/lib/exports/field-log-csv.ts).
 */
export const GET = handler(async (req: Request, ctx: { params: Promise<{ scenarioId: string }> }) => {
  const { scenarioId } = await ctx.params;
  const { scenario } = await requireScenario(scenarioId, "read");
  const deleted = new URL(req.url).searchParams.get("deleted");
  if (deleted !== null && deleted !== "include") throw new AppError("bad_request", "Unknown export.", [{ path: "deleted", message: "must be include, or left out" }]);
  const plan = validateDefinition(scenario.definition);
  const names = {
    operations: Object.fromEntries(plan.operations.map((o) => [o.id, o.name])),
    shifts: Object.fromEntries(plan.calendar.shifts.map((s) => [s.id, s.name])),
  };
  const [rows, gone] = await Promise.all([listProgress({ scenarioId }), deleted ? listDeletedProgress({ scenarioId }) : null]);
  const csv = fieldLogCsv(rows, names, gone ? { deleted: gone } : {});
  const name = deleted ? `${scenario.name}-field-log-with-deleted` : `${scenario.name}-field-log`;
  return new Response(csv, {
    headers: { "content-type": "text/csv; charset=utf-8", "content-disposition": `attachment; filename="${fileName(name, "csv")}"` },
  });
});
