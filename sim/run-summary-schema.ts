/**
 * The run-result contract: what `summarizeRun` (./summary) produces and what a client may send as a run.
 * Strict at every level (an unknown field is refused, not stored), every array and string bounded by what
 * the scenario limits (./limits) allow, so a summary cannot smuggle junk or megabytes into the database.
 * `RunSummary` is inferred from this schema, so the type and the check cannot drift apart.
 * Over JSON an unfinished `finishHours` (Infinity) travels as null and is read back as Infinity.
 */
import { z } from "zod";
import { HORIZON_DAYS } from "./calendar";
import { LIMITS } from "./limits";

/** `YYYY-MM-DD`, `YYYY-MM-DDTHH:mm` or "unfinished" (reached only by iterations that hit the horizon). */
const when = z.string().regex(/^(\d{4}-\d{2}-\d{2}(T\d{2}:\d{2})?|unfinished)$/, "must be a date, a date-time or \"unfinished\"");
const day = z.string().regex(/^\d{4}-\d{2}-\d{2}$/, "must be a date YYYY-MM-DD");
const dayTime = z.string().regex(/^\d{4}-\d{2}-\d{2}T\d{2}:\d{2}$/, "must be a date-time YYYY-MM-DDTHH:mm");
const num = z.number();
const count = z.number().int().min(0);
const text = (max: number) => z.string().max(max);
const list = <T extends z.ZodType>(item: T, max: number) => z.array(item).max(max, `must have at most ${max.toLocaleString("en-US")} items`);
/** Closures of the timeline: the short-term closures and one standing closure per stage. */
const MAX_TIMELINE_CLOSURES = LIMITS.closures + LIMITS.stages;
/** A timeline closure id: a short-term closure's id, or `stage:<stage id>` for a stage's standing closure. */
const closureId = text(6 + 40);
/** A record keyed by timeline closure id, at most one key per closure. */
const perClosure = z.record(closureId, num).refine((r) => Object.keys(r).length <= MAX_TIMELINE_CLOSURES, `must have at most ${MAX_TIMELINE_CLOSURES} closures`);
/** Packet-operations of the largest allowed deck (5,000 packets) times the most operations, in every stage. */
const MAX_TRACE_ITEMS = 5_000 * LIMITS.operations * LIMITS.stages;
const lanes = list(text(LIMITS.laneName), LIMITS.lanes);
const closureKind = z.enum(["short", "standing"]);

const dateQuantilesSchema = z.object({ p10: when, p50: when, p80: when, p90: when }).strict();
const numberQuantilesSchema = z.object({ p50: num.nullable(), p80: num.nullable(), mean: num.nullable() }).strict();

/**
 * Hours since the start in a trace: a packet of an unfinished iteration has no start or finish before the
 * horizon (Infinity), which JSON carries as null; read back as Infinity (the chart leaves such packets out).
 */
const traceHours = z.union([num, z.null().transform(() => Infinity)]);
const tracePacketSchema = z
  .object({ op: text(40), stage: text(40).optional(), packet: count, crew: z.number().int().min(-1), start: traceHours, finish: traceHours, mobilizedFrom: traceHours.optional() })
  .strict();
const pauseRecordSchema = z
  .object({ op: text(40), stage: text(40).optional(), packet: count, crew: z.number().int().min(-1), start: traceHours, end: traceHours, reason: z.enum(["weather", "closed"]) })
  .strict();
const traceSchema = z.object({ packets: list(tracePacketSchema, MAX_TRACE_ITEMS), pauses: list(pauseRecordSchema, MAX_TRACE_ITEMS) }).strict();

/** One period a closure stood (short-term: one window interval a crew used; standing: while its stage was open). */
export const closurePeriodSchema = z
  .object({ closure: closureId, name: text(LIMITS.name), kind: closureKind, lanes, start: dayTime, end: dayTime })
  .strict();

const trafficDaySchema = z
  .object({
    date: day,
    /** Lane-hours closed per closure id that day (the closure timeline). */
    laneClosedHours: perClosure,
    delayVehHours: num,
    /** The longest queue of the day over the directions: vehicles, miles and its direction. */
    peakQueueVeh: num,
    peakQueueMiles: num,
    /** The day's longest delay of the vehicle at the end of a queue, minutes (./queue-limit); absent in runs stored before it was kept. */
    peakDelayMinutes: num.optional(),
    direction: text(40).nullable(),
    /** When the day's longest queue cleared (local date-time), null if no queue or still standing at the horizon. */
    clearsAt: when.nullable(),
  })
  .strict();

const trafficDetailSchema = z
  .object({
    iteration: count,
    delayVehHours: num,
    roadUserCost: num.nullable(),
    contractCost: num.nullable(),
    workingDays: count,
    jamDensityPcPerMiPerLane: num,
    maxQueue: z.object({ miles: num, vehicles: num, date: day }).strict().nullable(),
    /** Days with a lane closed or delay, ascending. */
    days: list(trafficDaySchema, HORIZON_DAYS),
  })
  .strict();

export const runSummarySchema = z
  .object({
    scenarioName: text(LIMITS.name),
    seed: text(60),
    iterations: z.number().int().min(1),
    unfinishedIterations: count,
    startDate: day,
    finish: dateQuantilesSchema,
    finishAt: dateQuantilesSchema,
    operations: list(z.object({ id: text(40), name: text(LIMITS.name), finish: dateQuantilesSchema }).strict(), LIMITS.operations),
    /** Each stage's restoration, in stage order. */
    stages: list(z.object({ id: text(40), name: text(LIMITS.name), lanes, finish: dateQuantilesSchema }).strict(), LIMITS.stages),
    histogram: list(z.object({ from: day, to: day, count }).strict(), 60),
    cdf: list(z.object({ date: dayTime, p: z.number().min(0).max(1) }).strict(), 200),
    target: z.object({ date: day, probability: z.number().min(0).max(1) }).strict().nullable(),
    weatherLostShifts: z.object({ p50: num, p80: num }).strict(),
    discoveredHours: z.object({ p50: num, p80: num }).strict(),
    /** Lane-closed hours of the closure timeline: P50/P80 over iterations; by day for the representative. */
    laneClosedHours: z
      .object({
        total: z.object({ p50: num, p80: num }).strict(),
        byClosure: list(
          z.object({ closure: closureId, name: text(LIMITS.name), kind: closureKind, lanes, p50: num, p80: num }).strict(),
          MAX_TIMELINE_CLOSURES,
        ),
        byDay: list(z.object({ date: day, total: num, byClosure: perClosure }).strict(), HORIZON_DAYS),
      })
      .strict(),
    /** Share of iterations in which a stage's standing closure stood in a winter. */
    winterStandingShare: z.number().min(0).max(1),
    /** |P80(first half) − P80(second half)| in days; null when it cannot be computed. */
    convergenceDays: num.nullable(),
    season1End: z.object({ p50: when }).strict().nullable(),
    /** The iteration whose finish is nearest the P50 (lowest index on ties), re-simulated with its trace. */
    representative: z
      .object({
        iteration: count,
        finish: when,
        finishHours: z.union([num, z.null().transform(() => Infinity)]),
        trace: traceSchema,
        /** Its closure timeline: every period a closure stood, local date-times [start, end), chronological. */
        closureTimeline: list(closurePeriodSchema, 2 * MAX_TRACE_ITEMS),
      })
      .strict(),
    /** Work-zone delay over all directions, veh-h (present with a traffic model). */
    delay: z.object({ vehicleHours: numberQuantilesSchema }).strict().optional(),
    /** $ in the dollars of `valueOfTimeYear` (present with a traffic model or a costs section). */
    cost: z.object({ roadUser: numberQuantilesSchema.nullable(), contract: numberQuantilesSchema.nullable(), valueOfTimeYear: z.number().int() }).strict().optional(),
    /** The representative iteration's traffic, day by day (present with a traffic model). */
    traffic: trafficDetailSchema.optional(),
    /** A re-forecast from the weather forecast: the days that came from it (MODEL.md); absent otherwise. */
    forecastDates: list(day, HORIZON_DAYS).optional(),
  })
  .strict();

export type RunSummary = z.output<typeof runSummarySchema>;
/**
 * The figures of a run summary that comparing scenarios shows: db/queries/compare.ts reads only these of a stored
 * run (not the trace, histogram or per-day closures) and src/lib/compare-contract.ts serves them.
 */
export type CompareFigures = Pick<RunSummary, "startDate" | "unfinishedIterations" | "finish" | "finishAt" | "cdf" | "target" | "weatherLostShifts"> & {
  /** Absent (or null) for runs of plans without a traffic or costs section. */
  delay?: RunSummary["delay"] | null;
  cost?: RunSummary["cost"] | null;
};
export type DateQuantiles = z.output<typeof dateQuantilesSchema>;
/** null = reached only by unfinished iterations. */
export type NumberQuantiles = z.output<typeof numberQuantilesSchema>;
export type TrafficDay = z.output<typeof trafficDaySchema>;
export type TrafficDetail = z.output<typeof trafficDetailSchema>;
export type ClosurePeriodSummary = z.output<typeof closurePeriodSchema>;
export type LaneClosedHours = RunSummary["laneClosedHours"];
export type LaneClosedDay = LaneClosedHours["byDay"][number];
