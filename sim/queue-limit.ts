/**
 * The queue limit a closure is held to: one contract (zod) for the scenario's `traffic.queueLimit`, the
 * closure-hours advisor (./advisor), the days over the limit in a run's results and the printed brief, the
 * CLI's `queueLimitBreaches` (./queue-breaches) and the public advisory. A traffic engineer states it either as
 * miles of queue or as minutes of delay for the vehicle at the end of the queue (e.g. "1 mile" or "15 minutes
 * of delay"); one unit, one value.
 * Delay of the last vehicle in a D/D/1 queue: it waits until every vehicle ahead has been discharged, so its
 * delay is the queue (veh) divided by the rate the queue is served at (veh/h) — `lastVehicleDelayMinutes`.
 * Pure; no DOM, no Node APIs.
 */
import { z } from "zod";

export const QUEUE_LIMIT_UNITS = ["miles", "minutes"] as const;
export type QueueLimitUnit = (typeof QUEUE_LIMIT_UNITS)[number];

export const queueLimitSchema = z.discriminatedUnion("unit", [
  z.object({
    unit: z.literal("miles"),
    value: z.number("must be a number of miles").min(0.1, "must be at least 0.1 mile").max(100, "must be at most 100 miles"),
  }),
  z.object({
    unit: z.literal("minutes"),
    value: z.number("must be a number of minutes").min(1, "must be at least 1 minute").max(600, "must be at most 600 minutes"),
  }),
]);
export type QueueLimit = z.infer<typeof queueLimitSchema>;

/** Common practice, no published source: many agencies cap a work-zone queue near one mile. */
export const DEFAULT_QUEUE_LIMIT: QueueLimit = { unit: "miles", value: 1 };

/** The limit of a scenario (its traffic section's), or the default when it has none. */
export function queueLimitOf(s: { traffic?: { queueLimit?: QueueLimit } | null } | null | undefined): QueueLimit {
  return s?.traffic?.queueLimit ?? DEFAULT_QUEUE_LIMIT;
}

/** Minutes the vehicle at the end of a D/D/1 queue of `queueVeh` waits when it is served at `dischargeVehPerHour`. */
export function lastVehicleDelayMinutes(queueVeh: number, dischargeVehPerHour: number): number {
  if (queueVeh <= 0) return 0;
  return dischargeVehPerHour > 0 ? (60 * queueVeh) / dischargeVehPerHour : Infinity;
}

/** What a queue is measured by; `minutes` may be unknown (a run stored before delay minutes were kept). */
export interface QueueMeasure {
  miles: number;
  minutes?: number;
}

/**
 * Whether a queue breaks the limit (strictly over it; a hair of rounding is forgiven so a queue worked out to
 * exactly the limit is within it). Null when the limit is in minutes and the minutes are unknown.
 */
export function breaksLimit(limit: QueueLimit, q: QueueMeasure): boolean | null {
  const x = limit.unit === "miles" ? q.miles : q.minutes;
  if (x === undefined) return null;
  return x > limit.value + 1e-9;
}

/** "1 mile", "2.5 miles", "15 minutes of delay". */
export function describeQueueLimit(l: QueueLimit): string {
  const n = l.value.toLocaleString("en-US", { maximumFractionDigits: 2 });
  if (l.unit === "miles") return `${n} mile${l.value === 1 ? "" : "s"} of queue`;
  return `${n} minute${l.value === 1 ? "" : "s"} of delay`;
}

/** Short form for headings and tables: "1 mi", "15 min". */
export function shortQueueLimit(l: QueueLimit): string {
  return `${l.value.toLocaleString("en-US", { maximumFractionDigits: 2 })} ${l.unit === "miles" ? "mi" : "min"}`;
}

/**
 * The days of a run's traffic detail whose longest queue broke the limit, in date order. Null when the limit is
 * in minutes and the run kept no delay minutes per day (computed before they were kept: run it again).
 */
export function daysOverLimit<D extends { peakQueueMiles: number; peakDelayMinutes?: number }>(days: readonly D[], limit: QueueLimit): D[] | null {
  const out: D[] = [];
  for (const d of days) {
    const b = breaksLimit(limit, { miles: d.peakQueueMiles, minutes: d.peakDelayMinutes });
    if (b === null) return null;
    if (b) out.push(d);
  }
  return out;
}
