/**
 * The look-ahead board: for the next `days` days × each calendar shift × each weather-gated crew operation
 * that works that shift, may the operation work, which gates fail and when, and is its closure window open.
 * Contract: `lookAhead(scenario, forecast, {today})` is pure. Open time (MODEL.md "When a crew may work",
 * conditions 1–3) comes from the engine's own calendar (`compileCalendar`), compiled from the scenario's
 * start date, or from `today` when the plan has not started yet (the board then answers "if the crews were
 * out"). Gates (condition 4) are judged on the forecast's hourly values (./lookahead-gates):
 * - a non-continuous operation works every open hour slot whose gates hold: `go` when all do, `partial`
 *   when some do, `no` when none;
 * - a continuous operation (a pour) needs a whole packet inside one open interval, started at an interval
 *   start or a whole hour (MODEL.md "Work"), with every slot's gates, `rising` on its first slot and the
 *   after-pour gates holding: `go` when some start does, else `no`. The packet's hours use the rate's most
 *   likely value (fixed value, mode or median) on a full packet.
 * Where the forecast lacks a value the verdict is `unknown` unless another gate already fails. Times are
 * local `YYYY-MM-DDTHH:mm`.
 */
import { compileCalendar, DAY_TYPE_CODE, firstIntervalAfter, type CompiledCalendar, type Intervals } from "./calendar";
import { formatDayNumber, formatHours, parseIsoDate, weekdayOfDayNumber } from "./dates";
import { allHold, DEFAULT_RAIN_POP_PCT, GATE_LABELS, HourlyGates, isWeatherGated, type GateName, type GateSpec, type GateVerdict, type HourlyValues } from "./lookahead-gates";
import { rateFactorOf } from "./samples";
import type { CrewOperation, Distribution, Scenario } from "./schema";

export { GATE_LABELS, DEFAULT_RAIN_POP_PCT, type GateName } from "./lookahead-gates";

/** Hourly forecast values; index 0 is 00:00 of `firstDate` (local). */
export interface HourlyForecast extends HourlyValues {
  firstDate: string;
}

export type CellStatus = "go" | "partial" | "no" | "unknown" | "closed";

export interface HourReason {
  start: string;
  tempF: number | null;
  popPct: number | null;
  rhPct: number | null;
  windMph: number | null;
  ok: boolean | null;
  /** Gates that fail (or cannot be judged) in this slot. */
  problems: GateVerdict[];
}

export interface PourStart {
  start: string;
  finish: string;
  ok: boolean | null;
  problems: (GateVerdict & { at: string })[];
}

export interface OperationCell {
  operationId: string;
  name: string;
  status: CellStatus;
  /** true / false, or null when the forecast cannot tell. */
  mayWork: boolean | null;
  /** Why nothing can be done whatever the weather (status `closed`). */
  closedReason: string | null;
  closure: { id: string; name: string; open: boolean; windows: { from: string; to: string }[] } | null;
  openHours: number;
  workableHours: number;
  /** Gates that fail somewhere, with the slot start times. */
  failing: { gate: GateName; label: string; at: string[] }[];
  hours: HourReason[];
  /** Continuous operations: every candidate start. */
  pourStarts: PourStart[];
  pourHours: number | null;
}

export interface LookAheadShift {
  shiftId: string;
  name: string;
  start: string;
  end: string;
  operations: OperationCell[];
}

export interface LookAheadDay {
  date: string;
  weekday: string;
  shifts: LookAheadShift[];
}

export interface LookAheadOptions {
  /** The board's first day, local `YYYY-MM-DD`. */
  today: string;
  days?: number;
  rainPopPct?: number;
}

const WEEKDAYS = ["Sunday", "Monday", "Tuesday", "Wednesday", "Thursday", "Friday", "Saturday"];
/** Hours of forecast a pour's after-window may reach past the board (two days is more than any gate). */
const TAIL_DAYS = 3;

/** The distribution's most likely value: fixed value, mode, or median. */
export function typicalValue(d: Distribution): number {
  if (d.type === "fixed") return d.value;
  if (d.type === "lognormal") return d.median;
  return d.mode;
}

/** Hours to pour one full packet at the rate's most likely value. */
export function packetHours(scenario: Scenario, opIndex: number): number {
  const op = scenario.operations[opIndex] as CrewOperation;
  const ftPerHour = typicalValue(op.rate.dist) * rateFactorOf(scenario, opIndex);
  return ftPerHour > 0 ? Math.min(scenario.deck.packetFt, scenario.deck.lengthFt) / ftPerHour : Infinity;
}

function slice(iv: Intervals, a: number, b: number): [number, number][] {
  const out: [number, number][] = [];
  for (let i = firstIntervalAfter(iv, a); i < iv.length && iv.starts[i] < b; i++) {
    const s = Math.max(a, iv.starts[i]);
    const e = Math.min(b, iv.ends[i]);
    if (e > s) out.push([s, e]);
  }
  return out;
}

/** Closure window instances (by day type, before blocks) overlapping [a, b), in calendar hours. */
function closureWindows(scenario: Scenario, cal: CompiledCalendar, closure: string, a: number, b: number): [number, number][] {
  const out: [number, number][] = [];
  const firstDay = Math.max(0, Math.floor(a / 24) - 1);
  for (let d = firstDay; d <= Math.floor(b / 24) && d <= cal.days; d++) {
    for (const w of scenario.calendar.closureWindows) {
      if (w.closure !== closure || !w.dayTypes.some((t) => DAY_TYPE_CODE[t] === cal.dayType[d])) continue;
      const s = 24 * d + w.startHour;
      const e = w.endHour <= w.startHour ? 24 * (d + 1) + w.endHour : 24 * d + w.endHour;
      if (e > a && s < b) out.push([s, e]);
    }
  }
  return out.sort((x, y) => x[0] - y[0]);
}

function closedReason(cal: CompiledCalendar, opIndex: number, a: number, b: number, windowOpen: boolean): string {
  const opCal = cal.ops[opIndex]!;
  if (slice(opCal.shifts, a, b).length === 0) return "Not a work day.";
  const blocked = slice(cal.blocked, a, b);
  if (blocked.length > 0) {
    const winter = Array.from(cal.winterStarts).some((ws, i) => a < cal.winterEnds[i] && b > ws - 48);
    return winter ? "Winter shutdown." : "Holiday stand-down.";
  }
  return windowOpen ? "No open time in this shift." : "The closure window is not open during this shift.";
}

interface Ctx {
  scenario: Scenario;
  cal: CompiledCalendar;
  wx: HourlyGates;
  /** Calendar hour of forecast hour 0. */
  wxOrigin: number;
  startDay: number;
}

const iso = (c: Ctx, t: number) => formatHours(c.startDay, t);

function evaluateCell(c: Ctx, opIndex: number, a: number, b: number): OperationCell {
  const op = c.scenario.operations[opIndex] as CrewOperation;
  const g = op.gates as GateSpec;
  const closureDef = c.scenario.calendar.closures.find((x) => x.id === op.closure);
  const windows = closureDef ? closureWindows(c.scenario, c.cal, closureDef.id, a, b) : [];
  const open = slice(c.cal.ops[opIndex]!.open, a, b);
  const openHours = open.reduce((n, [s, e]) => n + e - s, 0);
  const cell: OperationCell = {
    operationId: op.id,
    name: op.name,
    status: "closed",
    mayWork: false,
    closedReason: null,
    closure: closureDef ? { id: closureDef.id, name: closureDef.name, open: windows.length > 0, windows: windows.map(([s, e]) => ({ from: iso(c, s), to: iso(c, e) })) } : null,
    openHours,
    workableHours: 0,
    failing: [],
    hours: [],
    pourStarts: [],
    pourHours: op.continuous ? packetHours(c.scenario, opIndex) : null,
  };
  if (open.length === 0) {
    cell.closedReason = closedReason(c.cal, opIndex, a, b, windows.length > 0);
    return cell;
  }
  const failAt = new Map<GateName, Set<number>>();
  const noteFail = (v: GateVerdict, k: number) => {
    if (v.ok !== false) return;
    if (!failAt.has(v.gate)) failAt.set(v.gate, new Set());
    failAt.get(v.gate)!.add(k);
  };
  const k0 = (t: number) => t - c.wxOrigin; // forecast index of calendar hour t
  // Hour-by-hour reasons over the open slots (rising every slot only for non-continuous operations).
  let passing = 0;
  let unknown = 0;
  for (const [s, e] of open) {
    for (let t = Math.floor(s); t < Math.ceil(e); t++) {
      const verdicts = c.wx.slot(g, k0(t), !op.continuous);
      const ok = allHold(verdicts);
      const k = k0(t);
      cell.hours.push({ start: iso(c, t), tempF: c.wx.temp(k), popPct: c.wx.pop(k), rhPct: c.wx.rh(k), windMph: c.wx.wind(k), ok, problems: verdicts.filter((v) => v.ok !== true) });
      const share = Math.min(e, t + 1) - Math.max(s, t);
      if (ok === true) passing += share;
      else if (ok === null) unknown += share;
      if (!op.continuous) for (const v of verdicts) noteFail(v, t);
    }
  }
  if (!op.continuous) {
    cell.workableHours = passing;
    if (passing > 0) cell.status = passing + 1e-9 >= openHours ? "go" : "partial";
    else cell.status = unknown > 0 ? "unknown" : "no";
  } else {
    const hours = cell.pourHours!;
    let anyOk = false;
    let anyUnknown = false;
    for (const [s, e] of open) {
      const starts = [s];
      for (let t = Math.ceil(s); t < e; t++) if (t > s) starts.push(t);
      for (const t of starts) {
        const f = t + hours;
        if (f > e + 1e-9) break;
        const problems: (GateVerdict & { at: string })[] = [];
        for (let u = Math.floor(t); u < Math.ceil(f); u++) {
          for (const v of c.wx.slot(g, k0(u), u === Math.floor(t))) {
            if (v.ok !== true) problems.push({ ...v, at: iso(c, u) });
            noteFail(v, u);
          }
        }
        for (const { k, verdict } of c.wx.afterPour(g, k0(f))) {
          if (verdict.ok !== true) problems.push({ ...verdict, at: iso(c, k + c.wxOrigin) });
          noteFail(verdict, k + c.wxOrigin);
        }
        const ok = allHold(problems);
        anyOk ||= ok === true;
        anyUnknown ||= ok === null;
        cell.pourStarts.push({ start: iso(c, t), finish: iso(c, f), ok, problems });
      }
    }
    if (cell.pourStarts.length === 0) {
      cell.closedReason = `A packet's pour (${hours.toFixed(1)} h) does not fit in the open time of this shift.`;
      return cell;
    }
    cell.workableHours = anyOk ? hours : 0;
    cell.status = anyOk ? "go" : anyUnknown ? "unknown" : "no";
  }
  cell.mayWork = cell.status === "go" || cell.status === "partial" ? true : cell.status === "unknown" ? null : false;
  cell.failing = [...failAt.entries()].map(([gate, ks]) => ({ gate, label: GATE_LABELS[gate], at: [...ks].sort((x, y) => x - y).map((k) => iso(c, k)) }));
  return cell;
}

export function lookAhead(scenario: Scenario, forecast: HourlyForecast | null, opts: LookAheadOptions): LookAheadDay[] {
  const days = opts.days ?? 7;
  const todayDay = parseIsoDate(opts.today);
  // The plan's own calendar; a plan that has not started yet is read as if it started today.
  const planStart = parseIsoDate(scenario.startDate);
  const calScenario = planStart <= todayDay ? scenario : { ...scenario, startDate: opts.today };
  const startDay = Math.min(planStart, todayDay);
  const cal = compileCalendar(calScenario, todayDay - startDay + days + TAIL_DAYS);
  const empty: HourlyValues = { tempF: [], popPct: [], rhPct: [], windMph: [] };
  const wxOrigin = forecast ? 24 * (parseIsoDate(forecast.firstDate) - startDay) : 0;
  const c: Ctx = { scenario, cal, wx: new HourlyGates(forecast ?? empty, opts.rainPopPct ?? DEFAULT_RAIN_POP_PCT), wxOrigin, startDay };
  const gated = scenario.operations
    .map((op, i) => ({ op, i }))
    .filter((x): x is { op: CrewOperation; i: number } => x.op.kind === "crew" && isWeatherGated(x.op.gates as GateSpec, x.op.continuous));
  const out: LookAheadDay[] = [];
  for (let n = 0; n < days; n++) {
    const dayNumber = todayDay + n;
    const d = dayNumber - startDay;
    const shifts = scenario.calendar.shifts.map((s) => {
      const a = 24 * d + s.startHour;
      const b = a + s.lengthHours;
      const operations = gated.filter(({ op }) => op.shifts.includes(s.id)).map(({ i }) => evaluateCell(c, i, a, b));
      return { shiftId: s.id, name: s.name, start: iso(c, a), end: iso(c, b), operations };
    });
    out.push({ date: formatDayNumber(dayNumber), weekday: WEEKDAYS[weekdayOfDayNumber(dayNumber)], shifts: shifts.filter((s) => s.operations.length > 0) });
  }
  return out;
}

/** When the plan's calendar next lets each weather-gated operation work, weather aside (`nextOpenAfter`). */
export interface NextOpenTime {
  /** Per weather-gated operation with open time left, earliest first. */
  operations: { operationId: string; operation: string; /** Local `YYYY-MM-DDTHH:mm`. */ start: string; weekday: string }[];
  /** The plan's start date, when the board's week lies before it (the board then reads the plan as if it started today). */
  planStart: string | null;
}

/**
 * For each weather-gated operation, its first open instant (MODEL.md "When a crew may work", conditions 1–3:
 * shifts, closure windows, work days, holidays, winter) after the board's `days` days, on the plan's own
 * calendar from its own start date — what a board of closed cells should point to. Each operation on its own:
 * the calendar does not know the order the work will reach them. Null when none has open time before the
 * calendar's horizon. Weather is not judged: the board judges a day when it comes within the forecast.
 */
export function nextOpenAfter(scenario: Scenario, opts: LookAheadOptions): NextOpenTime | null {
  const days = opts.days ?? 7;
  const today = parseIsoDate(opts.today);
  const planStart = parseIsoDate(scenario.startDate);
  const from = 24 * Math.max(0, today + days - planStart);
  const cal = compileCalendar(scenario);
  const found: { t: number; op: CrewOperation }[] = [];
  scenario.operations.forEach((op, i) => {
    if (op.kind !== "crew" || !isWeatherGated(op.gates as GateSpec, op.continuous)) return;
    const open = cal.ops[i]!.open;
    const k = firstIntervalAfter(open, from);
    if (k < open.length) found.push({ t: Math.max(open.starts[k], from), op });
  });
  if (found.length === 0) return null;
  found.sort((a, b) => a.t - b.t);
  return {
    operations: found.map(({ t, op }) => {
      const start = formatHours(planStart, t);
      return { operationId: op.id, operation: op.name, start, weekday: WEEKDAYS[weekdayOfDayNumber(parseIsoDate(start.slice(0, 10)))] };
    }),
    planStart: planStart > today ? scenario.startDate : null,
  };
}
