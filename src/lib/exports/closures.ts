/**
 * The planned lane closures of a scenario: the representative iteration's closure timeline
 * (RunSummary.representative.closureTimeline, MODEL.md "Closures that stand") — each period of a stage's
 * standing closure and of each short-term closure, set-up and take-down included — in time order. That is the
 * plan the public is told about; later iterations may differ. Runs stored before the timeline existed fall back
 * to the trace: for each closure, the union of the time its crews work or mobilize (packet spans minus their
 * pauses), merged where the gap is under half an hour.
 */
import type { RunSummary } from "@sim/index";
import { formatHours, parseIsoDate } from "@sim/dates";

export interface PlannedClosure {
  closureId: string;
  name: string;
  lanes: string[];
  /** "standing": a stage's lanes behind barrier, round the clock; "short": while a crew works. */
  kind: "standing" | "short";
  /** Hours since 00:00 of the scenario's start date, local time. */
  start: number;
  end: number;
}

interface DefinitionLike {
  startDate: string;
  calendar: { closures: { id: string; name: string; lanesClosed: string[] }[] };
  operations: { id: string; kind: string; closure?: string }[];
}

const MERGE_GAP_HOURS = 0.5;

function subtract(span: [number, number], holes: [number, number][]): [number, number][] {
  let parts: [number, number][] = [span];
  for (const [hs, he] of holes) {
    const next: [number, number][] = [];
    for (const [s, e] of parts) {
      if (he <= s || hs >= e) next.push([s, e]);
      else {
        if (hs > s) next.push([s, hs]);
        if (he < e) next.push([he, e]);
      }
    }
    parts = next;
  }
  return parts;
}

/** Local `YYYY-MM-DDTHH:mm` → hours since 00:00 of `day0` (a day number). */
function hoursOf(iso: string, day0: number): number {
  const t = /T(\d{2}):(\d{2})/.exec(iso);
  return (parseIsoDate(iso.slice(0, 10)) - day0) * 24 + (t ? Number(t[1]) + Number(t[2]) / 60 : 0);
}

export function plannedClosures(summary: RunSummary, definition: DefinitionLike): PlannedClosure[] {
  const timeline = summary.representative.closureTimeline;
  if (timeline) {
    const day0 = parseIsoDate(definition.startDate);
    return timeline
      .map((p) => ({ closureId: p.closure, name: p.name, lanes: p.lanes, kind: p.kind, start: hoursOf(p.start, day0), end: hoursOf(p.end, day0) }))
      .filter((c) => c.end > c.start)
      .sort((a, b) => a.start - b.start || a.closureId.localeCompare(b.closureId));
  }
  return crewClosures(summary, definition);
}

/** Runs stored before the closure timeline: closures read off the crews' working time. */
function crewClosures(summary: RunSummary, definition: DefinitionLike): PlannedClosure[] {
  const closureOfOp = new Map(definition.operations.filter((o) => o.kind === "crew" && o.closure).map((o) => [o.id, o.closure!]));
  const pausesBy = new Map<string, [number, number][]>();
  for (const p of summary.representative.trace.pauses) {
    const key = `${p.op}|${p.packet}|${p.crew}`;
    (pausesBy.get(key) ?? pausesBy.set(key, []).get(key)!).push([p.start, p.end]);
  }
  const spans = new Map<string, [number, number][]>();
  for (const t of summary.representative.trace.packets) {
    const closure = closureOfOp.get(t.op);
    if (!closure) continue;
    const from = t.mobilizedFrom ?? t.start;
    if (!(t.finish > from)) continue;
    const list = spans.get(closure) ?? spans.set(closure, []).get(closure)!;
    list.push(...subtract([from, t.finish], pausesBy.get(`${t.op}|${t.packet}|${t.crew}`) ?? []));
  }
  const out: PlannedClosure[] = [];
  for (const c of definition.calendar.closures) {
    const list = (spans.get(c.id) ?? []).sort((a, b) => a[0] - b[0]);
    let cur: [number, number] | null = null;
    for (const [s, e] of list) {
      if (cur && s <= cur[1] + MERGE_GAP_HOURS) cur[1] = Math.max(cur[1], e);
      else {
        if (cur) out.push({ closureId: c.id, name: c.name, lanes: c.lanesClosed, kind: "short", start: cur[0], end: cur[1] });
        cur = [s, e];
      }
    }
    if (cur) out.push({ closureId: c.id, name: c.name, lanes: c.lanesClosed, kind: "short", start: cur[0], end: cur[1] });
  }
  return out.sort((a, b) => a.start - b.start || a.closureId.localeCompare(b.closureId));
}

/** Local wall-clock time → the UTC instant, for a named time zone (DST-correct through Intl). */
export function localToUtc(localIso: string, timeZone: string): Date {
  const [d, t] = localIso.split("T");
  const [y, m, day] = d.split("-").map(Number);
  const [hh, mm] = (t ?? "00:00").split(":").map(Number);
  const asUtc = Date.UTC(y, m - 1, day, hh, mm);
  const offsetAt = (instant: number) => {
    const parts = new Intl.DateTimeFormat("en-US", { timeZone, hourCycle: "h23", year: "numeric", month: "2-digit", day: "2-digit", hour: "2-digit", minute: "2-digit" }).formatToParts(new Date(instant));
    const get = (type: string) => Number(parts.find((p) => p.type === type)!.value);
    return Date.UTC(get("year"), get("month") - 1, get("day"), get("hour"), get("minute")) - instant;
  };
  let guess = asUtc - offsetAt(asUtc);
  guess = asUtc - offsetAt(guess);
  return new Date(guess);
}

export function closureLocalTimes(c: PlannedClosure, startDate: string) {
  const day0 = parseIsoDate(startDate);
  return { start: formatHours(day0, c.start), end: formatHours(day0, c.end) };
}
