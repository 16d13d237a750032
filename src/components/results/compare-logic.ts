/**
 * Comparing scenarios: the comparison table (what the compare API serves is src/lib/compare-contract.ts). The
 * table is a list of metric rows, each giving a text per scenario and a difference from the first, so a new row
 * (delay, cost) is one more entry in `COMPARE_METRICS`. Differences are against the first scenario, signed, with
 * units ("+12 d").
 */
import type { CompareReforecast, CompareRun, CompareScenario } from "@/lib/compare-contract";
import { formatIsoDate, formatPercent } from "@/lib/format";
import { isoToDay } from "./date-axis";
import { quantileText } from "./summary-text";
import { targetChanceText } from "@/lib/plan-of-record-text";
import { UNDER_OLDER_RULES } from "@/lib/model-rules-text";

export interface CompareMetric {
  id: string;
  label: string;
  text: (r: CompareRun) => string;
  /** Difference of b from a, or null when it is not meaningful. */
  diff: (a: CompareRun, b: CompareRun) => string | null;
}

const MINUS = "\u2212";

/** +12 d, −3 d, ±0 d; `digits` decimals. */
export function signed(n: number, unit: string, digits = 0): string {
  const r = Number(n.toFixed(digits));
  const abs = Math.abs(r).toLocaleString("en-US", { minimumFractionDigits: digits, maximumFractionDigits: digits });
  const sign = r > 0 ? "+" : r < 0 ? MINUS : "±";
  return `${sign}${abs}${unit ? ` ${unit}` : ""}`;
}

/** Calendar days between two ISO dates (b − a; a time of day is ignored); null when either is unfinished. */
export function dayDiff(a: string, b: string): number | null {
  const x = isoToDay(a);
  const y = isoToDay(b);
  return x === null || y === null ? null : Math.floor(y) - Math.floor(x);
}

const dateMetric = (key: "p50" | "p80" | "p90", label: string): CompareMetric => ({
  id: key,
  label,
  text: (r) => (r.finish[key] === "unfinished" ? "not reached" : formatIsoDate(r.finish[key])),
  diff: (a, b) => {
    const d = dayDiff(a.finish[key], b.finish[key]);
    return d === null ? null : signed(d, "d");
  },
});

type Pick2 = { p50: number | null; p80: number | null } | null | undefined;

/** A delay or cost row: "—" where a run has no such figure; a difference only when both have one. */
const amountMetric = (id: string, label: string, get: (r: CompareRun) => Pick2, key: "p50" | "p80", unit: "veh-h" | "$"): CompareMetric => {
  const value = (r: CompareRun) => {
    const v = get(r)?.[key];
    return typeof v === "number" && Number.isFinite(v) ? v : null;
  };
  const fmt = (v: number) => (unit === "$" ? `$${Math.round(v).toLocaleString("en-US")}` : `${Math.round(v).toLocaleString("en-US")} veh-h`);
  return {
    id,
    label,
    text: (r) => {
      const v = value(r);
      return v === null ? "—" : fmt(v);
    },
    diff: (a, b) => {
      const x = value(a);
      const y = value(b);
      if (x === null || y === null) return null;
      if (unit === "veh-h") return signed(y - x, "veh-h");
      const d = Math.round(y - x);
      return `${d > 0 ? "+" : d < 0 ? MINUS : "±"}$${Math.abs(d).toLocaleString("en-US")}`;
    },
  };
};

export const COMPARE_METRICS: CompareMetric[] = [
  dateMetric("p50", "P50 finish"),
  dateMetric("p80", "P80 finish"),
  dateMetric("p90", "P90 finish"),
  {
    id: "target",
    label: "Chance of meeting the target",
    text: (r) => (r.target ? `${formatPercent(r.target.probability)} by ${formatIsoDate(r.target.date)}` : "no target set"),
    // Percentage points compare only when both aim at the same date.
    diff: (a, b) => (a.target && b.target && a.target.date === b.target.date ? signed((b.target.probability - a.target.probability) * 100, "pp") : null),
  },
  {
    id: "closureHours",
    label: "Lane-closed hours (P50)",
    text: (r) => `${Math.round(r.closureHoursTotal).toLocaleString("en-US")} h`,
    diff: (a, b) => signed(b.closureHoursTotal - a.closureHoursTotal, "h"),
  },
  {
    id: "weatherLost",
    label: "Weather-lost shifts (P50)",
    text: (r) => `${r.weatherLostShifts.p50.toLocaleString("en-US")}`,
    diff: (a, b) => signed(b.weatherLostShifts.p50 - a.weatherLostShifts.p50, "shifts"),
  },
  amountMetric("delayP50", "Delay to drivers (P50)", (r) => r.delay?.vehicleHours, "p50", "veh-h"),
  amountMetric("delayP80", "Delay to drivers (P80)", (r) => r.delay?.vehicleHours, "p80", "veh-h"),
  amountMetric("roadUserP50", "Road-user cost (P50)", (r) => r.cost?.roadUser, "p50", "$"),
  amountMetric("roadUserP80", "Road-user cost (P80)", (r) => r.cost?.roadUser, "p80", "$"),
  amountMetric("contractP50", "Contract cost (P50)", (r) => r.cost?.contract, "p50", "$"),
  amountMetric("contractP80", "Contract cost (P80)", (r) => r.cost?.contract, "p80", "$"),
];

export interface CompareCell {
  text: string;
  /** Difference from the first scenario; null for the first one or when not meaningful. */
  diff: string | null;
}

export interface CompareRow {
  id: string;
  label: string;
  cells: CompareCell[];
}

/** Rows × scenarios. A scenario without a run reads "not run yet"; differences need the first scenario's run. */
export function compareRows(scenarios: CompareScenario[], metrics: CompareMetric[] = COMPARE_METRICS): CompareRow[] {
  const base = scenarios[0]?.run ?? null;
  return metrics.map((m) => ({
    id: m.id,
    label: m.label,
    cells: scenarios.map((s, i) => {
      if (!s.run) return { text: "not run yet", diff: null };
      return { text: m.text(s.run), diff: i > 0 && base ? m.diff(base, s.run) : null };
    }),
  }));
}

/**
 * A re-forecast in the project list's words: "P80 23 Aug 2027 (P50 15 Aug 2027), 0 % chance of finishing by the
 * 2 Jul 2027 target, from the work recorded up to 31 Oct 2026" — and when the plan changed since, that it is stale.
 */
export function reforecastText(f: CompareReforecast): string {
  const chance = targetChanceText(f.targetDate, f.targetProbability);
  const target = chance ? `, ${chance}` : "";
  const stale = f.stale ? " (the plan has changed since, so it is stale until the next one)" : "";
  const rules = f.olderRules ? ` (${UNDER_OLDER_RULES})` : "";
  return `P80 ${quantileText(f.p80)} (P50 ${quantileText(f.p50)})${target}, from the work recorded up to ${formatIsoDate(f.dataDate)}${stale}${rules}`;
}

/**
 * What the page says above the figures when a chosen scenario has been re-forecast from its field log: the figures
 * compared are plan runs from each plan's start, which know nothing of the work done, so an executive comparing the
 * plan of record with a variant must not read the plan run's P80 as the job's finish. Null when none has one.
 */
export function reforecastNotice(scenarios: CompareScenario[]): { lead: string; lines: string[] } | null {
  const with_ = scenarios.filter((s): s is CompareScenario & { reforecast: CompareReforecast } => s.reforecast !== null);
  if (with_.length === 0) return null;
  return {
    lead: "The figures below are plan runs from each plan's start date, which know nothing of the work done.",
    lines: with_.map((s) => `${s.name} has been re-forecast from its field log: ${reforecastText(s.reforecast)}.`),
  };
}

/**
 * The runs compared that were computed under earlier model rules, named: beside runs of today's rules their figures
 * differ by the rule change as well as by the plans, so the page says which to run again to compare like with like.
 * Null when every run compared is of today's rules.
 */
export function olderRulesNotice(scenarios: CompareScenario[]): string | null {
  const older = scenarios.filter((s) => s.run?.olderRules).map((s) => s.name);
  if (older.length === 0) return null;
  const which = older.length === 1 ? `run of ${older[0]} was` : `runs of ${older.slice(0, -1).join(", ")} and ${older.at(-1)} were`;
  const mixed = older.length < scenarios.filter((s) => s.run).length;
  return `The latest plan ${which} ${UNDER_OLDER_RULES}${mixed ? ", so the differences below are partly the rules'" : ""}. A new run of ${older.length === 1 ? "it" : "each"} compares under today's rules.`;
}
