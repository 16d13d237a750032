/**
 * The scenario format: one zod schema used by the CLI, the API, the forms and the worker.
 * Structural rules live here (types, ranges, `max ≥ mode`); rules that need the whole scenario
 * (cycles, unknown references, windows that never open) live in `./validate`.
 * Units: feet, hours (0–24 local clock), °F, mph, lb/ft²/h; dates are local `YYYY-MM-DD`.
 */
import { z } from "zod";
import { LIMITS } from "./limits";
import { DEFAULT_QUEUE_LIMIT, queueLimitSchema } from "./queue-limit";
import { isKnownTimeZone, plainText, realIsoDate } from "./text";

const isoDate = realIsoDate();
const monthDay = z.string().max(5, { abort: true, error: "must be a month-day MM-DD" }).regex(/^\d{2}-\d{2}$/, "must be a month-day MM-DD");
const count = (n: number) => n.toLocaleString("en-US");
/** An array of at most `max` items; the message says how many were sent. */
const upTo = <T extends z.ZodType>(item: T, max: number, what: string) =>
  z.array(item).max(max, { error: (iss) => `at most ${count(max)} ${what} (got ${count((iss.input as unknown[]).length)})` });
/** A one-line name: not empty, no control characters. */
const name = (max: number = LIMITS.name) => plainText(max).min(1, "must not be empty");
const laneName = name(LIMITS.laneName);
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
  name: name(),
  startHour: hourOfDay,
  lengthHours: z.number().gt(0, "must be > 0").max(24, "a shift cannot be longer than 24 h"),
});

/**
 * A short-term closure (MODEL.md, "Closures that stand"): set up at the start of each window interval a crew
 * uses, taken down at its end. Work cannot start before it is set up and must stop in time to take it down.
 */
export const closureSchema = z.object({
  id,
  name: name(),
  lanesClosed: upTo(laneName, LIMITS.lanes, "lanes").min(1, "must close at least one lane"),
  /** Hours to set the closure up (signs, cones, crossover gates) before work can start; lanes count as closed. */
  setupHours: nonNeg.max(12, "must be ≤ 12 h").default(0),
  /** Hours to take it down after work stops; lanes count as closed. */
  takedownHours: nonNeg.max(12, "must be ≤ 12 h").default(0),
});

export const closureWindowSchema = z.object({
  closure: id,
  dayTypes: upTo(dayTypeSchema, 4, "day types").min(1, "must list at least one day type"),
  startHour: hourOfDay,
  /** `endHour ≤ startHour` runs overnight into the next day. */
  endHour: hourOfDay,
});

const airTempF = z.number().min(-40, "must be ≥ −40 °F").max(140, "must be ≤ 140 °F");

export const gatesSchema = z
  .object({
    minTempF: airTempF.optional(),
    /** Maximum air temperature, °F (hot-weather limit). */
    maxTempF: airTempF.optional(),
    /** Not falling: T(k+1) ≥ T(k), judged from the hourly temperature (MODEL.md, "Weather"). */
    rising: z.boolean().optional(),
    noRain: z.boolean().optional(),
    noRainHoursAfter: nonNeg.max(72).optional(),
    maxWindMph: positive.optional(),
    /** Surface evaporation limit, lb/ft²/h (ACI 305R: 0.2; LMC practice 0.1). */
    maxEvaporation: positive.optional(),
    /** Concrete temperature above air temperature for the evaporation estimate, °F. */
    concreteDeltaF: z.number().min(-20).max(40).optional(),
    /**
     * Continuous operations: after a packet's finish the air stays at or above `minTempF` for `hours`
     * (no pour into a hard-freeze night). Both or neither: a half-filled pair is refused, an empty one is none.
     */
    protectAfter: z
      .object({ minTempF: airTempF.optional(), hours: nonNeg.max(72, "must be ≤ 72 h").optional() })
      .superRefine((p, ctx) => {
        if (p.minTempF !== undefined && p.hours === undefined)
          ctx.addIssue({ code: "custom", path: ["hours"], message: "set how many hours the protection lasts (or clear its temperature)" });
        if (p.hours !== undefined && p.minTempF === undefined)
          ctx.addIssue({ code: "custom", path: ["minTempF"], message: "set the temperature to protect above (or clear its hours)" });
      })
      // An empty pair (a form with both fields blank) is no protection, and parses to none.
      .transform((p) => (p.minTempF === undefined && p.hours === undefined ? undefined : p))
      .optional(),
  })
  .superRefine((g, ctx) => {
    if (g.minTempF !== undefined && g.maxTempF !== undefined && g.maxTempF < g.minTempF)
      ctx.addIssue({ code: "custom", path: ["maxTempF"], message: "must be ≥ the minimum temperature" });
  })
  .default({});
export type Gates = z.infer<typeof gatesSchema>;

const crewOperationSchema = z.object({
  id,
  name: name(),
  kind: z.literal("crew"),
  rate: z.object({ unit: z.enum(["ftPerHour", "ftPerShift"]), dist: distributionSchema }),
  crews: z.number().int("must be a whole number").min(1, "must be ≥ 1").max(10),
  shifts: upTo(id, LIMITS.calendarItems, "shifts").min(1, "must list at least one shift"),
  /** The short-term closure the crew needs on top of its stage's standing closure; absent = the standing closure alone. */
  closure: id.optional(),
  mobilizationHours: nonNeg.max(240).default(0),
  continuous: z.boolean().default(false),
  discovers: z.boolean().default(false),
  gates: gatesSchema,
});

const waitOperationSchema = z.object({
  id,
  name: name(),
  kind: z.literal("wait"),
  durationHours: distributionSchema,
  /** Count only hours with the air at or above this temperature, °F (cure counted in warm hours). */
  countAboveF: airTempF.optional(),
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

/** How a stage follows an earlier one (MODEL.md, "Stages"). */
export const stageAfterSchema = z.object({
  /** An earlier stage's id. */
  stage: id,
  /** `stageDone`: wait for the whole earlier stage; `restoredAhead`: follow its restored front, like a link. */
  when: z.enum(["stageDone", "restoredAhead"]).default("stageDone"),
  lagFt: nonNeg.default(0),
  lagHours: nonNeg.default(0),
});
export type StageAfter = z.infer<typeof stageAfterSchema>;

/**
 * A stage: the deck lanes it rehabilitates over a station range, the lanes behind barrier while it is open
 * (default: its own lanes; [] = no standing closure) and the operations that run in it (default: all).
 */
export const stageSchema = z
  .object({
    id,
    name: name(),
    lanes: upTo(laneName, LIMITS.lanes, "lanes").min(1, "must rehabilitate at least one lane"),
    /** Absolute stations, [from, to); default the whole deck. */
    fromStationFt: nonNeg.optional(),
    toStationFt: nonNeg.optional(),
    standingLanesClosed: upTo(laneName, LIMITS.lanes, "lanes").optional(),
    operations: upTo(id, LIMITS.operations, "operations").min(1, "must list at least one operation").optional(),
    /** Absent: after the previous stage when it is done (the first stage has none). */
    after: stageAfterSchema.optional(),
    /** Override: veh/h for each direction the standing closure narrows (e.g. traffic shifted to a crossover). */
    capacityVehPerHour: z.number().gt(0, "must be > 0").max(20_000).optional(),
  })
  .transform((st) => ({ ...st, standingLanesClosed: st.standingLanesClosed ?? st.lanes }));
export type Stage = z.output<typeof stageSchema>;

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
  fixedWetDates: upTo(isoDate, LIMITS.dates, "dates").default([]),
});
export type Weather = z.infer<typeof weatherSchema>;

export const surveyRangeSchema = z.object({
  fromStationFt: nonNeg,
  toStationFt: nonNeg,
  probability: z.number().min(0).max(1),
});

/** 24 hourly volumes, veh/h, 00:00–01:00 first. */
const hourlyVolumes = z.array(z.number().min(0, "must be ≥ 0").max(20_000, "must be ≤ 20,000 veh/h")).length(24, "must have 24 hourly volumes, 00:00 first");

/** Traffic of one direction over the deck (./traffic). Day types of demand differ from closure day types. */
export const trafficDirectionSchema = z.object({
  id,
  name: name(),
  /** Deck lanes this direction uses (names from deck.lanes); the queue stores in all of them. */
  lanes: upTo(laneName, LIMITS.lanes, "lanes").min(1, "must use at least one lane"),
  /** Share of heavy vehicles (trucks, buses) in the volumes, 0–1. */
  heavyVehicleShare: z.number().min(0).max(1).default(0.1),
  /** veh/h by hour. `friday` is Friday; `holidayPeak` the days around each federal holiday (MODEL.md, "Traffic"). */
  demand: z.object({
    weekday: hourlyVolumes,
    friday: hourlyVolumes,
    saturday: hourlyVolumes,
    sunday: hourlyVolumes,
    holidayPeak: hourlyVolumes,
  }),
});
export type TrafficDirection = z.infer<typeof trafficDirectionSchema>;

/** How one closure narrows the road: inputs of the capacity method, or a user override. */
export const trafficClosureSchema = z.object({
  closure: id,
  /** Krammes–Lopez work-intensity adjustment I, pc/h/ln (−160 heavy work … +160 light). */
  workIntensityPcPerHourPerLane: z.number().min(-160).max(160).default(0),
  /** HCM 6th ed. factors: barrier type (f_Br = 1 for cones/drums) and night work (f_DN). */
  barrier: z.enum(["cones", "concrete"]).default("cones"),
  night: z.boolean().default(false),
  /** Override: veh/h through the closure for each direction it narrows (e.g. two-way operation on a parallel span). */
  capacityVehPerHour: z.number().gt(0, "must be > 0").max(20_000).optional(),
});
export type TrafficClosure = z.infer<typeof trafficClosureSchema>;

export const trafficSchema = z.object({
  /** Work-zone capacity method: Krammes & Lopez (1994) short-term, or HCM 6th ed. queue discharge rate. */
  method: z.enum(["krammesLopez", "hcm6"]).default("krammesLopez"),
  basePcPerHourPerLane: z.number().min(500).max(2_500).default(1_600),
  /** Passenger-car equivalent of a heavy vehicle, E_T. */
  truckPce: z.number().min(1).max(6).default(1.5),
  areaType: z.enum(["urban", "rural"]).default("urban"),
  lateralClearanceFt: z.number().min(0).max(12).default(6),
  /** Rate at which a queue discharges once every lane is open again, pc/h/ln. */
  openRoadPcPerHourPerLane: z.number().min(500).max(2_800).default(2_000),
  jamDensityPcPerMiPerLane: z.number().min(100).max(300).default(190),
  directions: upTo(trafficDirectionSchema, 4, "directions"),
  closures: upTo(trafficClosureSchema, LIMITS.closures, "closures").default([]),
  /**
   * The queue the closures are held to (./queue-limit): miles of queue or minutes of delay. Scenarios saved
   * before it existed read as the old default of 1 mile.
   */
  queueLimit: queueLimitSchema.default(DEFAULT_QUEUE_LIMIT),
});
export type Traffic = z.infer<typeof trafficSchema>;

const dollars = z.number().min(0, "must be ≥ 0").max(1e9);

/** What the owner and the public pay (./cost). $ in the dollars of `valueOfTime.year`. */
export const costsSchema = z.object({
  valueOfTime: z
    .object({
      /** The dollar year of the values (state it: values are not inflated by the engine). */
      year: z.number().int().min(1990).max(2100).default(2015),
      carPerVehHour: dollars.default(21.15),
      truckPerVehHour: dollars.default(27.2),
    })
    .default({ year: 2015, carPerVehHour: 21.15, truckPerVehHour: 27.2 }),
  fieldCostPerDay: dollars.default(0),
  mobilizationPerSeason: dollars.default(0),
  winterProtectionPerWinter: dollars.default(0),
  /** Against `targetDate` (end of day): paid per day early, deducted per day late. */
  incentivePerDay: dollars.default(0),
  disincentivePerDay: dollars.default(0),
});
export type Costs = z.infer<typeof costsSchema>;

export const scenarioSchema = z.object({
  /** Version 1 input is upgraded by `upgradeScenario` (./upgrade) before it is parsed. */
  schemaVersion: z.literal(2, "must be 2 (version 1 scenarios are upgraded on reading)"),
  name: name(),
  description: plainText(LIMITS.description, { multiline: true }).default(""),
  startDate: isoDate,
  targetDate: isoDate.optional(),
  timeZone: z
    .string()
    .max(LIMITS.timeZone, { abort: true, error: (iss) => `must be an IANA time zone such as America/Chicago (got ${count(String(iss.input).length)} characters)` })
    .refine(isKnownTimeZone, { error: (iss) => `"${String(iss.input)}" is not an IANA time zone (e.g. America/Chicago)` })
    .default("America/Chicago"),
  deck: z.object({
    startStationFt: nonNeg,
    lengthFt: z.number().gt(0, "must be > 0").max(LIMITS.deckLengthFt),
    packetFt: z.number().min(10, "must be ≥ 10").max(1_000).default(100),
    lanes: upTo(laneName, LIMITS.lanes, "lanes").min(1, "must name at least one lane"),
    survey: upTo(surveyRangeSchema, LIMITS.surveyRanges, "survey ranges").default([]),
  }),
  discovered: z
    .object({ defaultProbability: z.number().min(0).max(1), extraHours: distributionSchema })
    .default({ defaultProbability: 0, extraHours: { type: "fixed", value: 0 } }),
  calendar: z.object({
    shifts: upTo(shiftSchema, LIMITS.calendarItems, "shifts").min(1, "must define at least one shift"),
    workDays: upTo(z.number().int().min(0).max(6), 7, "work days").min(1, "must list at least one work day"),
    /** Short-term closures; a plan may have none (its stages' standing closures alone). */
    closures: upTo(closureSchema, LIMITS.closures, "closures"),
    closureWindows: upTo(closureWindowSchema, LIMITS.calendarItems, "closure windows"),
    holidays: z.object({
      policy: z.enum(["standDown", "workThrough"]),
      observeFederal: z.boolean().default(true),
      blackoutDates: upTo(isoDate, LIMITS.dates, "dates").default([]),
      /** Stand-down starts at this hour of the day before the holiday block (0 = the whole day before). */
      standDownStartHour: hourOfDay.default(15),
      /** Also stand down the Monday after a block that ends on a Saturday or Sunday. */
      standDownThroughMonday: z.boolean().default(false),
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
  operations: upTo(operationSchema, LIMITS.operations, "operations").min(1, "must have at least one operation"),
  /** The work in stages, in the order they are built (MODEL.md, "Stages"); one stage over all lanes is the simple plan. */
  stages: upTo(stageSchema, LIMITS.stages, "stages").min(1, "must have at least one stage"),
  links: upTo(linkSchema, LIMITS.links, "links"),
  weather: weatherSchema,
  /** Optional: demand and capacity for queues and delay (absent = no traffic model, results unchanged). */
  traffic: trafficSchema.optional(),
  /** Optional: road-user and contract costs. */
  costs: costsSchema.optional(),
}).superRefine((s, ctx) => {
  // References inside the traffic section; the rest of the semantic checks live in ./validate.
  const t = s.traffic;
  if (!t) return;
  const lanes = new Set(s.deck.lanes);
  const closures = new Map(s.calendar.closures.map((c) => [c.id, c]));
  const dirIds = new Set<string>();
  t.directions.forEach((d, i) => {
    if (dirIds.has(d.id)) ctx.addIssue({ code: "custom", path: ["traffic", "directions", i, "id"], message: `duplicate direction id "${d.id}"` });
    dirIds.add(d.id);
    d.lanes.forEach((l, j) => {
      if (!lanes.has(l)) ctx.addIssue({ code: "custom", path: ["traffic", "directions", i, "lanes", j], message: `unknown lane "${l}" (deck.lanes)` });
    });
  });
  const seen = new Set<string>();
  t.closures.forEach((c, i) => {
    if (!closures.has(c.closure)) ctx.addIssue({ code: "custom", path: ["traffic", "closures", i, "closure"], message: `unknown closure "${c.closure}"` });
    if (seen.has(c.closure)) ctx.addIssue({ code: "custom", path: ["traffic", "closures", i, "closure"], message: `closure "${c.closure}" listed twice` });
    seen.add(c.closure);
  });
  s.calendar.closures.forEach((c, ci) => {
    const override = t.closures.find((x) => x.closure === c.id)?.capacityVehPerHour;
    if (override !== undefined) return;
    t.directions.forEach((d, i) => {
      if (d.lanes.every((l) => c.lanesClosed.includes(l)))
        ctx.addIssue({ code: "custom", path: ["traffic", "directions", i, "lanes"], message: `closure "${c.id}" (calendar.closures[${ci}]) closes every lane of direction "${d.id}": add traffic.closures[] with capacityVehPerHour (e.g. a crossover)` });
    });
  });
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
