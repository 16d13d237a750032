/**
 * The deterministic calendar of a scenario, compiled once (never per iteration). Contract (MODEL.md,
 * "When a crew may work" conditions 1–3 and "Calendar"): for each crew operation, the sorted, disjoint open
 * intervals = (its shifts on work days, but not those that start in a blocked interval) ∩ (its closure's
 * windows by day type) − blocked intervals, in hours
 * since 00:00 of `startDate`, up to a horizon. Blocked = holiday stand-down blocks, winters (with the
 * demobilization hours before each), the two-season cut-off. Also: day types, winter boundaries, the shift
 * instances of each operation (for weather-lost shift counting) and a per-day index for O(1) look-ups.
 */
import { daysFromCivil, parseIsoDate, weekdayOfDayNumber, civilFromDays } from "./dates";
import { federalHolidays } from "./holidays";
import type { DayType, Scenario } from "./schema";

/** Six years: an iteration still unfinished then reports `unfinished` instead of looping. */
export const HORIZON_DAYS = 6 * 365 + 2;

export const DAY_TYPE_CODE: Record<DayType, number> = { weekday: 0, saturday: 1, sunday: 2, holiday: 3 };

export interface Intervals {
  starts: Float64Array;
  ends: Float64Array;
  length: number;
  /** dayIndex[d] = first interval whose end is > 24·d (d = 0 … days). */
  dayIndex: Int32Array;
}

export interface OpCalendar {
  open: Intervals;
  /** Shift instances on work days, sorted by start (not merged, not clipped by windows or blocks). */
  shifts: Intervals;
}

export interface CompiledCalendar {
  startDay: number;
  days: number;
  horizonHours: number;
  dayType: Uint8Array;
  blocked: Intervals;
  /** Hours of each winter start / end overlapping the horizon, ascending (first winter's start = cut-off). */
  winterStarts: Float64Array;
  winterEnds: Float64Array;
  firstWinterStart: number;
  firstWinterEnd: number;
  /** Per operation index; null for wait operations. */
  ops: (OpCalendar | null)[];
  /** Per short-term closure (calendar.closures order): its window intervals, before set-up/take-down and blocks. */
  closureWindows: Intervals[];
}

type Pairs = number[]; // flat [s0, e0, s1, e1, …]

function sortMerge(p: Pairs): Pairs {
  const idx: number[] = [];
  for (let i = 0; i < p.length; i += 2) if (p[i + 1] > p[i]) idx.push(i);
  idx.sort((a, b) => p[a] - p[b] || p[a + 1] - p[b + 1]);
  const out: Pairs = [];
  for (const i of idx) {
    const s = p[i];
    const e = p[i + 1];
    if (out.length > 0 && s <= out[out.length - 1]) {
      if (e > out[out.length - 1]) out[out.length - 1] = e;
    } else out.push(s, e);
  }
  return out;
}

function intersect(a: Pairs, b: Pairs): Pairs {
  const out: Pairs = [];
  let i = 0;
  let j = 0;
  while (i < a.length && j < b.length) {
    const s = Math.max(a[i], b[j]);
    const e = Math.min(a[i + 1], b[j + 1]);
    if (e > s) out.push(s, e);
    if (a[i + 1] < b[j + 1]) i += 2;
    else j += 2;
  }
  return out;
}

function subtract(a: Pairs, blocked: Pairs): Pairs {
  const out: Pairs = [];
  let j = 0;
  for (let i = 0; i < a.length; i += 2) {
    let s = a[i];
    const e = a[i + 1];
    while (j < blocked.length && blocked[j + 1] <= s) j += 2;
    let k = j;
    while (k < blocked.length && blocked[k] < e) {
      if (blocked[k] > s) out.push(s, blocked[k]);
      s = Math.max(s, blocked[k + 1]);
      k += 2;
    }
    if (e > s) out.push(s, e);
  }
  return out;
}

function toIntervals(p: Pairs, days: number): Intervals {
  const n = p.length / 2;
  const starts = new Float64Array(n);
  const ends = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    starts[i] = p[2 * i];
    ends[i] = p[2 * i + 1];
  }
  const dayIndex = new Int32Array(days + 1);
  let i = 0;
  for (let d = 0; d <= days; d++) {
    while (i < n && ends[i] <= 24 * d) i++;
    dayIndex[d] = i;
  }
  return { starts, ends, length: n, dayIndex };
}

/** Index of the first interval whose end is after `t` (`iv.length` if none within the horizon). */
export function firstIntervalAfter(iv: Intervals, t: number): number {
  const d = Math.floor(t / 24);
  if (d >= iv.dayIndex.length) return iv.length;
  let i = d < 0 ? 0 : iv.dayIndex[d];
  while (i < iv.length && iv.ends[i] <= t) i++;
  return i;
}

/**
 * `firstIntervalAfter(iv, t)` for a scan moving forward: `i` is the answer for an earlier instant, so the answer
 * for `t` is `i` itself, mostly the next one, or past a gap (a winter, nights nobody worked) a look-up.
 */
export function nextIntervalAfter(iv: Intervals, i: number, t: number): number {
  if (i >= iv.length || iv.ends[i] > t) return i;
  return i + 1 < iv.length && iv.ends[i + 1] > t ? i + 1 : firstIntervalAfter(iv, t);
}

/** The instant `hours` of open time after `t` are done, or Infinity past the horizon. */
export function accrueOpen(iv: Intervals, t: number, hours: number): number {
  let rem = hours;
  if (rem <= 0) return t;
  for (let i = firstIntervalAfter(iv, t); i < iv.length; i++) {
    const a = iv.starts[i] > t ? iv.starts[i] : t;
    const avail = iv.ends[i] - a;
    if (avail >= rem - 1e-9) return a + rem;
    rem -= avail;
  }
  return Infinity;
}

/** Number of winter ends at or before `t`: the season index (0 = first season). */
export function seasonAt(cal: CompiledCalendar, t: number): number {
  let s = 0;
  while (s < cal.winterEnds.length && cal.winterEnds[s] <= t) s++;
  return s;
}

export interface DayPattern {
  days: number;
  workDay(d: number): boolean;
  dayType(d: number): number;
}

type WindowLike = { dayTypes: DayType[]; startHour: number; endHour: number };

/** A closure's window intervals: the maximal intervals of the union of its window instances (MODEL.md, condition 2). */
export function windowIntervals(pattern: DayPattern, windows: ReadonlyArray<WindowLike>): Pairs {
  const windowPairs: Pairs = [];
  for (let d = 0; d < pattern.days; d++) {
    const base = 24 * d;
    const type = pattern.dayType(d);
    for (const w of windows) {
      if (!w.dayTypes.some((t) => DAY_TYPE_CODE[t] === type)) continue;
      const end = w.endHour <= w.startHour ? base + 24 + w.endHour : base + w.endHour;
      windowPairs.push(base + w.startHour, end);
    }
  }
  return sortMerge(windowPairs);
}

/** The usable part [a + setup, b − takedown) of each window interval; empty parts are dropped. */
export function usableParts(intervals: Pairs, setupHours: number, takedownHours: number): Pairs {
  if (setupHours === 0 && takedownHours === 0) return intervals;
  const out: Pairs = [];
  for (let i = 0; i < intervals.length; i += 2) {
    const a = intervals[i] + setupHours;
    const b = intervals[i + 1] - takedownHours;
    if (a < b) out.push(a, b);
  }
  return out;
}

/**
 * Shifts on work days ∩ the usable parts of the closure's window intervals, before blocking (also used by
 * validation). `windows` null: the operation needs no short-term closure, so its shifts alone.
 */
export function openBeforeBlocks(
  pattern: DayPattern,
  shifts: ReadonlyArray<{ startHour: number; lengthHours: number }>,
  windows: ReadonlyArray<WindowLike> | null,
  changeover: { setupHours: number; takedownHours: number } | null = null,
  blocked: Pairs | null = null,
): { open: Pairs; shiftPairs: Pairs } {
  const shiftPairs: Pairs = [];
  for (let d = 0; d < pattern.days; d++) {
    const base = 24 * d;
    if (pattern.workDay(d)) for (const s of shifts) shiftPairs.push(base + s.startHour, base + s.startHour + s.lengthHours);
  }
  const sortedShifts: Pairs = [];
  const order = [];
  for (let i = 0; i < shiftPairs.length; i += 2) order.push(i);
  order.sort((a, b) => shiftPairs[a] - shiftPairs[b] || shiftPairs[a + 1] - shiftPairs[b + 1]);
  for (const i of order) sortedShifts.push(shiftPairs[i], shiftPairs[i + 1]);
  const merged = sortMerge(blocked === null ? shiftPairs : startedOutside(sortedShifts, blocked));
  if (windows === null) return { open: merged, shiftPairs: sortedShifts };
  const usable = usableParts(windowIntervals(pattern, windows), changeover?.setupHours ?? 0, changeover?.takedownHours ?? 0);
  return { open: intersect(merged, usable), shiftPairs: sortedShifts };
}

/**
 * The shift instances (sorted by start) that do not start inside a blocked interval (sorted, merged):
 * a shift begun in a stand-down or a winter is not worked at all, not even after the block ends (MODEL.md,
 * condition 3).
 */
function startedOutside(sortedShifts: Pairs, blocked: Pairs): Pairs {
  const out: Pairs = [];
  let j = 0;
  for (let i = 0; i < sortedShifts.length; i += 2) {
    const s = sortedShifts[i];
    while (j < blocked.length && blocked[j + 1] <= s) j += 2;
    if (j < blocked.length && blocked[j] <= s) continue;
    out.push(s, sortedShifts[i + 1]);
  }
  return out;
}

function monthDayOf(md: string): [number, number] {
  return [Number(md.slice(0, 2)), Number(md.slice(3, 5))];
}

/**
 * Holiday stand-down blocks: each holiday day extended over adjacent weekend days (and Thu → Fri), with
 * `throughMonday` also the Monday after a block ending on a weekend day; blocked from `startHour` of the
 * day before the block to 24:00 of its last day.
 */
function holidayBlocks(holidayDays: ReadonlyArray<number>, startDay: number, startHour: number, throughMonday: boolean): Pairs {
  const out: Pairs = [];
  const isWeekend = (z: number) => {
    const w = weekdayOfDayNumber(z);
    return w === 0 || w === 6;
  };
  for (const h of holidayDays) {
    let first = h;
    let last = h;
    while (isWeekend(first - 1)) first--;
    if (weekdayOfDayNumber(h) === 4) last = h + 1;
    while (isWeekend(last + 1)) last++;
    if (throughMonday && isWeekend(last)) last++;
    out.push(24 * (first - 1 - startDay) + startHour, 24 * (last + 1 - startDay));
  }
  return out;
}

/**
 * The stand-downs of the calendar — holiday blocks (under the stand-down policy) and winters, merged — and the
 * holidays: the part of compileCalendar that needs no operation. The time–distance chart shades these
 * (compileStandDowns) without compiling every operation's work windows over the horizon.
 */
function standDownParts(scenario: Scenario, days: number) {
  const cal = scenario.calendar;
  const startDay = parseIsoDate(scenario.startDate);
  const horizonHours = 24 * days;
  const startYear = civilFromDays(startDay).y;
  const endYear = civilFromDays(startDay + days).y;

  const holidaySet = new Set<number>();
  if (cal.holidays.observeFederal)
    for (let y = startYear - 1; y <= endYear + 1; y++)
      for (const h of federalHolidays(y)) holidaySet.add(parseIsoDate(h.observed));
  for (const b of cal.holidays.blackoutDates) holidaySet.add(parseIsoDate(b));
  const holidayDays = [...holidaySet].filter((z) => z >= startDay - 7 && z < startDay + days + 7).sort((a, b) => a - b);

  const blocked: Pairs = [];
  if (cal.holidays.policy === "standDown") blocked.push(...holidayBlocks(holidayDays, startDay, cal.holidays.standDownStartHour, cal.holidays.standDownThroughMonday));
  const [wsM, wsD] = monthDayOf(cal.season.winterStart);
  const [weM, weD] = monthDayOf(cal.season.winterEnd);
  const winterStarts: number[] = [];
  const winterEnds: number[] = [];
  let firstWinterStart = Infinity;
  let firstWinterEnd = Infinity;
  for (let y = startYear - 1; y <= endYear; y++) {
    let ws = 24 * (daysFromCivil(y, wsM, wsD) - startDay);
    const we = 24 * (daysFromCivil(y + 1, weM, weD) - startDay);
    if (we <= 0 || ws >= horizonHours) continue;
    if (ws >= 0 && firstWinterStart === Infinity) {
      if (cal.season.plan === "two" && cal.season.cutoffDate)
        ws = Math.min(ws, 24 * (parseIsoDate(cal.season.cutoffDate) - startDay));
      firstWinterStart = ws;
      firstWinterEnd = we;
    }
    winterStarts.push(ws);
    winterEnds.push(we);
    blocked.push(ws - cal.season.demobilizeHours, we);
  }
  const blockedMerged = sortMerge(blocked);
  return { startDay, holidaySet, blockedMerged, winterStarts, winterEnds, firstWinterStart, firstWinterEnd };
}

/** The stand-downs alone (see standDownParts), in compileCalendar's form. */
export function compileStandDowns(scenario: Scenario, horizonDays = HORIZON_DAYS): Pick<CompiledCalendar, "blocked" | "winterStarts" | "winterEnds"> {
  const { blockedMerged, winterStarts, winterEnds } = standDownParts(scenario, horizonDays);
  return { blocked: toIntervals(blockedMerged, horizonDays), winterStarts: Float64Array.from(winterStarts), winterEnds: Float64Array.from(winterEnds) };
}

export function compileCalendar(scenario: Scenario, horizonDays = HORIZON_DAYS): CompiledCalendar {
  const cal = scenario.calendar;
  const days = horizonDays;
  const horizonHours = 24 * days;
  const { startDay, holidaySet, blockedMerged, winterStarts, winterEnds, firstWinterStart, firstWinterEnd } = standDownParts(scenario, days);

  const dayType = new Uint8Array(days + 1);
  for (let d = 0; d <= days; d++) {
    const z = startDay + d;
    const w = weekdayOfDayNumber(z);
    dayType[d] = holidaySet.has(z) ? 3 : w === 6 ? 1 : w === 0 ? 2 : 0;
  }

  const pattern: DayPattern = {
    days,
    workDay: (d) => cal.workDays.includes(weekdayOfDayNumber(startDay + d)),
    dayType: (d) => dayType[d],
  };
  const horizonPair: Pairs = [0, horizonHours];
  const ops = scenario.operations.map((op) => {
    if (op.kind !== "crew") return null;
    const shifts = op.shifts.map((id) => cal.shifts.find((s) => s.id === id)!);
    const closure = op.closure === undefined ? null : cal.closures.find((c) => c.id === op.closure)!;
    const windows = closure ? cal.closureWindows.filter((w) => w.closure === closure.id) : null;
    const { open, shiftPairs } = openBeforeBlocks(pattern, shifts, windows, closure, blockedMerged);
    const clipped = intersect(open, horizonPair);
    return {
      open: toIntervals(subtract(clipped, blockedMerged), days),
      shifts: toIntervals(shiftPairs, days),
    };
  });

  const closureWindows = cal.closures.map((c) =>
    toIntervals(windowIntervals(pattern, cal.closureWindows.filter((w) => w.closure === c.id)), days),
  );

  return {
    closureWindows,
    startDay,
    days,
    horizonHours,
    dayType,
    blocked: toIntervals(blockedMerged, days),
    winterStarts: Float64Array.from(winterStarts),
    winterEnds: Float64Array.from(winterEnds),
    firstWinterStart,
    firstWinterEnd,
    ops,
  };
}

/**
 * Stamp `gen` on every shift instance overlapping [a, b) by a positive length; returns how many were newly
 * stamped and appends their indices to `list` (from `list[0]`, a count kept by the caller) when given.
 */
export function stampShifts(shifts: Intervals, a: number, b: number, stamp: Int32Array, gen: number, list: Int32Array | null, count: number): number {
  let i = firstIntervalAfter(shifts, a - 24);
  for (; i < shifts.length && shifts.starts[i] < b; i++) {
    if (shifts.ends[i] > a && stamp[i] !== gen) {
      stamp[i] = gen;
      if (list) list[count++] = i;
    }
  }
  return count;
}

/** Adds the hours of [a, b) falling on each day (× `weight`) into `out[offset + d]`; widens `range` = [first, last] day. */
export function addHoursByDay(a: number, b: number, out: Float64Array, offset: number, days: number, range: Int32Array, weight = 1): void {
  let t = a;
  while (t < b) {
    const d = Math.floor(t / 24);
    if (d >= days) break;
    const dayEnd = Math.min(b, 24 * (d + 1));
    out[offset + d] += (dayEnd - t) * weight;
    if (d < range[0]) range[0] = d;
    if (d > range[1]) range[1] = d;
    t = dayEnd;
  }
}
