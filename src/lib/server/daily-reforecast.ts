import "server-only";
/**
 * The daily re-forecast: once a local day, after the hour a project's administrator or engineer chose, each plan of
 * record whose newest re-forecast is behind the field log (src/lib/daily-reforecast.ts says when) is re-forecast
 * from the day before — queued as the person who set it up, exactly as if they had pressed Re-forecast, so the
 * forecast e-mails, the project list and the drift chart follow as for any re-forecast. Each day's decision is kept
 * in words on the project; a queue that does not answer hands the day back for the next pass. Started by src/instrumentation.ts (POURLINE_DAILY_REFORECAST=off disables it; the pace is
 * POURLINE_NOTICE_INTERVAL_MS, default 60 s).
 */
import { HORIZON_DAYS } from "@sim/calendar";
import { formatDayNumber, parseIsoDate } from "@sim/dates";
import { claimDailyReforecastDay, getNewestReforecastBasis, listDailyReforecastPlans, releaseDailyReforecastDay, setDailyReforecastNote } from "@db/queries/daily-reforecast";
import { iterationsThatFit } from "@sim/budget";
import { getScenario } from "@db/queries/scenarios";
import { dailyDecision, dayToConsider } from "@/lib/daily-reforecast";
import { formatIsoDate } from "@/lib/format";
import { can, type ProjectRole } from "@/lib/permissions";
import { eachItemOnItsOwn, startBackgroundPass } from "./background-pass";
import { AppError } from "./errors";
import { queueReforecast } from "./progress";
import { validateDefinition } from "./scenario-input";

/** One pass: the projects looked at for their day, with what was decided (the tests read it; the page reads the note). */
export async function runDailyReforecasts(now = new Date()): Promise<{ projectId: string; note: string; jobId?: string }[]> {
  const done: { projectId: string; note: string; jobId?: string }[] = [];
  await eachItemOnItsOwn("daily re-forecast", await listDailyReforecastPlans(), (p) => p.projectId, async (p) => {
    // Most passes end here: the day was looked at already, or its hour has not come (no further query).
    const day = p.hour === null ? null : dayToConsider({ now, timeZone: p.timeZone ?? "UTC", hour: p.hour, lastOn: p.lastOn });
    if (day === null || !(await claimDailyReforecastDay({ projectId: p.projectId, day }))) return;
    const scenario = await getScenario({ id: p.scenarioId });
    if (!scenario) return; // deleted since the list was read
    let plan;
    try {
      plan = validateDefinition(scenario.definition);
    } catch {
      return; // a stored plan always parses; an unreadable one is not this pass's to report
    }
    const said = (text: string, jobId?: string) => {
      const note = `On ${formatIsoDate(day)}: ${text}`;
      done.push({ projectId: p.projectId, note, ...(jobId ? { jobId } : {}) });
      return setDailyReforecastNote({ projectId: p.projectId, note });
    };
    if (!p.userId || !can(p.role as ProjectRole | null, "runScenario")) {
      await said("no re-forecast — the person who set it up may no longer run this project's plans; set it up again.");
      return;
    }
    const decision = dailyDecision({
      day,
      startDate: plan.startDate,
      lastDataDate: formatDayNumber(parseIsoDate(plan.startDate) + HORIZON_DAYS - 1),
      newest: await getNewestReforecastBasis({ scenarioId: scenario.id }),
    });
    if (!decision.due) {
      await said(`no re-forecast needed — ${decision.why}.`);
      return;
    }
    // The newest re-forecast's iterations, as many as still fit the server's work budget (the plan may have grown
    // since); a plan too large for even the fewest is refused in words below.
    const iterations = Math.max(10, Math.min(decision.iterations, iterationsThatFit(plan, "server")));
    try {
      const job = await queueReforecast({ scenario, body: { dataDate: decision.dataDate, seed: decision.seed, iterations }, userId: p.userId, automatic: true, now });
      await said(`re-forecast from the field log as of ${formatIsoDate(decision.dataDate)} (${decision.why}).`, job.id);
    } catch (e) {
      if (e instanceof AppError) {
        // Refused in words (a data date the plan no longer allows): it would be refused again today.
        await said(`the re-forecast was refused — ${e.message.replace(/\.$/, "")}.`);
        return;
      }
      // The queue or the database did not answer: hand the day back so the next pass tries again (logged by
      // eachItemOnItsOwn, and the other projects go on).
      await releaseDailyReforecastDay({ projectId: p.projectId, day, previous: p.lastOn });
      throw e;
    }
  });
  return done;
}

export function startDailyReforecastPoller() {
  startBackgroundPass("daily re-forecast", Math.max(1_000, Number(process.env.POURLINE_NOTICE_INTERVAL_MS || 60_000)), () => runDailyReforecasts());
}
