/**
 * Where a new field-log entry starts: the operation recorded last, on one of its own shifts, from where its
 * last recorded shift ended. Why: the blank form used to open on the first operation, the calendar's first
 * shift and the deck's first 100 ft, whatever had been recorded — an inspector logging the night's
 * hydrodemolition at STA 43+66 had to change three fields, and a wrong default shift passes unnoticed.
 */

export interface OperationFacts {
  id: string;
  name: string;
  /** The shifts the operation works (the plan's `shifts` of the operation, in its order). */
  shifts: string[];
  /** The to-station of the operation's last recorded shift, ft; null when none is recorded. */
  lastToFt: number | null;
}

export interface RecordedShift {
  operationId: string;
  workDate: string;
  shift: string;
  toStationFt: number;
}

/** A new shift of `op`: its own shift (the current one if it is one of them), from where it stopped, 100 ft on. */
export function continuationOf(op: OperationFacts, deck: { from: number; to: number }, calendarShifts: string[], currentShift?: string): { shift: string; fromStationFt: number; toStationFt: number } {
  const shift = currentShift !== undefined && op.shifts.includes(currentShift) ? currentShift : (op.shifts[0] ?? calendarShifts[0] ?? "");
  // At the deck's end (the operation finished a pass, or a stage), the next shift starts a pass again.
  const from = op.lastToFt !== null && op.lastToFt < deck.to ? op.lastToFt : deck.from;
  return { shift, fromStationFt: from, toStationFt: Math.min(deck.to, from + 100) };
}

/**
 * Per operation, the to-station of its latest shift (by work date, then the shift's start hour; the farther
 * to-station on a tie), and the operation of the latest shift overall (null without entries).
 */
export function lastRecorded(entries: readonly RecordedShift[], shiftStartHour: (shift: string) => number): { lastToFt: Map<string, number>; lastOperationId: string | null } {
  type At = { date: string; hour: number };
  const later = (a: At, b: At) => a.date > b.date || (a.date === b.date && a.hour > b.hour);
  const latest = new Map<string, At & { to: number }>();
  let overall: (At & { op: string }) | null = null;
  for (const e of entries) {
    const at = { date: e.workDate, hour: shiftStartHour(e.shift) };
    const seen = latest.get(e.operationId);
    if (!seen || later(at, seen) || (!later(seen, at) && e.toStationFt > seen.to)) latest.set(e.operationId, { ...at, to: e.toStationFt });
    if (!overall || later(at, overall)) overall = { ...at, op: e.operationId };
  }
  return { lastToFt: new Map([...latest].map(([op, v]) => [op, v.to])), lastOperationId: overall?.op ?? null };
}
