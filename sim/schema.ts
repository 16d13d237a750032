/**
 * The scenario format: one zod schema used by the CLI, the API, the forms and the worker.
 * Structural rules live here (types, ranges, `max ≥ mode`); rules that need the whole scenario
 * (cycles, unknown references, windows that never open) live in `./validate`.
 * Units: feet, hours (0–24 local clock), °F, mph, lb/ft²/h; dates are local `YYYY-MM-DD`.
 */
import { z } from "zod";

const isoDate = z.string().regex(/^\d{4}-\d{2}-\d{2}$/, "must be a date YYYY-MM-DD");
const monthDay = z.string().regex(/^\d{2}-\d{2}$/, "must be a month-day MM-DD");
const id = z
  .string()
  .min(1, "must not be empty")
  .max(40)
  .regex(/^[a-z0-9][a-z0-9-]*$/, "must be lower-case letters, digits and dashes");
const hourOfDay = z.number().min(0, "must be ≥ 0").max(24, "must be ≤ 24");
const nonNeg = z.number().min(0, "must be ≥ 0");
const positive = z.number().gt(0, "must be > 0");

/** A distribution of a positive quantity. `max ≥ mode ≥ min` is checked with the field's own path. */
export const distributionSchema = z
  .discriminatedUnion("type", [
    z.object({ type: z.literal("fixed"), value: nonNeg }),
    z.object({ type: z.literal("triangular"), min: nonNeg, mode: nonNeg, max: nonNeg }),
    z.object({ type: z.literal("pert"), min: nonNeg, mode: nonNeg, max: nonNeg }),
    z.object({ type: z.literal("lognormal"), median: positive, sigma: z.number().min(0).max(3) }),
  ])
  .superRefine((d, ctx) => {
    if (d.type === "triangular" || d.type === "pert") {
      if (d.mode < d.min) ctx.addIssue({ code: "custom", path: ["mode"], message: "must be ≥ min" });
      if (d.max < d.mode) ctx.addIssue({ code: "custom", path: ["max"], message: "must be ≥ mode" });
      if (d.max <= 0) ctx.addIssue({ code: "custom", path: ["max"], message: "must be > 0" });
    }
  });
export type Distribution = z.infer<typeof distributionSchema>;

export const dayTypeSchema = z.enum(["weekday", "saturday", "sunday", "holiday"]);
export type DayType = z.infer<typeof dayTypeSchema>;

export const shiftSchema = z.object({
  id,
  name: z.string().min(1).max(60),
  startHour: hourOfDay,
  lengthHours: z.number().gt(0, "must be > 0").max(24, "a shift cannot be longer than 24 h"),
});

export const closureSchema = z.object({
  id,
  name: z.string().min(1).max(80),
  lanesClosed: z.array(z.string().min(1)).min(1, "must close at least one lane"),
});

export const closureWindowSchema = z.object({
  closure: id,
  dayTypes: z.array(dayTypeSchema).min(1, "must list at least one day type"),
  startHour: hourOfDay,
  /** `endHour ≤ startHour` runs overnight into the next day. */
  endHour: hourOfDay,
});

export const gatesSchema = z
  .object({
    minTempF: z.number().min(-40).max(120).optional(),
    rising: z.boolean().optional(),
    noRain: z.boolean().optional(),
    noRainHoursAfter: nonNeg.max(72).optional(),
    maxWindMph: positive.optional(),
    /** Surface evaporation limit, lb/ft²/h (ACI 305R: 0.2; LMC practice 0.1). */
    maxEvaporation: positive.optional(),
    /** Concrete temperature above air temperature for the evaporation estimate, °F. */
    concreteDeltaF: z.number().min(-20).max(40).optional(),
  })
  .default({});
export type Gates = z.infer<typeof gatesSchema>;

const crewOperationSchema = z.object({
  id,
  name: z.string().min(1).max(60),
  kind: z.literal("crew"),
  rate: z.object({ unit: z.enum(["ftPerHour", "ftPerShift"]), dist: distributionSchema }),
  crews: z.number().int("must be a whole number").min(1, "must be ≥ 1").max(10),
  shifts: z.array(id).min(1, "must list at least one shift"),
  closure: id,
  mobilizationHours: nonNeg.max(240).default(0),
  continuous: z.boolean().default(false),
  discovers: z.boolean().default(false),
  gates: gatesSchema,
});

const waitOperationSchema = z.object({
  id,
  name: z.string().min(1).max(60),
  kind: z.literal("wait"),
  durationHours: distributionSchema,
});

export const operationSchema = z.discriminatedUnion("kind", [crewOperationSchema, waitOperationSchema]);
export type Operation = z.infer<typeof operationSchema>;
export type CrewOperation = z.infer<typeof crewOperationSchema>;
export type WaitOperation = z.infer<typeof waitOperationSchema>;

export const linkSchema = z.object({
  from: id,
  to: id,
  lagFt: nonNeg.default(0),
  lagHours: nonNeg.default(0),
});
export type Link = z.infer<typeof linkSchema>;

export const monthClimateSchema = z
  .object({
    tmaxMeanF: z.number().min(-60).max(130),
    tmaxSdF: nonNeg.max(40),
    tminMeanF: z.number().min(-60).max(130),
    tminSdF: nonNeg.max(40),
    pWetAfterDry: z.number().min(0).max(1),
    pWetAfterWet: z.number().min(0).max(1),
    windMeanMph: nonNeg.max(80),
    rhMean: z.number().min(0).max(100),
  })
  .superRefine((m, ctx) => {
    if (m.tminMeanF > m.tmaxMeanF)
      ctx.addIssue({ code: "custom", path: ["tminMeanF"], message: "must be ≤ tmaxMeanF" });
  });
export type MonthClimate = z.infer<typeof monthClimateSchema>;

export const weatherSchema = z.object({
  mode: z.enum(["stochastic", "fixed"]),
  /** January first. */
  monthly: z.array(monthClimateSchema).length(12, "must have 12 months, January first"),
  wetTmaxShiftF: z.number().min(-30).max(10).default(-4),
  wetTminShiftF: z.number().min(-30).max(30).default(1),
  serialCorrelation: z.number().min(0).max(0.95).default(0.6),
  rainHoursMean: z.number().min(1).max(24).default(6),
  /** Deterministic wet dates (rain all day), for tests and what-ifs in fixed mode. */
  fixedWetDates: z.array(isoDate).default([]),
});
export type Weather = z.infer<typeof weatherSchema>;

export const surveyRangeSchema = z.object({
  fromStationFt: nonNeg,
  toStationFt: nonNeg,
  probability: z.number().min(0).max(1),
});

export const scenarioSchema = z.object({
  schemaVersion: z.literal(1),
  name: z.string().min(1, "must not be empty").max(120),
  description: z.string().max(2000).default(""),
  startDate: isoDate,
  targetDate: isoDate.optional(),
  timeZone: z.string().min(1).default("America/Chicago"),
  deck: z.object({
    startStationFt: nonNeg,
    lengthFt: z.number().gt(0, "must be > 0").max(50_000),
    packetFt: z.number().min(10, "must be ≥ 10").max(1_000).default(100),
    lanes: z.array(z.string().min(1)).min(1, "must name at least one lane"),
    survey: z.array(surveyRangeSchema).default([]),
  }),
  discovered: z
    .object({ defaultProbability: z.number().min(0).max(1), extraHours: distributionSchema })
    .default({ defaultProbability: 0, extraHours: { type: "fixed", value: 0 } }),
  calendar: z.object({
    shifts: z.array(shiftSchema).min(1, "must define at least one shift"),
    workDays: z.array(z.number().int().min(0).max(6)).min(1, "must list at least one work day"),
    closures: z.array(closureSchema).min(1, "must define at least one closure"),
    closureWindows: z.array(closureWindowSchema),
    holidays: z.object({
      policy: z.enum(["standDown", "workThrough"]),
      observeFederal: z.boolean().default(true),
      blackoutDates: z.array(isoDate).default([]),
    }),
    season: z.object({
      plan: z.enum(["single", "two"]),
      winterStart: monthDay,
      winterEnd: monthDay,
      demobilizeHours: nonNeg.max(240).default(0),
      remobilizeHours: nonNeg.max(240).default(0),
      cutoffDate: isoDate.optional(),
      cutoffStationFt: nonNeg.optional(),
    }),
  }),
  operations: z.array(operationSchema).min(1, "must have at least one operation").max(30),
  links: z.array(linkSchema),
  weather: weatherSchema,
});

/** A scenario as written by a person (defaults may be left out). */
export type ScenarioInput = z.input<typeof scenarioSchema>;
/** A scenario after parsing (defaults filled in): what the engine consumes. */
export type Scenario = z.output<typeof scenarioSchema>;

export interface FieldProblem {
  /** e.g. `operations[3].rate.dist.max` */
  path: string;
  message: string;
}

export function formatPath(path: ReadonlyArray<PropertyKey>): string {
  let out = "";
  for (const part of path) {
    if (typeof part === "number") out += `[${part}]`;
    else out += out ? `.${String(part)}` : String(part);
  }
  return out || "(root)";
}
