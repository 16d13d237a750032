/**
 * The representative iteration's trace as time–distance lines. Contract: a packet is worked from
 * (start, station of its start) to (finish, station of its end); pauses recorded for that packet inside
 * [start, finish] (weather waits, calendar gaps: nights, holiday stand-downs, winter) cut it into pieces and
 * the station advances in proportion to worked time, so every pause is a gap in the line. Pieces that touch
 * (same time, same station — a crew moving straight on to the next packet) are joined. Points are day numbers
 * (x) and feet (y); a `y: null` point ends a piece, which a line chart draws as a break.
 * Times stored as JSON may be null where the engine had Infinity (unfinished): those packets are counted,
 * not drawn.
 */
import type { PauseRecord, Trace, TracePacket } from "@sim/engine";

export interface DeckGeometry {
  startStationFt: number;
  lengthFt: number;
  packetFt: number;
}

export interface SeriesPoint {
  x: number;
  y: number | null;
}

export interface OperationSeries {
  id: string;
  name: string;
  points: SeriesPoint[];
  /** Pieces drawn (a piece is one unbroken run of the line). */
  pieces: number;
  firstStart: number | null;
  lastFinish: number | null;
  /** Hours inside packets spent paused, by reason. */
  pausedHours: { weather: number; closed: number };
  unfinishedPackets: number;
}

const EPS = 1e-6;

type Piece = { x0: number; y0: number; x1: number; y1: number };

const finite = (v: number | null | undefined): v is number => typeof v === "number" && Number.isFinite(v);

/** Station range of packet `i`, in feet. */
export function packetStations(deck: DeckGeometry, i: number): [number, number] {
  const a = i * deck.packetFt;
  const b = Math.min((i + 1) * deck.packetFt, deck.lengthFt);
  return [deck.startStationFt + a, deck.startStationFt + Math.max(a, b)];
}

/**
 * Pause intervals clipped to [start, finish] (a null end — Infinity — reaches the finish): hours by reason
 * (the engine records them without overlap) and the sorted, merged gaps.
 */
function clippedPauses(pauses: PauseRecord[], start: number, finish: number): { paused: { weather: number; closed: number }; gaps: { a: number; b: number }[] } {
  const out = pauses
    .map((p) => ({ a: Math.max(start, finite(p.start) ? p.start : start), b: Math.min(finish, finite(p.end) ? p.end : finish), reason: p.reason }))
    .filter((p) => p.b - p.a > EPS)
    .sort((p, q) => p.a - q.a);
  const paused = { weather: 0, closed: 0 };
  for (const p of out) paused[p.reason] += p.b - p.a;
  const gaps: { a: number; b: number }[] = [];
  for (const p of out) {
    const last = gaps[gaps.length - 1];
    if (last && p.a <= last.b + EPS) {
      if (p.b > last.b) last.b = p.b;
    } else gaps.push({ a: p.a, b: p.b });
  }
  return { paused, gaps };
}

/** The pieces of one packet (hours since start; stations in feet). */
export function packetPieces(packet: TracePacket, pauses: PauseRecord[], stations: [number, number]): { pieces: Piece[]; paused: { weather: number; closed: number } } {
  const { start, finish } = packet;
  const [y0, y1] = stations;
  const { paused, gaps: cut } = clippedPauses(pauses, start, finish);
  const work: [number, number][] = [];
  let t = start;
  for (const p of cut) {
    if (p.a > t + EPS) work.push([t, p.a]);
    t = Math.max(t, p.b);
  }
  if (finish > t + EPS || work.length === 0) work.push([t, finish]);
  const total = work.reduce((s, [a, b]) => s + (b - a), 0);
  const pieces: Piece[] = [];
  let done = 0;
  for (const [a, b] of work) {
    const from = total > 0 ? y0 + ((y1 - y0) * done) / total : y0;
    done += b - a;
    const to = total > 0 ? y0 + ((y1 - y0) * done) / total : y1;
    pieces.push({ x0: a, y0: from, x1: b, y1: to });
  }
  return { pieces, paused };
}

/**
 * One series per operation (in `operations` order; trace ops not listed are appended with their id as name).
 * `toX` maps engine hours to the chart's x (day numbers).
 */
export function timeDistanceSeries(
  trace: Trace,
  deck: DeckGeometry,
  operations: { id: string; name: string }[],
  toX: (hours: number) => number,
): OperationSeries[] {
  const pausesOf = new Map<string, PauseRecord[]>();
  for (const p of trace.pauses) {
    const key = `${p.op}\u0000${p.packet}`;
    const list = pausesOf.get(key);
    if (list) list.push(p);
    else pausesOf.set(key, [p]);
  }
  const byOp = new Map<string, TracePacket[]>();
  for (const p of trace.packets) {
    const list = byOp.get(p.op);
    if (list) list.push(p);
    else byOp.set(p.op, [p]);
  }
  const order = [...operations];
  for (const id of byOp.keys()) if (!order.some((o) => o.id === id)) order.push({ id, name: id });

  return order.map((op) => {
    const packets = byOp.get(op.id) ?? [];
    let unfinishedPackets = 0;
    const pausedHours = { weather: 0, closed: 0 };
    // Per crew in time order, so a crew's consecutive packets can join into one piece.
    const drawable = packets
      .filter((p) => {
        const ok = finite(p.start) && finite(p.finish);
        if (!ok) unfinishedPackets++;
        return ok;
      })
      .sort((p, q) => p.crew - q.crew || p.start - q.start || p.packet - q.packet);
    // A run is one unbroken stretch of line: a piece that starts where the last run ends extends it.
    const runs: { x: number; y: number }[][] = [];
    for (const p of drawable) {
      const r = packetPieces(p, pausesOf.get(`${p.op}\u0000${p.packet}`) ?? [], packetStations(deck, p.packet));
      pausedHours.weather += r.paused.weather;
      pausedHours.closed += r.paused.closed;
      for (const piece of r.pieces) {
        const run = runs[runs.length - 1];
        const end = run?.[run.length - 1];
        if (end && Math.abs(end.x - piece.x0) < EPS && Math.abs(end.y - piece.y0) < EPS) run.push({ x: piece.x1, y: piece.y1 });
        else runs.push([{ x: piece.x0, y: piece.y0 }, { x: piece.x1, y: piece.y1 }]);
      }
    }
    const points: SeriesPoint[] = [];
    for (const run of runs) {
      if (points.length) points.push({ x: points[points.length - 1].x, y: null });
      for (const pt of run) points.push({ x: toX(pt.x), y: pt.y });
    }
    const starts = drawable.map((p) => p.start);
    const finishes = drawable.map((p) => p.finish);
    return {
      id: op.id,
      name: op.name,
      points,
      pieces: runs.length,
      firstStart: starts.length ? toX(Math.min(...starts)) : null,
      lastFinish: finishes.length ? toX(Math.max(...finishes)) : null,
      pausedHours,
      unfinishedPackets,
    };
  });
}
