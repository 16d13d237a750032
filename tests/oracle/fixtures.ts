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
    schemaVersion: 1,
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

export function scenario(edit: (s: Input) => void): Scenario {
  const s = baseInput();
  edit(s);
  return scenarioSchema.parse(s);
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
