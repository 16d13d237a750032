/**
 * Which weather forecast a re-forecast starts from (src/lib/server/forecast/reforecast-input.ts), how the job's
 * key names it (src/lib/run-record.ts), and the sentence the field log shows (src/lib/reforecast-weather-text.ts).
 * The cached forecast is what the app stores: the weather-service fake's answer read by the app's own reader.
 */
import { describe, expect, it } from "vitest";
import { hourlyBody } from "../../scripts/fake-forecast";
import { FAKE_LOCATIONS, hourWeather } from "../../scripts/fake-forecast-weather";
import { weatherOverride } from "../../sim/forecast-weather";
import type { Scenario } from "../../sim/schema";
import { parseScenario } from "../../sim/validate";
import { hourlySchema, normalizeHourly } from "../../src/lib/server/forecast/nws-format";
import { forecastForReforecast, MAX_AGE_MS } from "../../src/lib/server/forecast/reforecast-input";
import { inputsHash, reforecastInputsHash } from "../../src/lib/run-record";
import { forecastSourceSentence, formatInZone } from "../../src/lib/reforecast-weather-text";
import { small } from "./engine-fixtures";

// 2027-04-07 15:30 UTC = 10:30 in Chicago (CDT, UTC−5): the fake's 156 hours run from 10:00 to Tue 13 Apr 21:00.
const NOW = new Date(Date.UTC(2027, 3, 7, 15, 30));
const kestrel = FAKE_LOCATIONS.find((l) => l.name === "Kestrel Bay")!;
const cachedData = (timeZone = "America/Chicago") => ({
  ...normalizeHourly(hourlySchema.parse(hourlyBody(kestrel, NOW.getTime(), "America/Chicago", false))),
  hourlyUrl: "http://127.0.0.1/gridpoints/KBY/40,60/forecast/hourly",
  office: "KBY 40,60",
  timeZone,
  place: "Kestrel Bay, ZZ",
});
const plan: Scenario = (() => {
  const r = parseScenario(small()); // starts Mon 2027-04-05, America/Chicago
  if (!r.ok) throw new Error("fixture");
  return r.scenario;
})();
const minutesAgo = (m: number) => new Date(NOW.getTime() - m * 60_000);
const decide = (over: Partial<Parameters<typeof forecastForReforecast>[0]> = {}) =>
  forecastForReforecast({ plan, dataDate: "2027-04-07", today: "2027-04-07", now: NOW, cached: { data: cachedData(), fetchedAt: minutesAgo(30) }, ...over });

describe("the forecast a re-forecast starts from", () => {
  it("today's data date and a forecast fetched 30 min ago: its hours, the whole days after today", () => {
    const f = decide()!;
    expect(f.fetchedAt).toBe("2027-04-07T15:00:00.000Z");
    expect(f.hourly.firstDate).toBe("2027-04-07");
    // Tomorrow 03:00 is the fake's cold-snap night, hour 24 + 3 of the arrays.
    expect(f.hourly.tempF[27]).toBe(hourWeather(kestrel.week, 1, 3).tempF);
    // 8–12 April are whole; 13 April ends at 21:00, so the climate profile takes over from it.
    expect(weatherOverride(plan, f.hourly, "2027-04-07")!.dates).toEqual(["2027-04-08", "2027-04-09", "2027-04-10", "2027-04-11", "2027-04-12"]);
  });

  it("none for an earlier data date, an old or future-dated forecast, another time zone, or no forecast at all", () => {
    expect(decide({ dataDate: "2027-04-06" })).toBeNull();
    expect(decide({ cached: { data: cachedData(), fetchedAt: new Date(NOW.getTime() - MAX_AGE_MS - 60_000) } })).toBeNull();
    expect(decide({ cached: { data: cachedData(), fetchedAt: new Date(NOW.getTime() - MAX_AGE_MS + 60_000) } })).not.toBeNull();
    expect(decide({ cached: { data: cachedData(), fetchedAt: new Date(NOW.getTime() + 10 * 60_000) } })).toBeNull();
    expect(decide({ cached: { data: cachedData("America/Denver"), fetchedAt: minutesAgo(30) } })).toBeNull();
    expect(decide({ cached: { data: null, fetchedAt: null } })).toBeNull();
    expect(decide({ cached: null })).toBeNull();
    // A plan that starts after the forecast's last whole day has nothing to take from it.
    expect(decide({ plan: { ...plan, startDate: "2027-04-20" } })).toBeNull();
  });
});

describe("the re-forecast's key names its forecast", () => {
  const args = { definition: small(), records: [], dataDate: "2027-04-07", seed: "s", iterations: 100 };
  it("without a forecast the hash is what it always was, so stored re-forecasts keep their keys", () => {
    const before = inputsHash({ definition: args.definition, progress: [], dataDate: args.dataDate }, "s", 100);
    expect(reforecastInputsHash(args)).toBe(before);
    expect(reforecastInputsHash({ ...args, forecast: null })).toBe(before);
  });
  it("a forecast, and a newer one, are other computations", () => {
    const a = decide()!;
    const b = decide({ cached: { data: cachedData(), fetchedAt: minutesAgo(10) } })!;
    const plain = reforecastInputsHash(args);
    expect(reforecastInputsHash({ ...args, forecast: a })).not.toBe(plain);
    expect(reforecastInputsHash({ ...args, forecast: b })).not.toBe(reforecastInputsHash({ ...args, forecast: a }));
    expect(reforecastInputsHash({ ...args, forecast: a })).toBe(reforecastInputsHash({ ...args, forecast: structuredClone(a) }));
  });
});

describe("what the field log says about a re-forecast's weather", () => {
  it("the days from the forecast, the forecast's time on the scenario's clock, then the climate profile", () => {
    expect(formatInZone("2027-04-07T15:00:00.000Z", "America/Chicago")).toBe("7 Apr 2027, 10:00");
    expect(forecastSourceSentence({ forecastDates: ["2027-04-08", "2027-04-09", "2027-04-10"], fetchedAt: "2027-04-07T15:00:00.000Z", timeZone: "America/Chicago", maxAgeHours: 6 })).toBe(
      "Days 1–3 after the data date (8 Apr 2027 to 10 Apr 2027) came from the weather forecast fetched 7 Apr 2027, 10:00; the climate profile after them.",
    );
    expect(forecastSourceSentence({ forecastDates: ["2027-04-08"], fetchedAt: "2027-04-07T15:00:00.000Z", timeZone: "America/Chicago", maxAgeHours: 6 })).toBe(
      "Day 1 after the data date (8 Apr 2027) came from the weather forecast fetched 7 Apr 2027, 10:00; the climate profile after it.",
    );
    expect(forecastSourceSentence({ forecastDates: undefined, fetchedAt: undefined, timeZone: "America/Chicago", maxAgeHours: 6 })).toBe(
      "The weather came from the climate profile throughout: a re-forecast starts from the weather forecast only when its data date is today and the project has a forecast fetched within the last 6 hours.",
    );
  });
});
