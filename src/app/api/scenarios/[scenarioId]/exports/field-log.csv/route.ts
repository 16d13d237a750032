import { handler } from "@/lib/server/errors";
import { requireScenario } from "@/lib/server/access";
import { fileName } from "@/lib/server/exports";
import { validateDefinition } from "@/lib/server/scenario-input";
import { fieldLogCsv } from "@/lib/exports/field-log-csv";
import { listProgress } from "@db/queries/progress";

/** The scenario's field log as CSV, every recorded shift in the order worked (any member; archived projects too). */
export const GET = handler(async (_req: Request, ctx: { params: Promise<{ scenarioId: string }> }) => {
  const { scenarioId } = await ctx.params;
  const { scenario } = await requireScenario(scenarioId, "read");
  const plan = validateDefinition(scenario.definition);
  const csv = fieldLogCsv(await listProgress({ scenarioId }), {
    operations: Object.fromEntries(plan.operations.map((o) => [o.id, o.name])),
    shifts: Object.fromEntries(plan.calendar.shifts.map((s) => [s.id, s.name])),
  });
  return new Response(csv, {
    headers: { "content-type": "text/csv; charset=utf-8", "content-disposition": `attachment; filename="${fileName(`${scenario.name}-field-log`, "csv")}"` },
  });
});
