/**
 * A re-forecast that starts from the weather forecast: the "weather override" input (days of hourly values
 * that replace the climate generator's for those days) and how one iteration draws its rain from it.
 * Contract (pure, no Math.random):
 * - `weatherOverride(scenario, forecast, dataDate)` keeps the forecast's whole days from the day after the data
 *   date on (the re-forecast's time starts at 24:00 of the data date, MODEL.md "Re-forecast"), only days whose
 *   24 hours all have temperature, rain chance, humidity and wind; it stops at the first incomplete day, so the
 *   override is one unbroken run of days and the climate profile takes over after it.
 * - `drawOverrideRain(override, seed, k)`: rain per iteration, the stated rule: hour h is wet with probability
 *   PoP(h), one uniform per hour in hour order from the iteration's own stream `"${seed}:${k}:f"` — a stream no
 *   other draw uses, so the plan's samples (`"${seed}:${k}"`, `"${seed}:${k}:w"`) are the same with or
 *   without an override, and an iteration's rain does not depend on how a run is split over workers.
 * - `fixedModeHourly(scenario, firstDate, days)`: the fixed-mode climate profile's own hourly values (PoP 0 or
 *   100 on `fixedWetDates`), the forecast for which a re-forecast with an override must equal the plan
 *   re-forecast (the law). Temperature is the engine's `hourlyTempF`; humidity and wind follow MODEL.md
 *   "Weather" (dew point of the daily mean; 30 % daily wind swing peaking at 15:00).
 * Where it plugs into the engine (each hook marked `// forecast override`): `drawSamples(…, override)` sets
 * `samples.weatherOverride` (./weather-override-reads `withRain`); `GateCache.reset(series, override)` makes
 * `tempAt`, the rain mask, the hourly wind and humidity of the evaporation gate, `rising` and the whole-day
 * temperature bounds (protection window, warm-hour cure) read the override for `fromHour ≤ hour < toHour`, the
 * series otherwise; `compileScenario(s, { asBuilt, weatherOverride })` carries it; the summary lists
 * `override.dates` as `forecastDates`.
 */
import { formatDayNumber, parseIsoDate } from "./dates";
import { createRng } from "./random";
import type { Scenario } from "./schema";
import { createWeatherSeries, hourlyTempF } from "./weather";

export interface HourlyInput {
  /** Local date of hour 0 (00:00). */
  firstDate: string;
  tempF: (number | null)[];
  popPct: (number | null)[];
  rhPct: (number | null)[];
  windMph: (number | null)[];
}

export interface WeatherOverride {
  /** Hours since 00:00 of the scenario's start date: the override covers [fromHour, toHour). */
  fromHour: number;
  toHour: number;
  /** Per hour of the override, index h − fromHour. */
  tempF: Float64Array;
  popPct: Float64Array;
  rhPct: Float64Array;
  windMph: Float64Array;
  /** The dates that came from the forecast, `YYYY-MM-DD`. */
  dates: string[];
}

export function weatherOverride(scenario: Scenario, forecast: HourlyInput, dataDate: string): WeatherOverride | null {
  const start = parseIsoDate(scenario.startDate);
  const first = parseIsoDate(forecast.firstDate);
  const fromDay = Math.max(parseIsoDate(dataDate) + 1, first, start);
  const days: number[] = [];
  for (let day = fromDay; ; day++) {
    const h0 = 24 * (day - first);
    let complete = h0 + 24 <= forecast.tempF.length;
    for (let h = h0; complete && h < h0 + 24; h++)
      complete = [forecast.tempF, forecast.popPct, forecast.rhPct, forecast.windMph].every((a) => typeof a[h] === "number" && Number.isFinite(a[h]));
    if (!complete) break;
    days.push(day);
  }
  if (days.length === 0) return null;
  const n = 24 * days.length;
  const h0 = 24 * (fromDay - first);
  const take = (a: (number | null)[]) => Float64Array.from({ length: n }, (_, i) => a[h0 + i] as number);
  return {
    fromHour: 24 * (fromDay - start),
    toHour: 24 * (fromDay - start) + n,
    tempF: take(forecast.tempF),
    popPct: take(forecast.popPct),
    rhPct: take(forecast.rhPct),
    windMph: take(forecast.windMph),
    dates: days.map(formatDayNumber),
  };
}

/** 1 where iteration k's hour is wet: U < PoP/100, one uniform per hour from the stream `${seed}:${k}:f`. */
export function drawOverrideRain(o: WeatherOverride, seed: string, k: number, out: Uint8Array = new Uint8Array(o.popPct.length)): Uint8Array {
  const rng = createRng(`${seed}:${k}:f`);
  for (let i = 0; i < o.popPct.length; i++) out[i] = rng.next() < o.popPct[i] / 100 ? 1 : 0;
  return out;
}

/** Magnus saturation vapour pressure, hPa (T in °C; Alduchov & Eskridge 1996), as MODEL.md "Weather" states. */
const es = (c: number) => 6.1094 * Math.exp((17.625 * c) / (c + 243.04));
const toC = (f: number) => ((f - 32) * 5) / 9;

/** The fixed-mode profile's hourly values for `days` days from `firstDate` (see the contract above). */
export function fixedModeHourly(scenario: Scenario, firstDate: string, days: number): HourlyInput {
  if (scenario.weather.mode !== "fixed") throw new Error("fixedModeHourly needs a fixed-mode climate profile");
  const firstDay = parseIsoDate(firstDate);
  // A fixed-mode series draws nothing from its generator; the seed is only there to satisfy the signature.
  // It starts the day before, so the hours before 06:00 fall from the previous afternoon as in the engine —
  // except on the scenario's start date, where the engine has no previous afternoon and uses that day's own
  // maximum (MODEL.md "Weather"): that day reads a series that starts on it.
  const series = createWeatherSeries(scenario.weather, firstDay - 1, createRng("fixed"));
  series.ensure(days + 3);
  const startDay = parseIsoDate(scenario.startDate);
  const atStart = createWeatherSeries(scenario.weather, startDay, createRng("fixed"));
  const wet = new Set(scenario.weather.fixedWetDates.map(parseIsoDate));
  const out: HourlyInput = { firstDate, tempF: [], popPct: [], rhPct: [], windMph: [] };
  for (let d = 0; d < days; d++) {
    const tMean = toC((series.tmaxF[d + 1] + series.tminF[d + 1]) / 2);
    const eDew = (series.rhPct[d + 1] / 100) * es(tMean);
    for (let h = 0; h < 24; h++) {
      const t = firstDay + d === startDay ? hourlyTempF(atStart, h) : hourlyTempF(series, 24 * (d + 1) + h);
      out.tempF.push(t);
      out.popPct.push(wet.has(firstDay + d) ? 100 : 0);
      out.rhPct.push(Math.min(100, (100 * eDew) / es(toC(t))));
      out.windMph.push(series.windMph[d + 1] * (1 + 0.3 * Math.cos((2 * Math.PI * (h - 15)) / 24)));
    }
  }
  return out;
}
