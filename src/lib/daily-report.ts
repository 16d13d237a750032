/**
 * One day of the field log, as the daily report shows it: the shifts worked that day, the days before and after it
 * that have shifts (to step through the log), and the day in sum. Pure.
 */
import { isRealIsoDate } from "@sim/text";

export interface DayShift {
  workDate: string;
  operationId: string;
  fromStationFt: number;
  toStationFt: number;
  tempF: number | null;
  rain: boolean;
  lostHours: number;
  discovered: ReadonlyArray<{ areaSqFt: number }>;
}

/** A real calendar date written YYYY-MM-DD, or null ("2026-02-30" and "yesterday" are not). */
export function readDay(raw: string | undefined): string | null {
  return raw !== undefined && isRealIsoDate(raw) ? raw : null;
}

/** The nearest days before and after `day` that have a shift in the log (null at either end). */
export function neighbourDays(entries: ReadonlyArray<{ workDate: string }>, day: string): { before: string | null; after: string | null } {
  let before: string | null = null;
  let after: string | null = null;
  for (const e of entries) {
    if (e.workDate < day && (before === null || e.workDate > before)) before = e.workDate;
    if (e.workDate > day && (after === null || e.workDate < after)) after = e.workDate;
  }
  return { before, after };
}

export interface DaySum {
  shifts: number;
  /** Feet recorded per operation id that day (overlaps within the day counted once per shift: as recorded). */
  feetByOperation: Map<string, number>;
  lostHours: number;
  rainShifts: number;
  lowF: number | null;
  highF: number | null;
  conditions: number;
  conditionAreaSqFt: number;
}

export function daySum(shifts: ReadonlyArray<DayShift>): DaySum {
  const feetByOperation = new Map<string, number>();
  let lowF: number | null = null;
  let highF: number | null = null;
  for (const s of shifts) {
    feetByOperation.set(s.operationId, (feetByOperation.get(s.operationId) ?? 0) + (s.toStationFt - s.fromStationFt));
    if (s.tempF !== null) {
      lowF = lowF === null ? s.tempF : Math.min(lowF, s.tempF);
      highF = highF === null ? s.tempF : Math.max(highF, s.tempF);
    }
  }
  return {
    shifts: shifts.length,
    feetByOperation,
    lostHours: shifts.reduce((a, s) => a + s.lostHours, 0),
    rainShifts: shifts.filter((s) => s.rain).length,
    lowF,
    highF,
    conditions: shifts.reduce((a, s) => a + s.discovered.length, 0),
    conditionAreaSqFt: shifts.reduce((a, s) => a + s.discovered.reduce((b, d) => b + d.areaSqFt, 0), 0),
  };
}
