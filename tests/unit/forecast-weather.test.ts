/**
 * The weather override of a re-forecast from the forecast (sim/forecast-weather.ts): which days it takes, the
 * per-iteration rain drawn from the probability of precipitation, and the fixed-mode profile's own hourly
 * values (the forecast for which the override must change nothing).
 */
import { describe, expect, it } from "vitest";
import { parseIsoDate } from "../../sim/dates";
import { drawOverrideRain, fixedModeHourly, weatherOverride, type HourlyInput } from "../../sim/forecast-weather";
import { createRng } from "../../sim/random";
import type { Scenario } from "../../sim/schema";
import { parseScenario } from "../../sim/validate";
import { createWeatherSeries, hourlyTempF } from "../../sim/weather";
import { small } from "./engine-fixtures";

function scenario(): Scenario {
  const r = parseScenario(small());
  if (!r.ok) throw new Error(JSON.stringify(r.problems));
  return r.scenario; // fixed mode, start Mon 2027-04-05
}

function flat(firstDate: string, hours: number, pop = 30): HourlyInput {
  return { firstDate, tempF: Array(hours).fill(50), popPct: Array(hours).fill(pop), rhPct: Array(hours).fill(60), windMph: Array(hours).fill(8) };
}

describe("weather override", () => {
  it("takes the whole, complete forecast days after the data date and stops at the first gap", () => {
    // Forecast from Wed 2027-04-07 00:00 for 4 days; data date Wed → days Thu, Fri, Sat; a gap on Sat at 13:00.
    const f = flat("2027-04-07", 96);
    f.rhPct[24 * 3 + 13] = null;
    const o = weatherOverride(scenario(), f, "2027-04-07")!;
    expect(o.dates).toEqual(["2027-04-08", "2027-04-09"]);
    expect(o.fromHour).toBe(24 * 3); // Thu 00:00 is 3 days after Mon 00:00
    expect(o.toHour).toBe(24 * 5);
    expect(o.tempF.length).toBe(48);
    // No whole day after the data date: nothing to override.
    expect(weatherOverride(scenario(), flat("2027-04-07", 30), "2027-04-07")).toBeNull();
  });

  it("draws rain per hour with the probability of precipitation, the same for the same seed and iteration", () => {
    const o = weatherOverride(scenario(), flat("2027-04-07", 24 * 101, 50), "2027-04-06")!;
    const a = drawOverrideRain(o, "s", 3);
    expect(drawOverrideRain(o, "s", 3)).toEqual(a);
    expect(drawOverrideRain(o, "s", 4)).not.toEqual(a);
    // 2,424 hours at 50 %: standard error √(0.25/2424) ≈ 0.0102; 4 SE ≈ 0.041.
    const share = a.reduce((n, x) => n + x, 0) / a.length;
    expect(Math.abs(share - 0.5)).toBeLessThan(0.041);
    const none = { ...o, popPct: o.popPct.map(() => 0) };
    const all = { ...o, popPct: o.popPct.map(() => 100) };
    expect(drawOverrideRain(none, "s", 3).every((x) => x === 0)).toBe(true);
    expect(drawOverrideRain(all, "s", 3).every((x) => x === 1)).toBe(true);
  });

  it("the fixed-mode profile's hourly values are what the engine's own series reads for those hours", () => {
    const s = scenario();
    const hourly = fixedModeHourly(s, "2027-04-07", 4);
    const o = weatherOverride(s, hourly, "2027-04-07")!;
    expect(o.dates).toEqual(["2027-04-08", "2027-04-09", "2027-04-10"]);
    const series = createWeatherSeries(s.weather, parseIsoDate(s.startDate), createRng("any"));
    for (let i = 0; i < o.tempF.length; i++) expect(o.tempF[i]).toBe(hourlyTempF(series, o.fromHour + i));
    // April in the profile: tmin 50 at 06:00, tmax 70 at 15:00, no rain, RH 66 % at the daily mean temperature.
    expect(o.tempF[6]).toBe(50);
    expect(o.tempF[15]).toBe(70);
    expect(o.popPct.every((p) => p === 0)).toBe(true);
    // The mean temperature (60 °F) is reached on the way up: there the hourly RH equals the day's RH.
    const meanHourRh = fixedModeHourly({ ...s, weather: { ...s.weather, monthly: s.weather.monthly.map((m) => ({ ...m, tmaxMeanF: 60, tminMeanF: 60 })) } }, "2027-04-08", 1).rhPct[10];
    expect(meanHourRh).toBeCloseTo(66, 10);
    // The hourly wind swings around the day's mean: its 24-hour average is the mean (9 mph in April).
    expect(o.windMph.slice(0, 24).reduce((a, b) => a + b, 0) / 24).toBeCloseTo(9, 10);
  });
});
