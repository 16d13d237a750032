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
 * - a discovering continuous operation fits base + extra hours in one interval.
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
      blocked.push([hourOf(first - 1) + 15, hourOf(last + 1)]);
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

/** Weather gates of slot [k, k+1) except `rising` (whose scope depends on `continuous`). */
export function slotPassesGates(op: CrewOperation, samples: IterationSamples, k: number): boolean {
  const g = op.gates;
  const w = samples.weather;
  const day = Math.floor(k / 24);
  w.ensure(day + 2);
  if (g.minTempF !== undefined && (hourlyTempF(w, k) < g.minTempF || hourlyTempF(w, k + 1) < g.minTempF)) return false;
  if (g.noRain && isRainHour(w, k)) return false;
  if (g.maxWindMph !== undefined && w.windMph[day] > g.maxWindMph) return false;
  if (g.maxEvaporation !== undefined) {
    const air = hourlyTempF(w, k);
    if (evaporationLbFt2h(air + (g.concreteDeltaF ?? 0), air, w.rhPct[day], w.windMph[day]) > g.maxEvaporation)
      return false;
  }
  return true;
}

const isRisingSlot = (k: number) => {
  const h = ((k % 24) + 24) % 24;
  return h >= 6 && h < 15;
};

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
    open13(o, n) && gate(o, slotOf(n)) && (!withRising || isRisingSlot(slotOf(n)));

  /** Continuous: does [T, T+h) fit in open time, with the rain-free tail after it? */
  const fits = (o: number, n: number, h: number): boolean => {
    const op = ops[o] as CrewOperation;
    const T = n * dt;
    if (op.gates.rising && !isRisingSlot(slotOf(n))) return false;
    const lastStep = Math.ceil((T + h) / dt - EPS) - 1;
    for (let m = n; m <= lastStep; m++) if (!open14(o, m, false)) return false;
    const after = op.gates.noRainHoursAfter ?? 0;
    if (after > 0) {
      const w = samples.weather;
      const k1 = Math.ceil(T + h + after - EPS) - 1;
      w.ensure(Math.floor(k1 / 24) + 2);
      for (let k = Math.floor(T + h + EPS); k <= k1; k++) if (isRainHour(w, k)) return false;
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
          finish[o][i] = r + samples.waitHours[o];
          packets.push({ op: op.id, packet: i, crew: -1, start: r, finish: finish[o][i] });
          remaining--;
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
