import { AppError, handler } from "@/lib/server/errors";
import { requireScenario } from "@/lib/server/access";
import { fileName, latestSummaryOf } from "@/lib/server/exports";
import { validateDefinition } from "@/lib/server/scenario-input";
import { percentilesCsv, traceCsv } from "@/lib/exports/results-csv";

/** `?part=percentiles` (default): overall and per-operation P10–P90; `?part=trace`: the representative time–distance trace. */
export const GET = handler(async (req: Request, ctx: { params: Promise<{ scenarioId: string }> }) => {
  const { scenarioId } = await ctx.params;
  const { scenario } = await requireScenario(scenarioId, "read");
  const part = new URL(req.url).searchParams.get("part") ?? "percentiles";
  if (part !== "percentiles" && part !== "trace") throw new AppError("bad_request", "Unknown export.", [{ path: "part", message: "must be percentiles or trace" }]);
  const summary = await latestSummaryOf(scenario);
  const csv = part === "trace" ? traceCsv(summary, validateDefinition(scenario.definition)) : percentilesCsv(summary);
  return new Response(csv, {
    headers: { "content-type": "text/csv; charset=utf-8", "content-disposition": `attachment; filename="${fileName(`${scenario.name}-${part}`, "csv")}"` },
  });
});
