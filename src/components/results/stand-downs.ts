/**
 * Where no crew works for calendar reasons, as shaded bands. Contract: from a compiled calendar
 * (sim/calendar `compileCalendar`, or `compileStandDowns` — the same blocks without the operations), winter bands are each winter's `[start − demobilizeHours, end)` (the
 * first winter's start is the two-season cut-off when one is set) and holiday bands are the remaining
 * blocked intervals (holiday stand-down blocks). Hours since 00:00 of the start date, clipped to [from, to].
 */
import type { CompiledCalendar } from "@sim/calendar";

export interface StandDown {
  kind: "winter" | "holiday";
  /** Hours since 00:00 of the start date. */
  start: number;
  end: number;
}

type Span = [number, number];

function subtract(spans: Span[], cut: Span[]): Span[] {
  let out = spans;
  for (const [c0, c1] of cut) {
    const next: Span[] = [];
    for (const [a, b] of out) {
      if (c1 <= a || c0 >= b) next.push([a, b]);
      else {
        if (c0 > a) next.push([a, c0]);
        if (c1 < b) next.push([c1, b]);
      }
    }
    out = next;
  }
  return out;
}

export function standDowns(
  cal: Pick<CompiledCalendar, "blocked" | "winterStarts" | "winterEnds">,
  demobilizeHours: number,
  from: number,
  to: number,
): StandDown[] {
  const winters: Span[] = [];
  for (let i = 0; i < cal.winterStarts.length; i++) winters.push([cal.winterStarts[i] - demobilizeHours, cal.winterEnds[i]]);
  const blocked: Span[] = [];
  for (let i = 0; i < cal.blocked.length; i++) blocked.push([cal.blocked.starts[i], cal.blocked.ends[i]]);
  const clip = (kind: StandDown["kind"]) => ([a, b]: Span): StandDown | null => {
    const s = Math.max(a, from);
    const e = Math.min(b, to);
    return e > s ? { kind, start: s, end: e } : null;
  };
  const out = [...winters.map(clip("winter")), ...subtract(blocked, winters).map(clip("holiday"))].filter((x): x is StandDown => x !== null);
  return out.sort((p, q) => p.start - q.start);
}
