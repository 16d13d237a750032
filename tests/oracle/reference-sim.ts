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
 * Interpretations of MODEL.md that the text leaves open (kept deliberately simple, see the test report):
 * - a crew's first packet ever takes `mobilizationHours`, even when it comes after a winter; later packets
 *   take `remobilizeHours` by MODEL.md's "after a winter" rule, decided at the first open step (1–3) the
 *   crew reaches with its packet ready;
 * - `winterEnd` is in the next year when its MM-DD is ≤ `winterStart`'s, else in the same year;
 * - "open interval" = maximal run of open time (adjacent shifts/windows merge);
 * - a discovering continuous operation fits base + extra hours in one interval;
 * - hourly humidity and wind are computed here from MODEL.md's formulas (Magnus, dew point of the daily
 *   mean, 30 % diurnal wind), not taken from the engine's weather helpers; only the hourly temperature curve
 *   and the rain hours are shared (`hourlyTempF`, `isRainHour`), as they were before.
 */
import type { CrewOperation, DayType, Scenario } from "../../sim/schema";
import { civilFromDays, daysFromCivil, parseIsoDate, weekdayOfDayNumber } from "../../sim/dates";
import { federalHolidays } from "../../sim/holidays";
import { evaporationLbFt2h } from "../../sim/evaporation";
import { hourlyTempF, isRainHour } from "../../sim/weather";
import type { IterationSamples } from "../../sim/samples";

export interface RefPacket {
  op: string;
  packet: number;
  crew: number; // −1 for wait operations
  start: number;
  finish: number;
}
export interface RefResult {
  packets: RefPacket[];
  finish: number;
  unfinished: boolean;
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
  firstWinterEnd: number;
  cutoffOffsetFt: number;
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
  return { day0, holidays, blocked, winters, firstWinterEnd: first ? first.end : Infinity, cutoffOffsetFt };
}

function dayType(cal: RefCalendar, dayNum: number): DayType {
  if (cal.holidays.has(dayNum)) return "holiday";
  const w = weekdayOfDayNumber(dayNum);
  return w === 0 ? "sunday" : w === 6 ? "saturday" : "weekday";
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
      if (t >= a && t < a + sh.lengthHours) inShift = true;
    }
  }
  if (!inShift) return false;
  let inWindow = false;
  for (let dd = Math.max(0, d - 2); dd <= d && !inWindow; dd++) {
    const type = dayType(cal, cal.day0 + dd);
    for (const w of s.calendar.closureWindows) {
      if (w.closure !== op.closure || !w.dayTypes.includes(type)) continue;
      const a = dd * 24 + w.startHour;
      const b = w.endHour <= w.startHour ? dd * 24 + 24 + w.endHour : dd * 24 + w.endHour;
      if (t >= a && t < b) inWindow = true;
    }
  }
  if (!inWindow) return false;
  for (const [a, b] of cal.blocked) if (t >= a && t < b) return false;
  return true;
}

/** Magnus saturation vapour pressure, hPa, of a temperature in °F (MODEL.md; Alduchov & Eskridge 1996). */
const magnusHpa = (f: number) => {
  const c = ((f - 32) * 5) / 9;
  return 6.1094 * Math.exp((17.625 * c) / (c + 243.04));
};

/** RH (%) at whole hour k: the day's RH holds at its mean temperature, the dew point is the day's. */
export function refHourlyRh(samples: IterationSamples, k: number): number {
  const w = samples.weather;
  const day = Math.floor(k / 24);
  w.ensure(day + 2);
  const vapor = (w.rhPct[day] / 100) * magnusHpa((w.tmaxF[day] + w.tminF[day]) / 2);
  return Math.min(100, (100 * vapor) / magnusHpa(hourlyTempF(w, k)));
}

/** Wind (mph) of slot [k, k+1): the day's wind, 30 % stronger at 15:00 and weaker at 03:00. */
export function refHourlyWind(samples: IterationSamples, k: number): number {
  const w = samples.weather;
  const day = Math.floor(k / 24);
  w.ensure(day + 2);
  const h = k - 24 * day;
  return w.windMph[day] * (1 + 0.3 * Math.cos((2 * Math.PI * (h - 15)) / 24));
}

/** Both ends of slot [k, k+1) at or above `c` °F. */
const warmSlot = (samples: IterationSamples, c: number, k: number) =>
  hourlyTempF(samples.weather, k) >= c && hourlyTempF(samples.weather, k + 1) >= c;

/** Weather gates of slot [k, k+1) except `rising` (whose scope depends on `continuous`). */
export function slotPassesGates(op: CrewOperation, samples: IterationSamples, k: number): boolean {
  const g = op.gates;
  const w = samples.weather;
  const day = Math.floor(k / 24);
  w.ensure(day + 2);
  const t0 = hourlyTempF(w, k);
  const t1 = hourlyTempF(w, k + 1);
  if (g.minTempF !== undefined && (t0 < g.minTempF || t1 < g.minTempF)) return false;
  if (g.maxTempF !== undefined && (t0 > g.maxTempF || t1 > g.maxTempF)) return false;
  if (g.noRain && isRainHour(w, k)) return false;
  if (g.maxWindMph !== undefined && refHourlyWind(samples, k) > g.maxWindMph) return false;
  if (g.maxEvaporation !== undefined) {
    const e = evaporationLbFt2h(t0 + (g.concreteDeltaF ?? 0), t0, refHourlyRh(samples, k), refHourlyWind(samples, k));
    if (e > g.maxEvaporation) return false;
  }
  return true;
}

/** "Rising", judged from the temperature: slot [k, k+1) is not falling. */
const isRisingSlot = (samples: IterationSamples, k: number) => hourlyTempF(samples.weather, k + 1) >= hourlyTempF(samples.weather, k);

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
  workLeft: number;
  start: number; // NaN until production starts
  committedFinish: number; // continuous: NaN until a start is chosen
}
const FREE = -1;
const DONE = -2;

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
  const incoming = ops.map((o) => s.links.filter((l) => l.to === o.id));
  const finish = ops.map(() => new Float64Array(P).fill(NaN));
  const packets: RefPacket[] = [];

  // Precedence order (Kahn); validation guarantees there is no cycle.
  const order: number[] = [];
  const indeg = ops.map((_, i) => incoming[i].length);
  const queue = ops.map((_, i) => i).filter((i) => indeg[i] === 0);
  while (queue.length) {
    const i = queue.shift()!;
    order.push(i);
    for (const l of s.links) if (l.from === ops[i].id && --indeg[idx.get(l.to)!] === 0) queue.push(idx.get(l.to)!);
  }

  const ready = (o: number, i: number): number => {
    let r = 0;
    for (const l of incoming[o]) {
      const fa = finish[idx.get(l.from)!];
      if (Number.isNaN(fa[i])) return NaN;
      r = Math.max(r, fa[i] + l.lagHours);
      for (let k = 0; k < P && pStart(k) < pEnd(i) + l.lagFt; k++) {
        if (Number.isNaN(fa[k])) return NaN;
        r = Math.max(r, fa[k]);
      }
    }
    if (ops[o].kind === "crew" && pStart(i) >= cal.cutoffOffsetFt - EPS) r = Math.max(r, cal.firstWinterEnd);
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
      for (let k = Math.floor(T + h + EPS); k <= k1; k++) if (isRainHour(w, k)) return false;
    }
    const protect = op.gates.protectAfter;
    if (protect?.minTempF !== undefined && protect.hours !== undefined && protect.hours > 0) {
      // Every slot touching [finish, finish + hours] warm at both ends (the same "touching" as the rain tail).
      const k1 = Math.ceil(T + h + protect.hours - EPS) - 1;
      for (let k = Math.floor(T + h + EPS); k <= k1; k++) if (!warmSlot(samples, protect.minTempF, k)) return false;
    }
    return true;
  };

  const crews: Crew[][] = ops.map((o) =>
    Array.from({ length: o.kind === "crew" ? o.crews : 0 }, () => ({
      packet: FREE,
      tau: 0,
      lastStart: NaN,
      mobLeft: NaN,
      workLeft: NaN,
      start: NaN,
      committedFinish: NaN,
    })),
  );
  const nextClaim = ops.map(() => 0);
  let remaining = ops.length * P;
  const steps = Math.round((horizonDays * 24) / dt);

  for (let n = 0; n < steps && remaining > 0; n++) {
    const T = n * dt;
    const E = (n + 1) * dt;
    const snap = (x: number) => (Math.abs(x - E) < EPS ? E : x);
    for (const o of order) {
      const op = ops[o];
      if (op.kind === "wait") {
        for (let i = 0; i < P; i++) {
          if (!Number.isNaN(finish[o][i])) continue;
          const r = ready(o, i);
          if (Number.isNaN(r)) continue;
          finish[o][i] =
            op.countAboveF === undefined
              ? r + samples.waitHours[o]
              : warmWaitFinish(samples, op.countAboveF, r, samples.waitHours[o], horizonDays * 24);
          packets.push({ op: op.id, packet: i, crew: -1, start: r, finish: finish[o][i] });
          if (finish[o][i] < Infinity) remaining--; // a cure that never ends leaves the run unfinished
        }
        continue;
      }
      const cs = crews[o];
      for (;;) {
        let c = -1; // the crew with the earliest clock moves next (lower index on ties)
        for (let j = 0; j < cs.length; j++)
          if (cs[j].packet !== DONE && cs[j].tau < E && (c < 0 || cs[j].tau < cs[c].tau)) c = j;
        if (c < 0) break;
        const cr = cs[c];
        if (cr.packet === FREE) {
          if (nextClaim[o] >= P) {
            cr.packet = DONE;
            continue;
          }
          const i = nextClaim[o]++;
          cr.packet = i;
          cr.workLeft = (pEnd(i) - pStart(i)) / samples.rateFtPerHour[o] + (samples.discoveredExtraHours[o]?.[i] ?? 0);
          cr.start = NaN;
          cr.committedFinish = NaN;
          cr.mobLeft = NaN;
          continue;
        }
        const i = cr.packet;
        const done = (t: number) => {
          finish[o][i] = t;
          packets.push({ op: op.id, packet: i, crew: c, start: cr.start, finish: t });
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
        const r = ready(o, i);
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
        }
        if (cr.mobLeft > EPS) {
          if (!open13(o, n)) cr.tau = E;
          else if (cr.mobLeft <= E - cr.tau + EPS) {
            cr.tau = snap(cr.tau + cr.mobLeft);
            cr.mobLeft = 0;
          } else {
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
            cr.tau = T;
          } else cr.tau = E;
          continue;
        }
        if (!open14(o, n, !!op.gates.rising)) {
          cr.tau = E;
          continue;
        }
        if (Number.isNaN(cr.start)) cr.start = cr.tau;
        if (cr.workLeft <= E - cr.tau + EPS) done(cr.tau + cr.workLeft);
        else {
          cr.workLeft -= E - cr.tau;
          cr.tau = E;
        }
      }
    }
  }
  let last = 0;
  for (const f of finish) for (const x of f) if (x > last) last = x;
  return { packets, finish: last, unfinished: remaining > 0 };
}
