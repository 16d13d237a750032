/**
 * Small invented scenarios for the oracle tests, and deterministic samples built here (not by the engine's
 * drawSamples) so the deterministic comparisons do not share the engine's sampling code.
 * Contract: `scenario(edit)` returns a parsed Scenario (defaults filled) from a 1,000 ft base that `edit`
 * may change; `fixedSamples(s)` needs every rate and wait to be `fixed`.
 */
import { scenarioSchema, type Distribution, type Scenario, type ScenarioInput } from "../../sim/schema";
import { parseIsoDate } from "../../sim/dates";
import { createRng } from "../../sim/random";
import { createWeatherSeries } from "../../sim/weather";
import type { IterationSamples } from "../../sim/samples";

/** Twelve months of one invented climate; `cold` months get cold mornings. */
export function climate(opts: { tminF?: number; tmaxF?: number; wind?: number; rh?: number } = {}) {
  return Array.from({ length: 12 }, () => ({
    tmaxMeanF: opts.tmaxF ?? 82,
    tmaxSdF: 6,
    tminMeanF: opts.tminF ?? 60,
    tminSdF: 5,
    pWetAfterDry: 0.25,
    pWetAfterWet: 0.5,
    windMeanMph: opts.wind ?? 7,
    rhMean: opts.rh ?? 65,
  }));
}

export type Input = ScenarioInput & {
  deck: ScenarioInput["deck"];
  calendar: ScenarioInput["calendar"];
  operations: NonNullable<ScenarioInput["operations"]>;
};

/** 1,000 ft from STA 10+00, one day shift 07:00–17:00, a weekday window 08:00–16:00, Monday–Friday. */
export function baseInput(): Input {
  return {
    schemaVersion: 2,
    name: "Oracle test deck",
    startDate: "2027-06-07", // a Monday
    deck: { startStationFt: 1000, lengthFt: 1000, packetFt: 100, lanes: ["L1", "L2"] },
    calendar: {
      shifts: [
        { id: "day", name: "Day", startHour: 7, lengthHours: 10 },
        { id: "night", name: "Night", startHour: 20, lengthHours: 10 },
      ],
      workDays: [1, 2, 3, 4, 5],
      closures: [
        { id: "one-lane", name: "One lane", lanesClosed: ["L1"] },
        { id: "two-lane", name: "Two lanes", lanesClosed: ["L1", "L2"] },
      ],
      closureWindows: [
        { closure: "one-lane", dayTypes: ["weekday"], startHour: 8, endHour: 16 },
        { closure: "two-lane", dayTypes: ["weekday", "saturday", "sunday"], startHour: 21, endHour: 5 },
      ],
      holidays: { policy: "workThrough", observeFederal: true, blackoutDates: [] },
      season: { plan: "single", winterStart: "12-01", winterEnd: "03-01", demobilizeHours: 0, remobilizeHours: 0 },
    },
    operations: [],
    links: [],
    stages: [{ id: "whole-deck", name: "Whole deck", lanes: ["L1", "L2"], standingLanesClosed: [] }],
    weather: { mode: "fixed", monthly: climate() },
  };
}

export const fixedRate = (ftPerHour: number) => ({ unit: "ftPerHour" as const, dist: { type: "fixed" as const, value: ftPerHour } });

export function crewOp(id: string, ftPerHour: number, extra: Record<string, unknown> = {}) {
  return {
    id,
    name: id,
    kind: "crew" as const,
    rate: fixedRate(ftPerHour),
    crews: 1,
    shifts: ["day"],
    closure: "one-lane",
    mobilizationHours: 0,
    ...extra,
  };
}

export function input(edit: (s: Input) => void): Input {
  const s = baseInput();
  edit(s);
  return s;
}

export function scenario(edit: (s: Input) => void): Scenario {
  return scenarioSchema.parse(input(edit));
}

function fixedValue(d: Distribution): number {
  if (d.type !== "fixed") throw new Error("fixedSamples needs fixed distributions");
  return d.value;
}

/** Samples of a deterministic scenario, computed from MODEL.md ("ftPerShift" uses the first listed shift). */
export function fixedSamples(s: Scenario): IterationSamples {
  const n = s.operations.length;
  const P = Math.ceil(s.deck.lengthFt / s.deck.packetFt);
  const rate = new Float64Array(n).fill(NaN);
  const wait = new Float64Array(n).fill(NaN);
  const extra: Float64Array[] = [];
  s.operations.forEach((op, i) => {
    if (op.kind === "wait") {
      wait[i] = fixedValue(op.durationHours);
      extra.push(new Float64Array(0));
    } else {
      const v = fixedValue(op.rate.dist);
      const first = s.calendar.shifts.find((x) => x.id === op.shifts[0])!;
      rate[i] = op.rate.unit === "ftPerHour" ? v : v / first.lengthHours;
      extra.push(new Float64Array(op.discovers ? P : 0));
    }
  });
  const weather = createWeatherSeries(s.weather, parseIsoDate(s.startDate), createRng("oracle-fixed"));
  return { rateFtPerHour: rate, waitHours: wait, discoveredExtraHours: extra, weather };
}

/** Hours since 00:00 of startDate of `iso` (`YYYY-MM-DD`) plus `hour`. */
export function at(s: Scenario, iso: string, hour = 0): number {
  return (parseIsoDate(iso) - parseIsoDate(s.startDate)) * 24 + hour;
}

const ops3 = (x: Input) => {
  x.operations = [
    crewOp("milling", 50, { mobilizationHours: 2 }),
    crewOp("cleanup", 100, { mobilizationHours: 0.5 }),
    crewOp("striping", 200, { shifts: ["night"], closure: "two-lane", mobilizationHours: 1 }),
  ];
  x.links = [
    { from: "milling", to: "cleanup" },
    { from: "cleanup", to: "striping" },
  ];
};

/** Deterministic scenarios whose every boundary and packet time lies on a quarter hour. */
export const deterministicCases: Array<{ name: string; input: Input }> = [
  { name: "one crew, two operations", input: input((x) => {
    x.operations = [crewOp("milling", 50, { mobilizationHours: 2 }), crewOp("cleanup", 100)];
    x.links = [{ from: "milling", to: "cleanup" }];
  }) },
  { name: "two crews, ftPerShift rate", input: input((x) => {
    x.operations = [
      crewOp("milling", 40, { crews: 2, mobilizationHours: 1.5 }),
      { ...crewOp("cleanup", 0), rate: { unit: "ftPerShift", dist: { type: "fixed", value: 800 } } }, // 80 ft/h
    ];
    x.links = [{ from: "milling", to: "cleanup" }];
  }) },
  { name: "lagFt and lagHours", input: input((x) => {
    ops3(x);
    x.deck.lengthFt = 1250; // a short last packet of 50 ft
    x.links = [
      { from: "milling", to: "cleanup", lagFt: 250, lagHours: 3 },
      { from: "cleanup", to: "striping", lagHours: 0.75 },
    ];
  }) },
  { name: "continuous pour, cure wait, restriping at night", input: input((x) => {
    x.operations = [
      crewOp("placement", 50, { continuous: true, crews: 2 }),
      { id: "cure", name: "Cure", kind: "wait", durationHours: { type: "fixed", value: 30 } },
      crewOp("striping", 100, { shifts: ["night"], closure: "two-lane" }),
    ];
    x.links = [
      { from: "placement", to: "cure" },
      { from: "cure", to: "striping", lagFt: 100 },
    ];
  }) },
  { name: "night shift over midnight, Saturday work", input: input((x) => {
    x.deck.lengthFt = 1500;
    x.calendar.workDays = [1, 2, 3, 4, 5, 6];
    x.operations = [crewOp("night-mill", 25, { shifts: ["night"], closure: "two-lane", mobilizationHours: 1.25 })];
  }) },
  { name: "overnight window cutting a long shift", input: input((x) => {
    x.calendar.shifts.push({ id: "evening", name: "Evening", startHour: 18, lengthHours: 12 });
    x.calendar.closureWindows.push({ closure: "one-lane", dayTypes: ["saturday", "sunday"], startHour: 21.5, endHour: 4.75 });
    x.calendar.workDays = [0, 5, 6];
    x.operations = [crewOp("milling", 20, { shifts: ["evening", "day"] }), crewOp("cleanup", 40, { shifts: ["evening"] })];
    x.links = [{ from: "milling", to: "cleanup", lagFt: 200 }];
  }) },
  { name: "Independence Day 2027 stand-down", input: input((x) => {
    x.startDate = "2027-06-28";
    x.deck.lengthFt = 2000;
    x.calendar.holidays.policy = "standDown";
    ops3(x);
  }) },
  { name: "Thanksgiving and a blackout date, stand-down", input: input((x) => {
    x.startDate = "2027-11-15";
    x.calendar.season.winterStart = "12-20";
    x.calendar.holidays = { policy: "standDown", observeFederal: true, blackoutDates: ["2027-11-17"] };
    x.deck.lengthFt = 2000;
    ops3(x);
    x.operations[0] = crewOp("milling", 40, { mobilizationHours: 2 });
  }) },
  { name: "Labor Day worked through with holiday windows", input: input((x) => {
    x.startDate = "2027-08-30";
    x.calendar.closureWindows.push({ closure: "one-lane", dayTypes: ["holiday"], startHour: 6, endHour: 12 });
    x.operations = [crewOp("milling", 20)];
  }) },
  { name: "winter with demobilization and remobilization", input: input((x) => {
    x.startDate = "2027-11-22";
    x.calendar.holidays.observeFederal = false;
    x.calendar.season = { plan: "single", winterStart: "12-01", winterEnd: "03-01", demobilizeHours: 12, remobilizeHours: 3 };
    x.operations = [crewOp("milling", 16, { mobilizationHours: 3 }), crewOp("cleanup", 50, { mobilizationHours: 3 })];
    x.links = [{ from: "milling", to: "cleanup", lagFt: 300 }];
  }) },
  { name: "a crew's first packet comes after a winter (takes mobilizationHours)", input: input((x) => {
    x.startDate = "2027-11-22";
    x.calendar.holidays.observeFederal = false;
    x.calendar.season = { plan: "single", winterStart: "12-01", winterEnd: "03-01", demobilizeHours: 0, remobilizeHours: 1 };
    x.operations = [crewOp("milling", 12.5), crewOp("cleanup", 50, { mobilizationHours: 5, crews: 2 })];
    x.links = [{ from: "milling", to: "cleanup", lagFt: 800 }];
  }) },
  { name: "back-to-back shifts form one open interval: no pour candidate at 12:30", input: input((x) => {
    // Shifts 07:00–12:30 and 12:30–16:30 ∩ window 08–16: one interval, so a pour ready at 12:15 waits for 13:00.
    x.deck.lengthFt = 300;
    x.calendar.shifts = [
      { id: "a", name: "A", startHour: 7, lengthHours: 5.5 },
      { id: "b", name: "B", startHour: 12.5, lengthHours: 4 },
    ];
    x.operations = [
      { id: "prep", name: "Prep", kind: "wait", durationHours: { type: "fixed", value: 12.25 } },
      crewOp("placement", 50, { shifts: ["a", "b"], continuous: true }),
    ];
    x.links = [{ from: "prep", to: "placement" }];
  }) },
  { name: "two-season plan: cut-off date and cut-off station", input: input((x) => {
    x.startDate = "2027-11-01";
    x.calendar.holidays.observeFederal = false;
    x.calendar.season = {
      plan: "two", winterStart: "12-15", winterEnd: "03-15", demobilizeHours: 6, remobilizeHours: 2,
      cutoffDate: "2027-11-08", cutoffStationFt: 1700,
    };
    x.operations = [crewOp("milling", 12.5, { mobilizationHours: 2 }), crewOp("cleanup", 50, { mobilizationHours: 2 })];
    x.links = [{ from: "milling", to: "cleanup" }];
  }) },
  { name: "continuous pour with fixed wet dates and rain-free hours after", input: input((x) => {
    x.calendar.shifts.push({ id: "long", name: "Long", startHour: 6, lengthHours: 18 });
    x.calendar.closureWindows.push({ closure: "one-lane", dayTypes: ["weekday"], startHour: 6, endHour: 24 });
    x.weather.fixedWetDates = ["2027-06-09", "2027-06-15"];
    x.operations = [
      crewOp("milling", 50, { gates: { noRain: true } }),
      crewOp("placement", 25, { shifts: ["long"], continuous: true, gates: { noRain: true, noRainHoursAfter: 3 } }),
    ];
    x.links = [{ from: "milling", to: "placement", lagHours: 1.5 }];
  }) },
  { name: "temperature, rising and evaporation gates", input: input((x) => {
    x.startDate = "2027-05-03";
    x.weather.monthly = climate({ tminF: 38, tmaxF: 60 }).map((m, i) => (i === 4 ? m : { ...m, tminMeanF: 60, tmaxMeanF: 82 }));
    x.calendar.shifts.push({ id: "long", name: "Long", startHour: 6, lengthHours: 18 });
    x.calendar.closureWindows.push({ closure: "one-lane", dayTypes: ["weekday"], startHour: 6, endHour: 24 });
    x.deck.lengthFt = 3000;
    x.operations = [
      crewOp("milling", 25, { gates: { minTempF: 45 } }),
      crewOp("placement", 50, {
        shifts: ["long"], continuous: true, gates: { minTempF: 45, rising: true, maxEvaporation: 0.12, concreteDeltaF: 10 },
      }),
    ];
    x.links = [{ from: "milling", to: "placement" }];
  }) },
  ...weatherRuleCases(),
];

/**
 * The weather and stand-down rules of MODEL.md written as specifications write them (issue: weather rules).
 * Each case is worked by hand in tests/unit/weather-rules.test.ts; here they also join the engine-vs-reference
 * comparison packet by packet.
 */
function weatherRuleCases(): Array<{ name: string; input: Input }> {
  const nightPour = (x: Input) => {
    x.startDate = "2027-06-28";
    x.deck.lengthFt = 300;
    x.operations = [crewOp("placement", 50, { shifts: ["night"], closure: "two-lane", continuous: true, gates: { rising: true } })];
  };
  return [
    { name: "rising: a warm night pour (June nights fall, 30 June into 1 July rises)", input: input((x) => {
      nightPour(x);
      // June: 50–60 °F; July: 70–90 °F. The night of 30 June falls from 60 °F at 15:00 to July's 70 °F minimum.
      x.weather.monthly = climate({ tminF: 50, tmaxF: 60 }).map((m, i) => (i === 6 ? { ...m, tminMeanF: 70, tmaxMeanF: 90 } : m));
    }) },
    { name: "protectAfter: 12 h at or above 40 °F after each pour (cold nights)", input: input((x) => {
      x.weather.monthly = climate({ tminF: 30, tmaxF: 60 });
      x.operations = [crewOp("placement", 50, { continuous: true, gates: { protectAfter: { minTempF: 40, hours: 12 } } })];
    }) },
    { name: "cure counted in hours at or above 45 °F", input: input((x) => {
      x.weather.monthly = climate({ tminF: 30, tmaxF: 60 });
      x.deck.lengthFt = 200;
      x.operations = [
        crewOp("placement", 12.5, { continuous: true }),
        { id: "cure", name: "Cure", kind: "wait", durationHours: { type: "fixed", value: 24 }, countAboveF: 45 },
        crewOp("striping", 100),
      ];
      x.links = [{ from: "placement", to: "cure" }, { from: "cure", to: "striping" }];
    }) },
    { name: "maxTempF 85 °F on 60–90 °F days", input: input((x) => {
      x.weather.monthly = climate({ tminF: 60, tmaxF: 90 });
      x.operations = [crewOp("milling", 50, { gates: { maxTempF: 85 } })];
    }) },
    { name: "stand-down from 06:00 the day before, through the Monday (4 July 2026 observed Friday 3 July)", input: input((x) => {
      x.startDate = "2026-06-29";
      x.deck.lengthFt = 2000;
      x.calendar.holidays = { policy: "standDown", observeFederal: true, blackoutDates: [], standDownStartHour: 6, standDownThroughMonday: true };
      x.operations = [crewOp("milling", 50)];
    }) },
    { name: "hourly wind and humidity in the evaporation and wind gates", input: input((x) => {
      x.weather.monthly = climate({ tminF: 66, tmaxF: 86, wind: 8, rh: 68 });
      x.deck.lengthFt = 600;
      x.calendar.shifts.push({ id: "long", name: "Long", startHour: 6, lengthHours: 18 });
      x.calendar.closureWindows.push({ closure: "one-lane", dayTypes: ["weekday"], startHour: 6, endHour: 24 });
      x.operations = [
        crewOp("placement", 50, { shifts: ["long"], continuous: true, gates: { maxEvaporation: 0.15, concreteDeltaF: 3 } }),
        crewOp("sweep", 100, { shifts: ["long"], gates: { maxWindMph: 9 } }),
      ];
      x.links = [{ from: "placement", to: "sweep" }];
    }) },
  ];
}

/** An invented monthly climate with cold winters, warm summers and some rain (January first). */
export function seasonalClimate() {
  const tmax = [44, 48, 58, 68, 77, 85, 89, 88, 81, 70, 58, 47];
  return tmax.map((t, i) => ({
    tmaxMeanF: t,
    tmaxSdF: 7,
    tminMeanF: t - 19,
    tminSdF: 6,
    pWetAfterDry: i >= 3 && i <= 5 ? 0.3 : 0.22,
    pWetAfterWet: 0.5,
    windMeanMph: i <= 3 || i >= 10 ? 11 : 8,
    rhMean: 68,
  }));
}

/** 2,000 ft, five operations, stochastic weather, random rates and discovered conditions. */
export function stochasticInput(): Input {
  return input((x) => {
    x.startDate = "2027-04-05";
    x.deck.lengthFt = 2000;
    x.deck.survey = [{ fromStationFt: 1500, toStationFt: 2100, probability: 0.5 }];
    x.discovered = { defaultProbability: 0.15, extraHours: { type: "triangular", min: 1, mode: 2, max: 6 } };
    x.calendar.holidays.policy = "standDown";
    x.calendar.season = { plan: "single", winterStart: "12-01", winterEnd: "03-15", demobilizeHours: 8, remobilizeHours: 4 };
    x.calendar.closureWindows.push({ closure: "one-lane", dayTypes: ["saturday"], startHour: 9, endHour: 15.5 });
    x.weather = { mode: "stochastic", monthly: seasonalClimate() };
    x.operations = [
      { ...crewOp("milling", 0, { shifts: ["night"], closure: "two-lane", mobilizationHours: 2 }),
        rate: { unit: "ftPerHour", dist: { type: "triangular", min: 40, mode: 60, max: 90 } } },
      { ...crewOp("hydrodemolition", 0, { discovers: true, crews: 2, mobilizationHours: 4, gates: { maxWindMph: 25 } }),
        rate: { unit: "ftPerShift", dist: { type: "pert", min: 150, mode: 250, max: 400 } } },
      { ...crewOp("placement", 0, {
          continuous: true, mobilizationHours: 1,
          gates: { minTempF: 45, rising: true, noRain: true, noRainHoursAfter: 3, maxEvaporation: 0.2, concreteDeltaF: 10, maxWindMph: 20 },
        }),
        rate: { unit: "ftPerHour", dist: { type: "triangular", min: 60, mode: 90, max: 120 } } },
      { id: "cure", name: "Cure", kind: "wait", durationHours: { type: "lognormal", median: 30, sigma: 0.25 } },
      { ...crewOp("striping", 0, { shifts: ["night"], closure: "two-lane", gates: { noRain: true, minTempF: 40 } }),
        rate: { unit: "ftPerHour", dist: { type: "pert", min: 100, mode: 150, max: 220 } } },
    ];
    x.links = [
      { from: "milling", to: "hydrodemolition", lagFt: 200 },
      { from: "hydrodemolition", to: "placement", lagHours: 2 },
      { from: "placement", to: "cure" },
      { from: "cure", to: "striping", lagFt: 100 },
    ];
  });
}

/** The base deck with three lanes (closures re-aimed at them), for staged fixtures. */
function threeLanes(x: Input): void {
  x.deck.lanes = ["L1", "L2", "L3"];
  x.calendar.closures = [
    { id: "one-lane", name: "One lane", lanesClosed: ["L2"] },
    { id: "two-lane", name: "Two lanes", lanesClosed: ["L2", "L3"] },
  ];
}

/** Staged deterministic scenarios (MODEL.md "Stages" and "Closures that stand"), boundaries on quarter hours. */
export const stagedCases: Array<{ name: string; input: Input }> = [
  { name: "two stages on a three-lane deck: L1 then L2-L3 following the restored front", input: input((x) => {
    threeLanes(x);
    x.calendar.workDays = [1, 2, 3, 4, 5, 6];
    x.operations = [
      crewOp("milling", 50, { closure: undefined, mobilizationHours: 2 }), // behind the stage's barrier: shifts alone
      { id: "cure", name: "Cure", kind: "wait", durationHours: { type: "fixed", value: 10 } },
      crewOp("striping", 100, { shifts: ["night"], closure: "two-lane", mobilizationHours: 1 }),
    ];
    x.links = [
      { from: "milling", to: "cure" },
      { from: "cure", to: "striping", lagFt: 100 },
    ];
    x.stages = [
      { id: "s1", name: "Stage 1", lanes: ["L1"], standingLanesClosed: ["L1"], operations: ["milling", "cure"] },
      { id: "s2", name: "Stage 2", lanes: ["L2", "L3"], fromStationFt: 1300, toStationFt: 2000, standingLanesClosed: ["L2", "L3"],
        after: { stage: "s1", when: "restoredAhead", lagFt: 200, lagHours: 2 } },
    ];
    x.calendar.closures = [{ id: "two-lane", name: "Night L1", lanesClosed: ["L1"] }];
    x.calendar.closureWindows = [{ closure: "two-lane", dayTypes: ["weekday", "saturday", "sunday"], startHour: 21, endHour: 5 }];
  }) },
  { name: "stage done, fleet rule and a lag between stages", input: input((x) => {
    threeLanes(x);
    x.deck.lengthFt = 600;
    x.operations = [crewOp("milling", 50, { mobilizationHours: 1.5, crews: 2 }), crewOp("cleanup", 100, { mobilizationHours: 0.5 })];
    x.links = [{ from: "milling", to: "cleanup", lagFt: 100 }];
    x.stages = [
      { id: "a", name: "A", lanes: ["L1"] },
      { id: "b", name: "B", lanes: ["L2"], after: { stage: "a", when: "stageDone", lagFt: 0, lagHours: 5.25 } },
      { id: "c", name: "C", lanes: ["L3"], standingLanesClosed: [], operations: ["cleanup"] },
    ];
  }) },
  { name: "short-term closure with 1 h set-up and 0.5 h take-down", input: input((x) => {
    x.calendar.closures[0] = { id: "one-lane", name: "One lane", lanesClosed: ["L1"], setupHours: 1, takedownHours: 0.5 };
    x.calendar.closures[1] = { id: "two-lane", name: "Two lanes", lanesClosed: ["L1", "L2"], setupHours: 0.75, takedownHours: 1.25 };
    x.operations = [
      crewOp("milling", 50, { mobilizationHours: 2 }),
      crewOp("striping", 100, { shifts: ["night"], closure: "two-lane", mobilizationHours: 1 }),
    ];
    x.links = [{ from: "milling", to: "striping", lagHours: 0.5 }];
    x.traffic = undefined;
  }) },
  { name: "two-season plan restores traffic before the winter", input: input((x) => {
    x.startDate = "2027-11-01";
    x.calendar.holidays.observeFederal = false;
    x.calendar.season = {
      plan: "two", winterStart: "12-15", winterEnd: "03-15", demobilizeHours: 6, remobilizeHours: 2,
      cutoffDate: "2027-11-08", cutoffStationFt: 1500,
    };
    x.operations = [
      crewOp("milling", 25, { closure: undefined, mobilizationHours: 2 }),
      { id: "cure", name: "Cure", kind: "wait", durationHours: { type: "fixed", value: 6 } },
      crewOp("cleanup", 50, { mobilizationHours: 1 }),
    ];
    x.links = [{ from: "milling", to: "cure" }, { from: "cure", to: "cleanup" }];
    x.stages = [{ id: "whole", name: "Whole deck", lanes: ["L2"], standingLanesClosed: ["L2"] }];
  }) },
  { name: "two-season plan whose started packet is not restored keeps its barrier over the winter", input: input((x) => {
    x.startDate = "2027-11-01";
    x.calendar.holidays.observeFederal = false;
    x.calendar.season = {
      plan: "two", winterStart: "12-15", winterEnd: "03-15", demobilizeHours: 6, remobilizeHours: 2, cutoffDate: "2027-11-05",
    };
    x.operations = [crewOp("milling", 10, { closure: undefined }), crewOp("cleanup", 50)];
    x.links = [{ from: "milling", to: "cleanup" }];
    x.stages = [{ id: "whole", name: "Whole deck", lanes: ["L1"], standingLanesClosed: ["L1"] }];
  }) },
];
