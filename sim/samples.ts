/**
 * Everything random in one iteration, drawn before the engine runs (MODEL.md, "Monte Carlo"). Contract:
 * `drawSamples(scenario, seed, k)` is a pure function of its arguments. Two independent streams:
 * `"${seed}:${k}"` draws, in order, one value per operation in scenario order (crew → rate converted to
 * ft/h; wait → duration in hours), then for each discovering operation in scenario order, for each packet
 * in index order: one uniform u, and when u < p (the packet's discovery probability) one extra-hours draw.
 * `"${seed}:${k}:w"` drives the weather series, which grows lazily as the engine reads it.
 * `reuse`, an earlier result for the same scenario that the caller no longer reads, lends its buffers (the
 * Monte Carlo loop passes the previous iteration's); the values drawn do not depend on it, and it must not be
 * read again.
 * The engine and the reference simulator both consume these samples, so they see the same world.
 */
import { parseIsoDate } from "./dates";
import { sampleDistribution } from "./distributions";
import { createRng } from "./random";
import type { Scenario } from "./schema";
import { createWeatherSeries, type WeatherSeries } from "./weather";
import type { WeatherOverride } from "./forecast-weather"; // forecast override
import { withRain, type ActiveOverride } from "./weather-override-reads"; // forecast override

export interface IterationSamples {
  /** Per operation index (NaN for wait operations). */
  rateFtPerHour: Float64Array;
  /** Per operation index (NaN for crew operations). */
  waitHours: Float64Array;
  /** Per operation index: per packet extra hours (0 = none); empty for operations that do not discover. */
  discoveredExtraHours: Float64Array[];
  /** Lazily extended, with its own stream. */
  weather: WeatherSeries;
  /** forecast override: a re-forecast's forecast hours with this iteration's rain (stream `${seed}:${k}:f`); null for none. */
  weatherOverride?: ActiveOverride | null;
}

interface Prepared {
  packets: number;
  probability: Float64Array;
  rateFactor: Float64Array;
  startDay: number;
}

const prepared = new WeakMap<Scenario, Prepared>();

/** Discovery probability of each packet: the survey range covering its start, else the default. */
export function packetProbabilities(s: Scenario): Float64Array {
  const P = Math.ceil(s.deck.lengthFt / s.deck.packetFt);
  const out = new Float64Array(P);
  for (let i = 0; i < P; i++) {
    const station = s.deck.startStationFt + i * s.deck.packetFt;
    const r = s.deck.survey.find((x) => station >= x.fromStationFt && station < x.toStationFt);
    out[i] = r ? r.probability : s.discovered.defaultProbability;
  }
  return out;
}

/** ft/h per unit of the sampled rate: 1 for ftPerHour, 1 / (first listed shift's length) for ftPerShift. */
export function rateFactorOf(s: Scenario, opIndex: number): number {
  const op = s.operations[opIndex];
  if (op.kind !== "crew" || op.rate.unit === "ftPerHour") return 1;
  const shift = s.calendar.shifts.find((x) => x.id === op.shifts[0]);
  return shift ? 1 / shift.lengthHours : NaN;
}

function prepare(s: Scenario): Prepared {
  let p = prepared.get(s);
  if (!p) {
    p = {
      packets: Math.ceil(s.deck.lengthFt / s.deck.packetFt),
      probability: packetProbabilities(s),
      rateFactor: Float64Array.from(s.operations, (_, i) => rateFactorOf(s, i)),
      startDay: parseIsoDate(s.startDate),
    };
    prepared.set(s, p);
  }
  return p;
}

const EMPTY = new Float64Array(0);

export function drawSamples(scenario: Scenario, seed: string, iteration: number, reuse?: IterationSamples, override?: WeatherOverride | null): IterationSamples {
  const prep = prepare(scenario);
  const ops = scenario.operations;
  const rng = createRng(`${seed}:${iteration}`);
  const fits = reuse !== undefined && reuse.rateFtPerHour.length === ops.length;
  const rateFtPerHour = fits ? reuse.rateFtPerHour.fill(NaN) : new Float64Array(ops.length).fill(NaN);
  const waitHours = fits ? reuse.waitHours.fill(NaN) : new Float64Array(ops.length).fill(NaN);
  for (let i = 0; i < ops.length; i++) {
    const op = ops[i];
    if (op.kind === "crew") rateFtPerHour[i] = sampleDistribution(op.rate.dist, rng) * prep.rateFactor[i];
    else waitHours[i] = sampleDistribution(op.durationHours, rng);
  }
  const discoveredExtraHours: Float64Array[] = fits ? reuse.discoveredExtraHours : [];
  for (let i = 0; i < ops.length; i++) {
    const op = ops[i];
    if (op.kind !== "crew" || !op.discovers) {
      discoveredExtraHours[i] = EMPTY;
      continue;
    }
    const old = fits ? reuse.discoveredExtraHours[i] : undefined;
    const extra = old !== undefined && old.length === prep.packets ? old.fill(0) : new Float64Array(prep.packets);
    for (let j = 0; j < prep.packets; j++) {
      if (rng.next() < prep.probability[j]) extra[j] = sampleDistribution(scenario.discovered.extraHours, rng);
    }
    discoveredExtraHours[i] = extra;
  }
  const weather = createWeatherSeries(scenario.weather, prep.startDay, createRng(`${seed}:${iteration}:w`), reuse?.weather);
  const weatherOverride = override ? withRain(override, seed, iteration, reuse?.weatherOverride) : null; // forecast override
  return { rateFtPerHour, waitHours, discoveredExtraHours, weather, weatherOverride };
}
