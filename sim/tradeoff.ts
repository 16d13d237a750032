/**
 * The holiday trade-off (MODEL.md, "Holiday trade-off"). Contract: `holidayTradeoff(scenario, seed, n)` runs
 * the same iterations (same seed, same k, so the same weather and rates) under two policies and reports what
 * working through holidays gains in days against what it costs the public:
 * - "stand down": `holidays.policy = "standDown"`, windows unchanged;
 * - "work through": `holidays.policy = "workThrough"`, and every closure window that opens on weekdays also
 *   opens on holidays (as the demo's holiday-work variant does) — otherwise holiday days would stay closed.
 * Days gained = calendar days between the finish percentiles (stand down − work through); extra delay and
 * road-user cost = work through − stand down, at the same percentile.
 */
import { formatDayNumber, parseIsoDate } from "./dates";
import { compileScenario } from "./engine";
import { runIterations } from "./montecarlo";
import { holidayBackupReader } from "./queue-breaches";
import { nearestRank, sortedCopy } from "./percentiles";
import type { Scenario } from "./schema";

export type HolidayPolicy = "standDown" | "workThrough";

export function withHolidayPolicy(s: Scenario, policy: HolidayPolicy): Scenario {
  const copy: Scenario = structuredClone(s);
  copy.calendar.holidays.policy = policy;
  if (policy === "workThrough")
    for (const w of copy.calendar.closureWindows)
      if (w.dayTypes.includes("weekday") && !w.dayTypes.includes("holiday")) w.dayTypes.push("holiday");
  return copy;
}

export interface PolicyOutcome {
  policy: HolidayPolicy;
  /** Finish dates (YYYY-MM-DD) or "unfinished". */
  finish: { p50: string; p80: string };
  /** Percentile values; null = reached only by unfinished iterations or no traffic model. */
  delayVehHours: { p50: number | null; p80: number | null };
  roadUserCost: { p50: number | null; p80: number | null };
  /** Share of iterations finished by 24:00 of the target date; null without a target. */
  targetProbability: number | null;
  /** Contract cost percentiles ($); null without a costs section. */
  contractCost: { p50: number | null; p80: number | null };
  /** Longest queue on holiday-peak days, miles, P50/P80 over iterations of each one's longest (null without traffic). */
  holidayBackupMiles: { p50: number; p80: number } | null;
}

export interface HolidayTradeoff {
  seed: string;
  targetDate: string | null;
  iterations: number;
  hasTraffic: boolean;
  standDown: PolicyOutcome;
  workThrough: PolicyOutcome;
  /** Calendar days earlier by working through (negative = later); null when a finish is unfinished. */
  daysGained: { p50: number | null; p80: number | null };
  extraDelayVehHours: { p50: number | null; p80: number | null };
  extraRoadUserCost: { p50: number | null; p80: number | null };
  /** Change in the chance of meeting the target by working through (share, e.g. 0.12); null without a target. */
  targetProbabilityChange: number | null;
  /** Extra contract cost of working through ($, P50 and P80); null without costs. */
  extraContractCost: { p50: number | null; p80: number | null };
}

function outcome(s: Scenario, policy: HolidayPolicy, seed: string, iterations: number): { out: PolicyOutcome; finishDay: { p50: number; p80: number } } {
  const compiled = compileScenario(withHolidayPolicy(s, policy));
  const backups = holidayBackupReader(compiled);
  const run = runIterations(compiled, seed, 0, iterations, undefined, undefined, backups.read);
  const day0 = compiled.calendar.startDay;
  const fin = sortedCopy(run.finish);
  const delay = sortedCopy(run.delayVehHours);
  const ruc = sortedCopy(run.roadUserCost);
  const hasTraffic = !Number.isNaN(run.roadUserCost[0]);
  const val = (x: number, digits: number) => (hasTraffic && Number.isFinite(x) ? Math.round(x * 10 ** digits) / 10 ** digits : null);
  const day = (h: number) => (h < Infinity ? Math.floor(h / 24) : Infinity);
  const date = (h: number) => (h < Infinity ? formatDayNumber(day0 + day(h)) : "unfinished");
  const contract = sortedCopy(run.contractCost);
  const hasContract = run.contractCost.length > 0 && !Number.isNaN(run.contractCost[0]);
  const money = (x: number) => (hasContract && Number.isFinite(x) ? Math.round(x) : null);
  const limit = s.targetDate ? 24 * (parseIsoDate(s.targetDate) - day0 + 1) : null;
  const targetProbability = limit === null ? null : run.finish.reduce((n, f) => n + (f <= limit ? 1 : 0), 0) / run.finish.length;
  const f50 = nearestRank(fin, 0.5);
  const f80 = nearestRank(fin, 0.8);
  return {
    out: {
      policy,
      finish: { p50: date(f50), p80: date(f80) },
      delayVehHours: { p50: val(nearestRank(delay, 0.5), 1), p80: val(nearestRank(delay, 0.8), 1) },
      roadUserCost: { p50: val(nearestRank(ruc, 0.5), 0), p80: val(nearestRank(ruc, 0.8), 0) },
      targetProbability,
      contractCost: { p50: money(nearestRank(contract, 0.5)), p80: money(nearestRank(contract, 0.8)) },
      holidayBackupMiles: backups.quantiles(),
    },
    finishDay: { p50: day(f50), p80: day(f80) },
  };
}

const minus = (a: number | null, b: number | null, digits: number) => (a === null || b === null ? null : Math.round((a - b) * 10 ** digits) / 10 ** digits);

export function holidayTradeoff(s: Scenario, seed: string, iterations: number): HolidayTradeoff {
  if (!(iterations >= 1)) throw new Error("holidayTradeoff needs at least one iteration");
  const stand = outcome(s, "standDown", seed, iterations);
  const work = outcome(s, "workThrough", seed, iterations);
  const gained = (a: number, b: number) => (Number.isFinite(a) && Number.isFinite(b) ? a - b : null);
  return {
    seed,
    targetDate: s.targetDate ?? null,
    iterations,
    hasTraffic: stand.out.delayVehHours.p50 !== null || work.out.delayVehHours.p50 !== null,
    standDown: stand.out,
    workThrough: work.out,
    daysGained: { p50: gained(stand.finishDay.p50, work.finishDay.p50), p80: gained(stand.finishDay.p80, work.finishDay.p80) },
    extraDelayVehHours: {
      p50: minus(work.out.delayVehHours.p50, stand.out.delayVehHours.p50, 1),
      p80: minus(work.out.delayVehHours.p80, stand.out.delayVehHours.p80, 1),
    },
    extraRoadUserCost: {
      p50: minus(work.out.roadUserCost.p50, stand.out.roadUserCost.p50, 0),
      p80: minus(work.out.roadUserCost.p80, stand.out.roadUserCost.p80, 0),
    },
    targetProbabilityChange: minus(work.out.targetProbability, stand.out.targetProbability, 6),
    extraContractCost: {
      p50: minus(work.out.contractCost.p50, stand.out.contractCost.p50, 0),
      p80: minus(work.out.contractCost.p80, stand.out.contractCost.p80, 0),
    },
  };
}
