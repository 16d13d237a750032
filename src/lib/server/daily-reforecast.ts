import "server-only";
/**
 * The daily re-forecast: once a local day, after the hour a project's administrator or engineer chose, each plan of
 * record whose newest re-forecast is behind the field log (src/lib/daily-reforecast.ts says when) is re-forecast
 * from the day before — queued as the person who set it up, exactly as if they had pressed Re-forecast, so the
 * forecast e-mails, the project list and the drift chart follow as for any re-forecast. Each day's decision is kept
 * in words on the project. Started by src/instrumentation.ts (POURLINE_DAILY_REFORECAST=off disables it; the pace is
 * POURLINE_NOTICE_INTERVAL_MS, default 60 s).
 */
import { HORIZON_DAYS } from "@sim/calendar";
import { formatDayNumber, parseIsoDate } from "@sim/dates";
import { claimDailyReforecastDay, getNewestReforecastBasis, listDailyReforecastPlans, setDailyReforecastNote } from "@db/queries/daily-reforecast";
import { getScenario } from "@db/queries/scenarios";
import { dailyDecision, dayToConsider } from "@/lib/daily-reforecast";
import { formatIsoDate } from "@/lib/format";
import { can, type ProjectRole } from "@/lib/permissions";
import { startBackgroundPass } from "./background-pass";
import { describeError } from "./log";
import { queueReforecast } from "./progress";
import { validateDefinition } from "./scenario-input";

/** One pass: the projects looked at for their day, with what was decided (the tests read it; the page reads the note). */
export async function runDailyReforecasts(now = new Date()): Promise<{ projectId: string; note: string; jobId?: string }[]> {
  const done: { projectId: string; note: string; jobId?: string }[] = [];
  for (const p of await listDailyReforecastPlans()) {
    // Most passes end here: the day was looked at already, or its hour has not come (no further query).
    const day = p.hour === null ? null : dayToConsider({ now, timeZone: p.timeZone ?? "UTC", hour: p.hour, lastOn: p.lastOn });
    if (day === null || !(await claimDailyReforecastDay({ projectId: p.projectId, day }))) continue;
    const scenario = await getScenario({ id: p.scenarioId });
    if (!scenario) continue; // deleted since the list was read
    let plan;
    try {
      plan = validateDefinition(scenario.definition);
    } catch {
      continue; // a stored plan always parses; an unreadable one is not this pass's to report
    }
    const said = (text: string, jobId?: string) => {
      const note = `On ${formatIsoDate(day)}: ${text}`;
      done.push({ projectId: p.projectId, note, ...(jobId ? { jobId } : {}) });
      return setDailyReforecastNote({ projectId: p.projectId, note });
    };
    if (!p.userId || !can(p.role as ProjectRole | null, "runScenario")) {
      await said("no re-forecast — the person who set it up may no longer run this project's plans; set it up again.");
      continue;
    }
    const decision = dailyDecision({
      day,
      startDate: plan.startDate,
      lastDataDate: formatDayNumber(parseIsoDate(plan.startDate) + HORIZON_DAYS - 1),
      scenarioVersion: scenario.version,
      newest: await getNewestReforecastBasis({ scenarioId: scenario.id }),
    });
    if (!decision.due) {
      await said(`no re-forecast needed — ${decision.why}.`);
      continue;
    }
    try {
      const job = await queueReforecast({ scenario, body: { dataDate: decision.dataDate, seed: decision.seed, iterations: decision.iterations }, userId: p.userId, now });
      await said(`re-forecast from the field log as of ${formatIsoDate(decision.dataDate)} (${decision.why}).`, job.id);
    } catch (e) {
      await said(`the re-forecast could not be queued — ${e instanceof Error ? e.message.replace(/\.$/, "") : "the engine queue did not answer"}.`);
      console.error(`[pourline] daily re-forecast of project ${p.projectId} failed: ${describeError(e)}`);
    }
  }
  return done;
}

export function startDailyReforecastPoller() {
  startBackgroundPass("daily re-forecast", Math.max(1_000, Number(process.env.POURLINE_NOTICE_INTERVAL_MS || 60_000)), () => runDailyReforecasts());
}
