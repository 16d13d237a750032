/**
 * The demo as a job in progress, computed from the seeding day (`today`, injected so tests pin the clock):
 * - `demoDayShift`: how many days the demo scenario files move so that their first season has started before
 *   today (in winter: it lies wholly in the past and the second season is ahead). The shift keeps the weekday
 *   of every date and moves the start to the same week of spring in the chosen year.
 * - `shiftDates`: every `YYYY-MM-DD` string of a scenario moved by that many days (MM-DD fields stay).
 * - `demoFieldLog`: what the inspector would have written up to yesterday — one entry per operation and shift
 *   worked, read off one engine iteration with its trace ("what happened"): stations per shift, weather seen,
 *   hours lost to weather, and the deeper deterioration hydrodemolition found. Every entry passes the app's own
 *   field-log rules (`sim/progress-rules.ts`), checked in order as the API would.
 * - `demoDataDates`: the month ends since the start and yesterday, each with shifts logged since the date
 *   before (the latest six): the re-forecast dates that give the drift history.
 * Pure apart from the engine: no database, no clock.
 */
import { compileScenario, drawSamples, simulate } from "../sim/index";
import { formatDayNumber, parseIsoDate, weekdayOfDayNumber, civilFromDays, daysInMonth } from "../sim/dates";
import { hourlyTempF, isRainHour } from "../sim/weather";
import { checkProgressEntry, type RuleEntry } from "../sim/progress-rules";
import type { Scenario } from "../sim/schema";
import type { ProgressEntry } from "../sim/progress-entry";

const ISO = /^\d{4}-\d{2}-\d{2}$/;

/** Days to add to the files' dates: the start moves to the same weekday on or after its month-day in year Y. */
export function demoDayShift(fileStartDate: string, today: string): number {
  const file = parseIsoDate(fileStartDate);
  const md = fileStartDate.slice(5);
  const startIn = (year: number) => {
    let d = parseIsoDate(`${year}-${md}`);
    while (weekdayOfDayNumber(d) !== weekdayOfDayNumber(file)) d++;
    return d;
  };
  const year = Number(today.slice(0, 4));
  // The start must lie before today, so the job has begun; in early spring that means last year's season.
  const start = startIn(year) < parseIsoDate(today) ? startIn(year) : startIn(year - 1);
  return start - file;
}

/** The scenario JSON with every ISO date string moved by `days` (a deep copy). */
export function shiftDates<T>(value: T, days: number): T {
  if (typeof value === "string") return (ISO.test(value) ? formatDayNumber(parseIsoDate(value) + days) : value) as T;
  if (Array.isArray(value)) return value.map((v) => shiftDates(v, days)) as T;
  if (value && typeof value === "object") return Object.fromEntries(Object.entries(value).map(([k, v]) => [k, shiftDates(v, days)])) as T;
  return value;
}

const CREW_NAMES: Record<string, string> = {
  setup: "Traffic control crew",
  milling: "Milling crew",
  hydrodemolition: "Hydrodemolition crew A (crew B not mobilized)",
  cleanup: "Cleanup crew",
  placement: "LMC placement crew",
  restriping: "Striping crew",
};

/** The seed of the one iteration that stands for "what happened" on site. */
export const AS_BUILT_SEED = "kestrel-as-built";

interface Piece {
  op: number;
  shift: string;
  day: number;
  from: number;
  to: number;
  worked: number;
}

/** Worked intervals of one traced packet: [start, finish] minus its pauses. */
function workedIntervals(start: number, finish: number, pauses: { start: number; end: number }[]): [number, number][] {
  const out: [number, number][] = [];
  let t = start;
  for (const p of [...pauses].sort((a, b) => a.start - b.start)) {
    if (p.start > t) out.push([t, Math.min(p.start, finish)]);
    t = Math.max(t, p.end);
  }
  if (finish > t) out.push([t, finish]);
  return out.filter(([a, b]) => b - a > 1e-9);
}

/**
 * The world the demo job met: the deck worse than its survey said (deterioration found about twice as often)
 * and one hydrodemolition crew instead of two, working at the slow end of its range, so the first season falls
 * short of the cut-off and the re-forecasts drift later as the log grows. Only the draw of "what happened" uses it; the plan is unchanged.
 */
export function harsherWorld(plan: Scenario): Scenario {
  return {
    ...plan,
    discovered: { ...plan.discovered, defaultProbability: Math.min(0.6, plan.discovered.defaultProbability * 2.5) },
    deck: { ...plan.deck, survey: plan.deck.survey.map((r) => ({ ...r, probability: Math.min(0.8, r.probability * 1.6) })) },
    operations: plan.operations.map((op) => {
      if (op.kind !== "crew" || !op.discovers) return op;
      const d = op.rate.dist;
      const slow = d.type === "fixed" ? d.value : d.type === "lognormal" ? d.median * Math.exp(-d.sigma) : d.min;
      return { ...op, crews: 1, rate: { ...op.rate, dist: { type: "fixed" as const, value: slow } } };
    }),
  };
}

export function demoFieldLog(plan: Scenario, today: string): ProgressEntry[] {
  const compiled = compileScenario(harsherWorld(plan));
  const samples = drawSamples(compiled.scenario, AS_BUILT_SEED, 0);
  const trace = simulate(compiled, samples, { trace: true }).trace!;
  const day0 = parseIsoDate(plan.startDate);
  const lastDay = parseIsoDate(today) - 1 - day0; // up to yesterday's shifts
  const s0 = plan.deck.startStationFt;
  const { packetFt, lengthFt } = plan.deck;
  const shifts = new Map(plan.calendar.shifts.map((s) => [s.id, s]));
  const pieces: Piece[] = [];

  const instanceOf = (opShifts: string[], t: number) => {
    for (const id of opShifts) {
      const sh = shifts.get(id)!;
      const day = Math.floor((t - sh.startHour) / 24);
      if (t >= 24 * day + sh.startHour - 1e-9 && t < 24 * day + sh.startHour + sh.lengthHours + 1e-9) return { shift: id, day };
    }
    return null;
  };

  for (const tp of trace.packets) {
    const oi = plan.operations.findIndex((o) => o.id === tp.op);
    const op = plan.operations[oi];
    if (op.kind !== "crew") continue;
    const pauses = trace.pauses.filter((p) => p.op === tp.op && p.stage === tp.stage && p.packet === tp.packet && p.crew === tp.crew);
    const worked = workedIntervals(tp.start, tp.finish, pauses);
    const total = worked.reduce((n, [a, b]) => n + b - a, 0);
    const a0 = tp.packet * packetFt;
    const len = Math.min(a0 + packetFt, lengthFt) - a0;
    let done = 0;
    for (const [a, b] of worked) {
      const inst = instanceOf(op.shifts, a);
      if (!inst || inst.day > lastDay) continue;
      const from = a0 + (len * done) / total;
      done += b - a;
      const to = a0 + (len * done) / total;
      pieces.push({ op: oi, shift: inst.shift, day: inst.day, from: s0 + from, to: s0 + to, worked: b - a });
    }
  }

  // One entry per operation, shift and contiguous stretch (whole feet; the same boundary rounds the same way).
  const groups = new Map<string, Piece[]>();
  for (const p of pieces) {
    const key = `${p.op}|${p.shift}|${p.day}`;
    groups.set(key, [...(groups.get(key) ?? []), p]);
  }
  const entries: (ProgressEntry & { order: number })[] = [];
  for (const list of groups.values()) {
    const { op: oi, shift, day } = list[0];
    const op = plan.operations[oi];
    const sh = shifts.get(shift)!;
    const startHour = 24 * day + sh.startHour;
    const worked = list.reduce((n, p) => n + p.worked, 0);
    const tempF = Math.round(hourlyTempF(samples.weather, startHour + 2));
    // Hours of the shift with rain, or (for a temperature-gated operation) below its limit: what an inspector
    // writes down as lost. Never more than the shift left unworked; in the model they are information only.
    const gate = op.kind === "crew" ? op.gates.minTempF : undefined;
    let rainHours = 0;
    let coldHours = 0;
    for (let h = 0; h < Math.floor(sh.lengthHours); h++) {
      if (isRainHour(samples.weather, startHour + h)) rainHours++;
      else if (gate !== undefined && hourlyTempF(samples.weather, startHour + h + 0.5) < gate) coldHours++;
    }
    const lost = Math.min(rainHours + coldHours, Math.max(0, Math.floor(2 * (sh.lengthHours - worked)) / 2));
    const lostReason = lost <= 0 ? "" : rainHours >= coldHours ? "Rain; crew stood down under the closure" : `Below ${gate} °F; ${op.name.toLowerCase()} stood down`;
    const sorted = [...list].sort((a, b) => a.from - b.from);
    let cur: { from: number; to: number } | null = null;
    const stretches: { from: number; to: number }[] = [];
    for (const p of sorted) {
      if (cur && p.from <= cur.to + 1e-6) cur.to = Math.max(cur.to, p.to);
      else stretches.push((cur = { from: p.from, to: p.to }));
    }
    stretches.forEach((st, k) => {
      const from = Math.round(st.from);
      const to = Math.round(st.to);
      if (to <= from) return;
      entries.push({
        order: startHour,
        workDate: formatDayNumber(day0 + day),
        shift,
        operationId: op.id,
        fromStationFt: from,
        toStationFt: to,
        crew: CREW_NAMES[op.id] ?? `${op.name} crew`,
        tempF,
        rain: rainHours > 0,
        lostHours: k === 0 ? lost : 0,
        lostReason: k === 0 ? lostReason : "",
        discovered: [],
      });
    });
  }

  // What hydrodemolition found: each packet the iteration drew a discovery for, placed in the shift that
  // worked the most of it (extra hours over 12 read as a full-depth repair, fewer as bottom-mat exposure).
  plan.operations.forEach((op, oi) => {
    const extra = samples.discoveredExtraHours[oi];
    if (op.kind !== "crew" || !op.discovers || !extra?.length) return;
    for (let i = 0; i < extra.length; i++) {
      if (!(extra[i] > 0)) continue;
      const a = s0 + i * packetFt;
      const b = s0 + Math.min((i + 1) * packetFt, lengthFt);
      let best: (typeof entries)[number] | null = null;
      let bestLen = 0;
      for (const e of entries) {
        const l = Math.min(b, e.toStationFt) - Math.max(a, e.fromStationFt);
        if (e.operationId === op.id && l > bestLen) [best, bestLen] = [e, l];
      }
      if (!best || bestLen < 4) continue;
      const lo = Math.max(a, best.fromStationFt);
      const span = Math.max(2, Math.min(30, Math.floor(bestLen / 2)));
      const from = lo + Math.floor((bestLen - span) / 2);
      const full = extra[i] > 12;
      best.discovered.push({ kind: full ? "full-depth" : "bottom-mat", fromStationFt: from, toStationFt: from + span, areaSqFt: Math.round(span * (full ? 6 : 3) * (1 + extra[i] / 20)) });
    }
  });

  const ordered = entries.sort((x, y) => x.order - y.order || plan.operations.findIndex((o) => o.id === x.operationId) - plan.operations.findIndex((o) => o.id === y.operationId));
  // The same rules as the API, in order: a generated log the app would refuse is a bug in this file.
  const accepted: RuleEntry[] = [];
  return ordered.map(({ order: _order, ...e }, i) => {
    const problems = checkProgressEntry({ scenario: plan, entry: e, others: accepted, today });
    if (problems.length) throw new Error(`demo field-log entry ${i} (${e.workDate} ${e.operationId}) is invalid: ${problems.map((p) => `${p.path}: ${p.message}`).join("; ")}`);
    accepted.push({ ...e, id: String(i) });
    return e;
  });
}

/** Re-forecast data dates: month ends after the start and yesterday, each with new shifts since the last (the latest six). */
export function demoDataDates(plan: Scenario, entries: ReadonlyArray<{ workDate: string }>, today: string): string[] {
  const first = parseIsoDate(plan.startDate);
  const last = parseIsoDate(today) - 1;
  const out: number[] = [];
  for (let d = first; d <= last; d++) {
    const { y, m, d: dd } = civilFromDays(d);
    if (dd === daysInMonth(y, m) || d === last) out.push(d);
  }
  // A date with no shift since the one before adds nothing to the drift (a winter month, say): left out.
  const worked = new Set(entries.map((e) => parseIsoDate(e.workDate)));
  const kept = out.filter((d, i) => {
    const prev = i === 0 ? first - 1 : out[i - 1];
    for (let x = prev + 1; x <= d; x++) if (worked.has(x)) return true;
    return false;
  });
  return kept.slice(-6).map(formatDayNumber);
}
