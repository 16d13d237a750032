/**
 * Scenario validation. Contract: `parseScenario(input)` returns the parsed scenario (defaults filled in) or
 * EVERY problem found, each with a field path (`operations[2].closure`) and a plain message. Structural
 * problems come from the zod schema; when the structure is sound, the semantic rules follow: unknown or
 * duplicate ids, precedence cycles, lags longer than the deck, cut-off and survey stations off the deck,
 * seasons that make no sense, zero rates, and operations that could never work or never fit a packet —
 * so an impossible scenario is rejected with a reason instead of running to the engine's horizon.
 */
import { openBeforeBlocks, type DayPattern } from "./calendar";
import { daysInMonth, parseIsoDate } from "./dates";
import { distributionBounds } from "./distributions";
import { formatPath, scenarioSchema, type FieldProblem, type Scenario } from "./schema";
import { upgradeScenario } from "./upgrade";
import { stageProblems } from "./validate-stages";

export type ParseResult = { ok: true; scenario: Scenario } | { ok: false; problems: FieldProblem[] };

/** Accepts version 1 and 2 input (version 1 is upgraded first, ./upgrade); always returns version 2. */
export function parseScenario(input: unknown): ParseResult {
  const parsed = scenarioSchema.safeParse(upgradeScenario(input));
  if (!parsed.success) {
    return {
      ok: false,
      problems: parsed.error.issues.map((i) => ({ path: formatPath(i.path), message: i.message })),
    };
  }
  const problems = semanticProblems(parsed.data);
  return problems.length ? { ok: false, problems } : { ok: true, scenario: parsed.data };
}

function duplicates(ids: string[], prefix: string, what: string, out: FieldProblem[]) {
  const seen = new Map<string, number>();
  ids.forEach((id, i) => {
    const j = seen.get(id);
    if (j !== undefined) out.push({ path: `${prefix}[${i}].id`, message: `duplicate ${what} id "${id}" (also ${prefix}[${j}])` });
    else seen.set(id, i);
  });
}

function validMonthDay(md: string): boolean {
  const m = Number(md.slice(0, 2));
  const d = Number(md.slice(3, 5));
  return m >= 1 && m <= 12 && d >= 1 && d <= daysInMonth(2028, m);
}

export function semanticProblems(s: Scenario): FieldProblem[] {
  const out: FieldProblem[] = [];
  const cal = s.calendar;
  duplicates(s.operations.map((o) => o.id), "operations", "operation", out);
  duplicates(cal.shifts.map((o) => o.id), "calendar.shifts", "shift", out);
  duplicates(cal.closures.map((o) => o.id), "calendar.closures", "closure", out);
  const opIds = new Set(s.operations.map((o) => o.id));
  const shiftIds = new Set(cal.shifts.map((o) => o.id));
  const closureIds = new Set(cal.closures.map((o) => o.id));
  let refsOk = true;

  cal.closureWindows.forEach((w, i) => {
    if (!closureIds.has(w.closure)) {
      out.push({ path: `calendar.closureWindows[${i}].closure`, message: `unknown closure "${w.closure}"` });
    }
  });
  s.operations.forEach((op, i) => {
    if (op.kind !== "crew") return;
    op.shifts.forEach((sh, j) => {
      if (!shiftIds.has(sh)) {
        refsOk = false;
        out.push({ path: `operations[${i}].shifts[${j}]`, message: `unknown shift "${sh}"` });
      }
    });
    if (op.closure !== undefined && !closureIds.has(op.closure)) {
      refsOk = false;
      out.push({ path: `operations[${i}].closure`, message: `unknown closure "${op.closure}"` });
    }
    // A lognormal rate is positive by construction (its median is > 0); its lower bound of 0 is never drawn.
    const b = distributionBounds(op.rate.dist);
    if (op.rate.dist.type !== "lognormal" && !(b.min > 0)) {
      const field = op.rate.dist.type === "fixed" ? "value" : "min";
      out.push({ path: `operations[${i}].rate.dist.${field}`, message: "a production rate must be > 0" });
    }
  });

  let linksOk = true;
  s.links.forEach((l, i) => {
    for (const end of ["from", "to"] as const) {
      if (!opIds.has(l[end])) {
        linksOk = false;
        out.push({ path: `links[${i}].${end}`, message: `unknown operation "${l[end]}"` });
      }
    }
    if (l.lagFt > s.deck.lengthFt)
      out.push({ path: `links[${i}].lagFt`, message: `lag of ${l.lagFt} ft is longer than the deck (${s.deck.lengthFt} ft)` });
  });
  if (linksOk) {
    const cycle = findCycle(s);
    if (cycle) out.push({ path: `links[${cycle.link}]`, message: `links form a cycle: ${cycle.ids.join(" → ")}` });
  }

  const deckStart = s.deck.startStationFt;
  const deckEnd = deckStart + s.deck.lengthFt;
  s.deck.survey.forEach((r, i) => {
    if (r.fromStationFt < deckStart || r.fromStationFt > deckEnd)
      out.push({ path: `deck.survey[${i}].fromStationFt`, message: `station ${r.fromStationFt} ft is outside the deck (${deckStart}–${deckEnd} ft)` });
    if (r.toStationFt < deckStart || r.toStationFt > deckEnd)
      out.push({ path: `deck.survey[${i}].toStationFt`, message: `station ${r.toStationFt} ft is outside the deck (${deckStart}–${deckEnd} ft)` });
    if (r.toStationFt <= r.fromStationFt)
      out.push({ path: `deck.survey[${i}].toStationFt`, message: "must be greater than fromStationFt" });
  });

  const season = cal.season;
  const seasonOk = validMonthDay(season.winterStart) && validMonthDay(season.winterEnd);
  if (!validMonthDay(season.winterStart)) out.push({ path: "calendar.season.winterStart", message: "is not a real month-day" });
  if (!validMonthDay(season.winterEnd)) out.push({ path: "calendar.season.winterEnd", message: "is not a real month-day" });
  if (seasonOk && season.winterEnd >= season.winterStart)
    out.push({ path: "calendar.season.winterEnd", message: "must come before winterStart in the year (winter runs into the next year)" });
  if (season.plan === "single") {
    if (season.cutoffDate) out.push({ path: "calendar.season.cutoffDate", message: "only a two-season plan has a cut-off" });
    if (season.cutoffStationFt !== undefined) out.push({ path: "calendar.season.cutoffStationFt", message: "only a two-season plan has a cut-off" });
  }
  if (season.cutoffStationFt !== undefined && (season.cutoffStationFt < deckStart || season.cutoffStationFt > deckEnd))
    out.push({ path: "calendar.season.cutoffStationFt", message: `station ${season.cutoffStationFt} ft is outside the deck (${deckStart}–${deckEnd} ft)` });
  const startDay = parseIsoDate(s.startDate);
  if (season.cutoffDate && seasonOk) {
    const cut = parseIsoDate(season.cutoffDate);
    const y = Number(s.startDate.slice(0, 4));
    let ws = parseIsoDate(`${y}-${season.winterStart}`);
    if (ws < startDay) ws = parseIsoDate(`${y + 1}-${season.winterStart}`);
    if (cut < startDay) out.push({ path: "calendar.season.cutoffDate", message: "must not be before startDate" });
    else if (cut > ws) out.push({ path: "calendar.season.cutoffDate", message: `must not be after the first winter start (${y}-${season.winterStart} or the year after)` });
  }
  if (s.targetDate && parseIsoDate(s.targetDate) < startDay)
    out.push({ path: "targetDate", message: "must not be before startDate" });

  const stages = stageProblems(s);
  out.push(...stages);
  if (refsOk) out.push(...calendarProblems(s));
  return out;
}

function findCycle(s: Scenario): { ids: string[]; link: number } | null {
  const index = new Map(s.operations.map((o, i) => [o.id, i]));
  const outLinks: number[][] = s.operations.map(() => []);
  s.links.forEach((l, k) => outLinks[index.get(l.from)!].push(k));
  const state = new Uint8Array(s.operations.length); // 0 new, 1 on stack, 2 done
  const stack: number[] = [];
  const visit = (v: number): { ids: string[]; link: number } | null => {
    state[v] = 1;
    stack.push(v);
    for (const k of outLinks[v]) {
      const w = index.get(s.links[k].to)!;
      if (state[w] === 1) {
        const from = stack.indexOf(w);
        const ids = stack.slice(from).map((i) => s.operations[i].id);
        return { ids: [...ids, s.operations[w].id], link: k };
      }
      if (state[w] === 0) {
        const c = visit(w);
        if (c) return c;
      }
    }
    stack.pop();
    state[v] = 2;
    return null;
  };
  for (let v = 0; v < s.operations.length; v++) {
    if (state[v] === 0) {
      const c = visit(v);
      if (c) return c;
    }
  }
  return null;
}

/** Operations that can never work, or whose continuous packet can never fit one open interval. */
function calendarProblems(s: Scenario): FieldProblem[] {
  const out: FieldProblem[] = [];
  const cal = s.calendar;
  // Three weeks starting on a Sunday, ordinary day types; and the same weeks with every day a holiday.
  // Blocked intervals only ever remove time, so "never open" here means never open at all.
  const ordinary: DayPattern = { days: 21, workDay: (d) => cal.workDays.includes(d % 7), dayType: (d) => (d % 7 === 6 ? 1 : d % 7 === 0 ? 2 : 0) };
  const holiday: DayPattern = { ...ordinary, dayType: () => 3 };
  s.operations.forEach((op, i) => {
    if (op.kind !== "crew") return;
    const shifts = op.shifts.map((id) => cal.shifts.find((x) => x.id === id)!);
    const closure = op.closure === undefined ? null : cal.closures.find((c) => c.id === op.closure)!;
    const windows = closure ? cal.closureWindows.filter((w) => w.closure === op.closure) : null;
    const a = openBeforeBlocks(ordinary, shifts, windows, closure).open;
    const b = openBeforeBlocks(holiday, shifts, windows, closure).open;
    if (a.length === 0 && b.length === 0) {
      out.push({
        path: `operations[${i}].shifts`,
        message: closure && (closure.setupHours > 0 || closure.takedownHours > 0)
          ? `the shifts of "${op.id}" never overlap the usable part (after ${closure.setupHours} h set-up, before ${closure.takedownHours} h take-down) of a window of closure "${op.closure}" on its work days: it can never work`
          : `the shifts of "${op.id}" never overlap a window of closure "${op.closure}" on its work days: it can never work`,
      });
      return;
    }
    // `rising` is judged from the weather (MODEL.md), not the clock: a warm night can rise, so it limits no hour here.
    if (!op.continuous) return;
    const maxRate = distributionBounds(op.rate.dist).max * (op.rate.unit === "ftPerShift" ? 1 / shifts[0].lengthHours : 1);
    const hours = Math.min(s.deck.packetFt, s.deck.lengthFt) / maxRate;
    const best = Math.max(longestInterval(a), longestInterval(b));
    if (best < hours - 1e-9) {
      out.push({
        path: `operations[${i}]`,
        message: `a packet of "${op.id}" needs ${round(hours)} h in one unbroken open interval even at the fastest rate, but the longest usable interval is ${round(best)} h: the scenario can never finish`,
      });
    }
  });
  return out;
}

const round = (x: number) => Math.round(x * 100) / 100;

/** Longest open interval: a continuous packet starts at its beginning at the earliest. */
function longestInterval(p: number[]): number {
  let best = 0;
  for (let i = 0; i < p.length; i += 2) best = Math.max(best, p[i + 1] - p[i]);
  return best;
}
