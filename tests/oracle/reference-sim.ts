/**
 * Independent reference simulator for sim/MODEL.md, written from MODEL.md alone (it never looks at the
 * event engine). Contract: `referenceSimulate(scenario, samples, dtHours, horizonDays?)` walks time in
 * fixed steps of `dtHours` (which must divide one hour, e.g. 0.25) and returns every packet's production
 * start (ready time for wait operations) and finish, in hours since 00:00 of `startDate`.
 *
 * How it stays exact without being clever: every calendar boundary a test uses lies on a multiple of `dt`,
 * so whether a step is open (conditions 1–3) and which hour slot it lies in are constant over the step; a
 * crew keeps its own clock `tau` inside the step, so work, readiness and claims may happen mid-step and
 * errors do not pile up packet after packet. Operations are processed in precedence order within a step,
 * so a predecessor's finish inside the step is known before its successor looks at it.
 *
 * Stages (MODEL.md, "Stages"): the work is a list of stage operations (stage × operation), each working its
 * stage's packets with its own crews, linked by the scenario's links inside the stage, the fleet rule and the
 * stage's `after` link. The closure timeline ("Closures that stand") is rebuilt afterwards from what the crews
 * did: their use of each short-term closure (work and mobilization, recorded as it happens) and the starts and
 * finishes of every packet; `lanesClosedAt(result, t)` answers which lanes are closed at an instant.
 *
 * Interpretations of MODEL.md that the text leaves open (kept deliberately simple, see the test report):
 * - a crew's first packet ever takes `mobilizationHours`, even when it comes after a winter; later packets
 *   take `remobilizeHours` by MODEL.md's "after a winter" rule, decided at the first open step (1–3) the
 *   crew reaches with its packet ready;
 * - `winterEnd` is in the next year when its MM-DD is ≤ `winterStart`'s, else in the same year;
 * - "open interval" = maximal run of open time (adjacent shifts/windows merge);
 * - a discovering continuous operation fits base + extra hours in one interval;
 * - hourly humidity and wind are computed here from MODEL.md's formulas (Magnus, dew point of the daily
 *   mean, 30 % diurnal wind), not taken from the engine's weather helpers; only the hourly temperature curve
 *   and the rain hours are shared (`hourlyTempF`, `isRainHour`), as they were before;
 * - a weather forecast in the samples (`samples.weatherOverride`, MODEL.md "Re-forecast from the weather
 *   forecast") is read here hour by hour: inside its [fromHour, toHour) every temperature, rain, humidity and
 *   wind read takes the forecast's value of that whole hour (rain: the iteration's drawn hours), the climate's
 *   otherwise. No whole-day shortcut exists here, so none can disagree with the forecast.
 */
import type { CrewOperation, DayType, Scenario } from "../../sim/schema";
import { civilFromDays, daysFromCivil, parseIsoDate, weekdayOfDayNumber } from "../../sim/dates";
import { federalHolidays } from "../../sim/holidays";
import { evaporationLbFt2h } from "../../sim/evaporation";
import { hourlyTempF, isRainHour } from "../../sim/weather";
import type { IterationSamples } from "../../sim/samples";

export interface RefPacket {
  op: string;
  stage: string;
  packet: number;
  crew: number; // −1 for wait operations
  start: number;
  finish: number;
}
export interface RefPeriod {
  closure: string;
  kind: "short" | "standing";
  lanes: string[];
  start: number;
  end: number;
}
export interface RefResult {
  packets: RefPacket[];
  finish: number;
  unfinished: boolean;
  /** The closure timeline (MODEL.md, "Closures that stand"). */
  periods: RefPeriod[];
  /** Per stage id: its restoration (last packet finish). */
  stageFinish: Record<string, number>;
}

/** Lanes closed at instant t: the union of the lanes of the periods covering t (half-open). */
export function lanesClosedAt(r: RefResult, t: number): string[] {
  const out = new Set<string>();
  for (const p of r.periods) if (t >= p.start && t < p.end) for (const l of p.lanes) out.add(l);
  return [...out].sort();
}

const EPS = 1e-9;
const isWeekend = (dayNum: number) => {
  const w = weekdayOfDayNumber(dayNum);
  return w === 0 || w === 6;
};

interface RefCalendar {
  day0: number;
  holidays: Set<number>; // day numbers whose day type is "holiday"
  blocked: Array<[number, number]>; // [from, to) in hours
  winters: Array<{ start: number; end: number }>;
  firstWinterStart: number;
  firstWinterEnd: number;
  cutoffOffsetFt: number;
  /** Per short-term closure id: its window intervals (maximal intervals of the union of window instances). */
  windowIntervals: Map<string, Array<[number, number]>>;
}

function monthDay(md: string): [number, number] {
  return [Number(md.slice(0, 2)), Number(md.slice(3, 5))];
}

export function buildReferenceCalendar(s: Scenario, horizonDays: number): RefCalendar {
  const cal = s.calendar;
  const day0 = parseIsoDate(s.startDate);
  const hourOf = (dayNum: number) => (dayNum - day0) * 24;
  const y0 = civilFromDays(day0).y;
  const y1 = civilFromDays(day0 + horizonDays).y;

  const holidays = new Set<number>();
  if (cal.holidays.observeFederal)
    for (let y = y0 - 1; y <= y1 + 1; y++) for (const h of federalHolidays(y)) holidays.add(parseIsoDate(h.observed));
  for (const b of cal.holidays.blackoutDates) holidays.add(parseIsoDate(b));

  const blocked: Array<[number, number]> = [];
  if (cal.holidays.policy === "standDown") {
    for (const h of holidays) {
      let first = h;
      let last = weekdayOfDayNumber(h) === 4 ? h + 1 : h; // Thursday: the Friday after joins the block
      while (isWeekend(first - 1)) first--;
      while (isWeekend(last + 1)) last++;
      const lastWd = weekdayOfDayNumber(last);
      if (cal.holidays.standDownThroughMonday && (lastWd === 6 || lastWd === 0)) last = lastWd === 6 ? last + 2 : last + 1;
      blocked.push([hourOf(first - 1) + cal.holidays.standDownStartHour, hourOf(last + 1)]);
    }
  }

  const season = cal.season;
  const [wsM, wsD] = monthDay(season.winterStart);
  const [weM, weD] = monthDay(season.winterEnd);
  const endNextYear = weM < wsM || (weM === wsM && weD <= wsD);
  const winters: Array<{ start: number; end: number }> = [];
  for (let y = y0 - 1; y <= y1; y++)
    winters.push({
      start: hourOf(daysFromCivil(y, wsM, wsD)),
      end: hourOf(daysFromCivil(endNextYear ? y + 1 : y, weM, weD)),
    });
  const first = winters.find((w) => w.start >= 0);
  if (first && season.plan === "two" && season.cutoffDate) first.start = hourOf(parseIsoDate(season.cutoffDate));
  for (const w of winters) blocked.push([w.start - season.demobilizeHours, w.end]);
  const cutoffOffsetFt =
    season.plan === "two" && season.cutoffStationFt !== undefined
      ? season.cutoffStationFt - s.deck.startStationFt
      : Infinity;
  // Window instances by the day type of the day they start on (days before startDate never count), merged.
  const windowIntervals = new Map<string, Array<[number, number]>>();
  for (const c of cal.closures) {
    const inst: Array<[number, number]> = [];
    for (let d = 0; d <= horizonDays; d++) {
      const dn = day0 + d;
      const type: DayType = holidays.has(dn) ? "holiday" : weekdayOfDayNumber(dn) === 0 ? "sunday" : weekdayOfDayNumber(dn) === 6 ? "saturday" : "weekday";
      for (const w of cal.closureWindows) {
        if (w.closure !== c.id || !w.dayTypes.includes(type)) continue;
        inst.push([d * 24 + w.startHour, w.endHour <= w.startHour ? d * 24 + 24 + w.endHour : d * 24 + w.endHour]);
      }
    }
    inst.sort((a, b) => a[0] - b[0]);
    const merged: Array<[number, number]> = [];
    for (const [a, b] of inst) {
      const last = merged[merged.length - 1];
      if (last && a <= last[1]) last[1] = Math.max(last[1], b);
      else merged.push([a, b]);
    }
    windowIntervals.set(c.id, merged);
  }
  return {
    day0, holidays, blocked, winters,
    firstWinterStart: first ? first.start : Infinity,
    firstWinterEnd: first ? first.end : Infinity,
    cutoffOffsetFt, windowIntervals,
  };
}

/** The window interval of closure `id` holding t, or null. */
function windowIntervalAt(cal: RefCalendar, id: string, t: number): [number, number] | null {
  for (const iv of cal.windowIntervals.get(id) ?? []) if (t >= iv[0] && t < iv[1]) return iv;
  return null;
}

/** Conditions 1–3 of MODEL.md "open time" at instant `t`, straight from the wording. */
export function isOpenByCalendar(s: Scenario, cal: RefCalendar, op: CrewOperation, t: number): boolean {
  const d = Math.floor(t / 24);
  const workDays = new Set(s.calendar.workDays);
  let inShift = false;
  // Shifts and windows of days before startDate never count (MODEL.md, condition 1).
  for (let dd = Math.max(0, d - 2); dd <= d && !inShift; dd++) {
    if (!workDays.has(weekdayOfDayNumber(cal.day0 + dd))) continue;
    for (const id of op.shifts) {
      const sh = s.calendar.shifts.find((x) => x.id === id)!;
      const a = dd * 24 + sh.startHour;
      // Condition 3's second half: a shift that started in a blocked interval is not worked at all.
      if (t >= a && t < a + sh.lengthHours && !cal.blocked.some(([x, y]) => a >= x && a < y)) inShift = true;
    }
  }
  if (!inShift) return false;
  if (op.closure !== undefined) {
    // Condition 2: inside the usable part [a + set-up, b − take-down) of a window interval of the closure.
    const c = s.calendar.closures.find((x) => x.id === op.closure)!;
    const iv = windowIntervalAt(cal, c.id, t);
    if (!iv || t < iv[0] + c.setupHours || t >= iv[1] - c.takedownHours) return false;
  }
  for (const [a, b] of cal.blocked) if (t >= a && t < b) return false;
  return true;
}

/** Magnus saturation vapour pressure, hPa, of a temperature in °F (MODEL.md; Alduchov & Eskridge 1996). */
const magnusHpa = (f: number) => {
  const c = ((f - 32) * 5) / 9;
  return 6.1094 * Math.exp((17.625 * c) / (c + 243.04));
};

/** Index of whole hour k in the samples' weather forecast, or −1 when the forecast does not cover it. */
function forecastIndex(samples: IterationSamples, k: number): number {
  const o = samples.weatherOverride;
  return o && k >= o.fromHour && k < o.toHour ? k - o.fromHour : -1;
}

/** Air temperature at whole hour k: the forecast's, else MODEL.md's hourly curve of the climate. */
export function refTemp(samples: IterationSamples, k: number): number {
  const i = forecastIndex(samples, k);
  return i >= 0 ? samples.weatherOverride!.tempF[i] : hourlyTempF(samples.weather, k);
}

/** Rain in slot [k, k+1): the forecast's drawn hour, else the climate's rain hours. */
export function refRain(samples: IterationSamples, k: number): boolean {
  const i = forecastIndex(samples, k);
  return i >= 0 ? samples.weatherOverride!.rain[i] === 1 : isRainHour(samples.weather, k);
}

/** RH (%) at whole hour k: the forecast's; else the day's RH holds at its mean temperature, the dew point is the day's. */
export function refHourlyRh(samples: IterationSamples, k: number): number {
  const i = forecastIndex(samples, k);
  if (i >= 0) return samples.weatherOverride!.rhPct[i];
  const w = samples.weather;
  const day = Math.floor(k / 24);
  w.ensure(day + 2);
  const vapor = (w.rhPct[day] / 100) * magnusHpa((w.tmaxF[day] + w.tminF[day]) / 2);
  return Math.min(100, (100 * vapor) / magnusHpa(hourlyTempF(w, k)));
}

/** Wind (mph) of slot [k, k+1): the day's wind, 30 % stronger at 15:00 and weaker at 03:00. */
export function refHourlyWind(samples: IterationSamples, k: number): number {
  const i = forecastIndex(samples, k);
  if (i >= 0) return samples.weatherOverride!.windMph[i];
  const w = samples.weather;
  const day = Math.floor(k / 24);
  w.ensure(day + 2);
  const h = k - 24 * day;
  return w.windMph[day] * (1 + 0.3 * Math.cos((2 * Math.PI * (h - 15)) / 24));
}

/** Both ends of slot [k, k+1) at or above `c` °F. */
const warmSlot = (samples: IterationSamples, c: number, k: number) =>
  refTemp(samples, k) >= c && refTemp(samples, k + 1) >= c;

/** Weather gates of slot [k, k+1) except `rising` (whose scope depends on `continuous`). */
export function slotPassesGates(op: CrewOperation, samples: IterationSamples, k: number): boolean {
  const g = op.gates;
  const w = samples.weather;
  const day = Math.floor(k / 24);
  w.ensure(day + 2);
  const t0 = refTemp(samples, k);
  const t1 = refTemp(samples, k + 1);
  if (g.minTempF !== undefined && (t0 < g.minTempF || t1 < g.minTempF)) return false;
  if (g.maxTempF !== undefined && (t0 > g.maxTempF || t1 > g.maxTempF)) return false;
  if (g.noRain && refRain(samples, k)) return false;
  if (g.maxWindMph !== undefined && refHourlyWind(samples, k) > g.maxWindMph) return false;
  if (g.maxEvaporation !== undefined) {
    const e = evaporationLbFt2h(t0 + (g.concreteDeltaF ?? 0), t0, refHourlyRh(samples, k), refHourlyWind(samples, k));
    if (e > g.maxEvaporation) return false;
  }
  return true;
}

/** "Rising", judged from the temperature: slot [k, k+1) is not falling. */
const isRisingSlot = (samples: IterationSamples, k: number) => refTemp(samples, k + 1) >= refTemp(samples, k);

/** A wait counted only in slots with both ends ≥ `c`, stepped hour by hour from `ready`. */
function warmWaitFinish(samples: IterationSamples, c: number, ready: number, hours: number, horizonHours: number): number {
  let left = hours;
  if (left <= 0) return ready;
  for (let k = Math.floor(ready); k < horizonHours; k++) {
    if (!warmSlot(samples, c, k)) continue;
    const from = Math.max(k, ready);
    if (k + 1 - from >= left - EPS) return from + left;
    left -= k + 1 - from;
  }
  return Infinity;
}

interface Crew {
  packet: number; // FREE, DONE or the claimed packet
  tau: number;
  lastStart: number; // production start of the crew's previous packet, NaN before its first
  mobLeft: number; // NaN: not decided yet for this packet
  mobStart: number; // NaN unless the crew mobilized for this packet
  workLeft: number;
  start: number; // NaN until production starts
  committedFinish: number; // continuous: NaN until a start is chosen
}
const FREE = -1;
const DONE = -2;

/** A stage operation as MODEL.md "Stages" defines it, resolved here from the scenario text. */
interface StageOp {
  stage: number;
  op: number;
  lo: number;
  hi: number;
}

export function referenceSimulate(
  s: Scenario,
  samples: IterationSamples,
  dt: number,
  horizonDays = 6 * 366,
): RefResult {
  if (!(dt > 0) || Math.abs(1 / dt - Math.round(1 / dt)) > 1e-9) throw new Error("dt must divide one hour");
  const cal = buildReferenceCalendar(s, horizonDays);
  const L = s.deck.lengthFt;
  const pf = s.deck.packetFt;
  const P = Math.ceil(L / pf);
  const pStart = (i: number) => i * pf;
  const pEnd = (i: number) => Math.min((i + 1) * pf, L);
  const ops = s.operations;
  const idx = new Map(ops.map((o, i) => [o.id, i]));

  // Stages: packets whose start offset lies in [from, to); operations listed (default all, scenario order).
  const stages = s.stages.map((st, si) => {
    const from = (st.fromStationFt ?? s.deck.startStationFt) - s.deck.startStationFt;
    const to = (st.toStationFt ?? s.deck.startStationFt + L) - s.deck.startStationFt;
    const inRange: number[] = [];
    for (let i = 0; i < P; i++) if (pStart(i) >= from && pStart(i) < to) inRange.push(i);
    const opList = ops.map((_, oi) => oi).filter((oi) => !st.operations || st.operations.includes(ops[oi].id));
    const afterStage = st.after ? s.stages.findIndex((x) => x.id === st.after!.stage) : si - 1;
    const after = si === 0 ? null : { stage: afterStage, when: st.after?.when ?? "stageDone", lagFt: st.after?.lagFt ?? 0, lagHours: st.after?.lagHours ?? 0 };
    return { id: st.id, lo: inRange[0] ?? 0, hi: inRange.length ? inRange[inRange.length - 1] + 1 : 0, ops: opList, after, standing: st.standingLanesClosed };
  });
  const units: StageOp[] = [];
  const unitOf = (stage: number, op: number) => units.findIndex((u) => u.stage === stage && u.op === op);
  stages.forEach((st, si) => st.ops.forEach((oi) => units.push({ stage: si, op: oi, lo: st.lo, hi: st.hi })));
  const inStageLinks = (si: number) => s.links.filter((l) => stages[si].ops.includes(idx.get(l.from)!) && stages[si].ops.includes(idx.get(l.to)!));
  const isSource = (si: number, oi: number) => !inStageLinks(si).some((l) => idx.get(l.to) === oi);
  const isSink = (si: number, oi: number) => !inStageLinks(si).some((l) => idx.get(l.from) === oi);
  const finish = units.map(() => new Float64Array(P).fill(NaN));
  const started = units.map(() => new Float64Array(P).fill(NaN)); // mobilization or production start (crews)
  const packets: RefPacket[] = [];
  const uses = new Map<string, Array<[number, number]>>(s.calendar.closures.map((c) => [c.id, []]));

  // What each stage operation waits for, as (from unit, kind) pairs; used for the ready time and the order.
  type Dep = { from: number; lagHours: number; lagFt: number; kind: "packets" | "whole" };
  const deps: Dep[][] = units.map((u) => {
    const out: Dep[] = [];
    for (const l of inStageLinks(u.stage)) if (idx.get(l.to) === u.op) out.push({ from: unitOf(u.stage, idx.get(l.from)!), lagHours: l.lagHours, lagFt: l.lagFt, kind: "packets" });
    for (let e = u.stage - 1; e >= 0; e--) {
      const prev = unitOf(e, u.op);
      if (prev >= 0) {
        out.push({ from: prev, lagHours: 0, lagFt: 0, kind: "whole" }); // fleet rule
        break;
      }
    }
    const a = stages[u.stage].after;
    if (a && isSource(u.stage, u.op)) {
      for (const oi of stages[a.stage].ops) {
        if (a.when === "stageDone") out.push({ from: unitOf(a.stage, oi), lagHours: a.lagHours, lagFt: 0, kind: "whole" });
        else if (isSink(a.stage, oi)) out.push({ from: unitOf(a.stage, oi), lagHours: a.lagHours, lagFt: a.lagFt, kind: "packets" });
      }
    }
    return out;
  });

  // Precedence order (Kahn) over stage operations; validation guarantees there is no cycle.
  const order: number[] = [];
  const indeg = units.map((_, u) => deps[u].length);
  const queue = units.map((_, u) => u).filter((u) => indeg[u] === 0);
  while (queue.length) {
    const u = queue.shift()!;
    order.push(u);
    units.forEach((_, v) => deps[v].forEach((d) => d.from === u && --indeg[v] === 0 && queue.push(v)));
  }

  const ready = (u: number, i: number): number => {
    let r = 0;
    for (const d of deps[u]) {
      const fa = finish[d.from];
      const A = units[d.from];
      if (d.kind === "whole") {
        let m = -Infinity;
        for (let k = A.lo; k < A.hi; k++) {
          if (Number.isNaN(fa[k])) return NaN;
          m = Math.max(m, fa[k]);
        }
        r = Math.max(r, m + d.lagHours);
        continue;
      }
      // "A's same packet" counts only when it is one of A's; A's packets outside nothing.
      if (i >= A.lo && i < A.hi) {
        if (Number.isNaN(fa[i])) return NaN;
        r = Math.max(r, fa[i] + d.lagHours);
      }
      for (let k = A.lo; k < A.hi && pStart(k) < pEnd(i) + d.lagFt; k++) {
        if (Number.isNaN(fa[k])) return NaN;
        r = Math.max(r, fa[k]);
      }
    }
    if (ops[units[u].op].kind === "crew" && pStart(i) >= cal.cutoffOffsetFt - EPS) r = Math.max(r, cal.firstWinterEnd);
    return r;
  };

  // Per-operation caches: open by conditions 1–3 per step, gates per hour slot.
  const perDay = Math.round(24 / dt);
  const openCache = ops.map(() => new Map<number, Uint8Array>());
  const open13 = (o: number, n: number): boolean => {
    const d = Math.floor(n / perDay);
    let arr = openCache[o].get(d);
    if (!arr) {
      arr = new Uint8Array(perDay);
      for (let j = 0; j < perDay; j++)
        arr[j] = isOpenByCalendar(s, cal, ops[o] as CrewOperation, (d * perDay + j + 0.5) * dt) ? 1 : 0;
      openCache[o].set(d, arr);
    }
    return arr[n - d * perDay] === 1;
  };
  const gateCache = ops.map(() => new Map<number, boolean>());
  const gate = (o: number, k: number): boolean => {
    let v = gateCache[o].get(k);
    if (v === undefined) gateCache[o].set(k, (v = slotPassesGates(ops[o] as CrewOperation, samples, k)));
    return v;
  };
  const slotOf = (n: number) => Math.floor(n * dt + EPS);
  const open14 = (o: number, n: number, withRising: boolean): boolean =>
    open13(o, n) && gate(o, slotOf(n)) && (!withRising || isRisingSlot(samples, slotOf(n)));

  /** Continuous: does [T, T+h) fit in open time, with the rain-free tail after it? */
  const fits = (o: number, n: number, h: number): boolean => {
    const op = ops[o] as CrewOperation;
    const T = n * dt;
    if (op.gates.rising && !isRisingSlot(samples, slotOf(n))) return false;
    const lastStep = Math.ceil((T + h) / dt - EPS) - 1;
    for (let m = n; m <= lastStep; m++) if (!open14(o, m, false)) return false;
    const after = op.gates.noRainHoursAfter ?? 0;
    if (after > 0) {
      const w = samples.weather;
      const k1 = Math.ceil(T + h + after - EPS) - 1;
      w.ensure(Math.floor(k1 / 24) + 2);
      for (let k = Math.floor(T + h + EPS); k <= k1; k++) if (refRain(samples, k)) return false;
    }
    const protect = op.gates.protectAfter;
    if (protect?.minTempF !== undefined && protect.hours !== undefined && protect.hours > 0) {
      // Every slot touching [finish, finish + hours] warm at both ends (the same "touching" as the rain tail).
      const k1 = Math.ceil(T + h + protect.hours - EPS) - 1;
      for (let k = Math.floor(T + h + EPS); k <= k1; k++) if (!warmSlot(samples, protect.minTempF, k)) return false;
    }
    return true;
  };

  const crews: Crew[][] = units.map((u) =>
    Array.from({ length: ops[u.op].kind === "crew" ? (ops[u.op] as CrewOperation).crews : 0 }, () => ({
      packet: FREE, tau: 0, lastStart: NaN, mobLeft: NaN, mobStart: NaN, workLeft: NaN, start: NaN, committedFinish: NaN,
    })),
  );
  const nextClaim = units.map((u) => u.lo);
  let remaining = units.reduce((n, u) => n + (u.hi - u.lo), 0);
  const steps = Math.round((horizonDays * 24) / dt);

  for (let n = 0; n < steps && remaining > 0; n++) {
    const T = n * dt;
    const E = (n + 1) * dt;
    const snap = (x: number) => (Math.abs(x - E) < EPS ? E : x);
    for (const u of order) {
      const o = units[u].op;
      const op = ops[o];
      const stageId = stages[units[u].stage].id;
      if (op.kind === "wait") {
        for (let i = units[u].lo; i < units[u].hi; i++) {
          if (!Number.isNaN(finish[u][i])) continue;
          const r = ready(u, i);
          if (Number.isNaN(r)) continue;
          finish[u][i] =
            op.countAboveF === undefined
              ? r + samples.waitHours[o]
              : warmWaitFinish(samples, op.countAboveF, r, samples.waitHours[o], horizonDays * 24);
          packets.push({ op: op.id, stage: stageId, packet: i, crew: -1, start: r, finish: finish[u][i] });
          if (finish[u][i] < Infinity) remaining--; // a cure that never ends leaves the run unfinished
        }
        continue;
      }
      const use = op.closure !== undefined ? uses.get(op.closure)! : null;
      const cs = crews[u];
      for (;;) {
        let c = -1; // the crew with the earliest clock moves next (lower index on ties)
        for (let j = 0; j < cs.length; j++)
          if (cs[j].packet !== DONE && cs[j].tau < E && (c < 0 || cs[j].tau < cs[c].tau)) c = j;
        if (c < 0) break;
        const cr = cs[c];
        if (cr.packet === FREE) {
          if (nextClaim[u] >= units[u].hi) {
            cr.packet = DONE;
            continue;
          }
          const i = nextClaim[u]++;
          cr.packet = i;
          cr.workLeft = (pEnd(i) - pStart(i)) / samples.rateFtPerHour[o] + (samples.discoveredExtraHours[o]?.[i] ?? 0);
          cr.start = NaN;
          cr.committedFinish = NaN;
          cr.mobLeft = NaN;
          cr.mobStart = NaN;
          continue;
        }
        const i = cr.packet;
        const done = (t: number) => {
          finish[u][i] = t;
          started[u][i] = Number.isNaN(cr.mobStart) ? cr.start : cr.mobStart;
          packets.push({ op: op.id, stage: stageId, packet: i, crew: c, start: cr.start, finish: t });
          remaining--;
          cr.packet = FREE;
          cr.lastStart = cr.start;
          cr.tau = snap(t);
        };
        if (!Number.isNaN(cr.committedFinish)) {
          if (cr.committedFinish <= E + EPS) done(cr.committedFinish);
          else cr.tau = E;
          continue;
        }
        const r = ready(u, i);
        if (Number.isNaN(r) || r >= E - EPS) {
          cr.tau = E;
          continue;
        }
        if (r > cr.tau + EPS) {
          cr.tau = r;
          continue;
        }
        if (Number.isNaN(cr.mobLeft)) {
          // Decided at the first open instant (1–3) at or after max(free, ready): τ itself, as the crew's
          // clock only stops inside a step it can use.
          if (!open13(o, n)) {
            cr.tau = E;
            continue;
          }
          const q = cr.tau;
          const prev = cr.lastStart;
          if (Number.isNaN(prev)) cr.mobLeft = op.mobilizationHours;
          else if (cal.winters.some((w) => w.start > prev && w.end <= q + EPS)) cr.mobLeft = s.calendar.season.remobilizeHours;
          else cr.mobLeft = 0;
          if (cr.mobLeft > EPS) cr.mobStart = q;
        }
        if (cr.mobLeft > EPS) {
          if (!open13(o, n)) cr.tau = E;
          else if (cr.mobLeft <= E - cr.tau + EPS) {
            use?.push([cr.tau, cr.tau + cr.mobLeft]);
            cr.tau = snap(cr.tau + cr.mobLeft);
            cr.mobLeft = 0;
          } else {
            use?.push([cr.tau, E]);
            cr.mobLeft -= E - cr.tau;
            cr.tau = E;
          }
          continue;
        }
        if (op.continuous) {
          const candidate = Math.abs(T - Math.round(T)) < EPS || (open14(o, n, false) && !open14(o, n - 1, false));
          if (cr.tau <= T + EPS && candidate && fits(o, n, cr.workLeft)) {
            cr.start = T;
            cr.committedFinish = T + cr.workLeft;
            use?.push([T, T + cr.workLeft]);
            cr.tau = T;
          } else cr.tau = E;
          continue;
        }
        if (!open14(o, n, !!op.gates.rising)) {
          cr.tau = E;
          continue;
        }
        if (Number.isNaN(cr.start)) cr.start = cr.tau;
        if (cr.workLeft <= E - cr.tau + EPS) {
          use?.push([cr.tau, cr.tau + cr.workLeft]);
          done(cr.tau + cr.workLeft);
        } else {
          use?.push([cr.tau, E]);
          cr.workLeft -= E - cr.tau;
          cr.tau = E;
        }
      }
    }
  }
  let last = 0;
  for (const f of finish) for (const x of f) if (x > last) last = x;
  const stageFinish: Record<string, number> = {};
  stages.forEach((st, si) => {
    let m = -Infinity;
    units.forEach((u, k) => {
      if (u.stage === si) for (let i = u.lo; i < u.hi; i++) m = Math.max(m, Number.isNaN(finish[k][i]) ? Infinity : finish[k][i]);
    });
    stageFinish[st.id] = m;
  });
  const periods = timelineOf(s, cal, stages, units, finish, started, uses, stageFinish, horizonDays);
  return { packets, finish: last, unfinished: remaining > 0, periods, stageFinish };
}

/**
 * MODEL.md "Closures that stand": short-term periods per window interval from first use − set-up to last use +
 * take-down; standing periods from a stage's first crew start to its restoration, lifted over the first winter
 * of a two-season plan when every started packet is restored by then.
 */
function timelineOf(
  s: Scenario, cal: RefCalendar,
  stages: { id: string; ops: number[]; lo: number; hi: number; standing: string[] }[],
  units: StageOp[], finish: Float64Array[], started: Float64Array[],
  uses: Map<string, Array<[number, number]>>, stageFinish: Record<string, number>, horizonDays: number,
): RefPeriod[] {
  const out: RefPeriod[] = [];
  for (const c of s.calendar.closures) {
    const byInterval = new Map<number, [number, number]>();
    for (const [a, b] of uses.get(c.id)!) {
      if (!(b > a)) continue;
      const iv = cal.windowIntervals.get(c.id)!.findIndex(([x, y]) => a >= x && a < y);
      const cur = byInterval.get(iv);
      byInterval.set(iv, cur ? [Math.min(cur[0], a), Math.max(cur[1], b)] : [a, b]);
    }
    for (const [a, b] of byInterval.values())
      out.push({ closure: c.id, kind: "short", lanes: c.lanesClosed, start: a - c.setupHours, end: b + c.takedownHours });
  }
  const W = cal.firstWinterStart;
  stages.forEach((st, si) => {
    if (st.standing.length === 0) return;
    const crewUnits = units.map((u, k) => ({ u, k })).filter(({ u }) => u.stage === si && s.operations[u.op].kind === "crew");
    const allUnits = units.map((u, k) => ({ u, k })).filter(({ u }) => u.stage === si);
    const starts = crewUnits.flatMap(({ k, u }) => Array.from(started[k].subarray(u.lo, u.hi)).filter((x) => !Number.isNaN(x)));
    const S = Math.min(...starts);
    const R = Math.min(stageFinish[st.id], horizonDays * 24);
    if (!(S < R)) return;
    const push = (a: number, b: number) => out.push({ closure: `stage:${st.id}`, kind: "standing", lanes: st.standing, start: a, end: b });
    if (s.calendar.season.plan === "two" && S < W && R > W) {
      let restored = true;
      for (let i = st.lo; i < st.hi; i++) {
        const begun = crewUnits.some(({ k }) => started[k][i] < W);
        if (begun && !allUnits.every(({ k }) => finish[k][i] <= W)) restored = false;
      }
      if (restored) {
        push(S, W);
        const S2 = Math.min(...starts.filter((x) => x >= W));
        if (S2 < R) push(S2, R);
        return;
      }
    }
    push(S, R);
  });
  return out;
}
