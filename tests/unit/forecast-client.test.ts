/**
 * The weather-service client against the local fake (scripts/fake-forecast.ts) on loopback: a normal
 * forecast, the units the service states, missing values, and every failure ending in a plain message.
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { AddressInfo } from "node:net";
import type { Server } from "node:http";
import { createFakeForecast } from "../../scripts/fake-forecast";
import { FAKE_LOCATIONS, hourWeather } from "../../scripts/fake-forecast-weather";
import { fetchHourlyForecast, ForecastError } from "../../src/lib/server/forecast/nws-client";
import { normalizeHourly, toHourlyArrays, windStringMph } from "../../src/lib/server/forecast/nws-format";

// 2027-04-07 15:30 UTC = 10:30 in Chicago (CDT, UTC−5).
const NOW = Date.UTC(2027, 3, 7, 15, 30);
let server: Server;
let base: string;
const fast = () => ({ baseUrl: base, timeoutMs: 300, attempts: 3, retryBaseMs: 5, userAgent: "(Pourline tests, test@example.invalid)" });
const loc = (name: string) => FAKE_LOCATIONS.find((l) => l.name === name)!;

async function failure(p: Promise<unknown>): Promise<ForecastError> {
  try {
    await p;
  } catch (e) {
    if (e instanceof ForecastError) return e;
    throw e;
  }
  throw new Error("expected a ForecastError");
}

beforeAll(async () => {
  server = createFakeForecast({ now: () => NOW, timeZone: "America/Chicago" });
  await new Promise<void>((r) => server.listen(0, "127.0.0.1", r));
  base = `http://127.0.0.1:${(server.address() as AddressInfo).port}`;
});
afterAll(async () => {
  server.closeAllConnections();
  await new Promise((r) => server.close(r));
});

describe("the forecast client against the fake service", () => {
  it("reads a normal hourly forecast in °F and mph, on the location's wall clock", async () => {
    const k = loc("Kestrel Bay");
    const f = await fetchHourlyForecast(k.latitude, k.longitude, fast());
    expect(f.place).toBe("Kestrel Bay, ZZ");
    expect(f.timeZone).toBe("America/Chicago");
    expect(f.office).toBe("KBY 40,60");
    expect(f.hours).toHaveLength(156);
    expect(f.hours[0].start).toBe("2027-04-07T10:00");
    // Tomorrow (day 1) is the cold snap: 03:00 local from the invented week, in the documented units.
    const h = f.hours.find((x) => x.start === "2027-04-08T03:00")!;
    const want = hourWeather(k.week, 1, 3);
    expect(h).toEqual({ start: "2027-04-08T03:00", tempF: want.tempF, popPct: want.popPct, rhPct: want.rhPct, windMph: want.windMph });
    expect(f.gaps).toEqual({ tempF: 0, popPct: 0, rhPct: 0, windMph: 0 });
    // The board's arrays start at 00:00 of the first day, with nothing before the first forecast hour.
    const a = toHourlyArrays(f.hours)!;
    expect(a.firstDate).toBe("2027-04-07");
    expect(a.tempF.slice(0, 10).every((x) => x === null)).toBe(true);
    expect(a.tempF[10]).toBe(f.hours[0].tempF);
    expect(a.tempF[24 + 3]).toBe(want.tempF);
  });

  it("converts °C and km/h when the service states them (QuantitativeValue form)", async () => {
    const m = loc("Metric Landing");
    const f = await fetchHourlyForecast(m.latitude, m.longitude, fast());
    const h = f.hours.find((x) => x.start === "2027-04-08T15:00")!;
    const want = hourWeather(m.week, 1, 15);
    // The fake rounds °C to 0.1 and km/h to whole numbers, so the round trip is within those steps.
    expect(Math.abs(h.tempF! - want.tempF)).toBeLessThanOrEqual(0.09);
    expect(Math.abs(h.windMph! - want.windMph)).toBeLessThanOrEqual(0.5 / 1.609344);
  });

  it("reads the wind as the service writes it: single values, ranges at their upper value, other units", () => {
    expect(windStringMph("10 mph")).toBe(10);
    expect(windStringMph("5 to 15 mph")).toBe(15);
    expect(windStringMph("16 km/h")).toBeCloseTo(9.942, 3);
    expect(windStringMph("")).toBeNull();
    expect(windStringMph("calm")).toBeNull();
  });

  it("keeps missing values as missing and counts them", async () => {
    const p = loc("Patchy Ridge");
    const f = await fetchHourlyForecast(p.latitude, p.longitude, fast());
    // Every 5th period lacks humidity, every 7th the rain chance, every 11th the wind (156 periods).
    expect(f.gaps).toEqual({ tempF: 0, popPct: Math.floor(156 / 7), rhPct: Math.floor(156 / 5), windMph: Math.floor(156 / 11) });
    expect(f.hours[4].rhPct).toBeNull();
    expect(f.hours[4].tempF).not.toBeNull();
  });

  it("keeps the first value of a wall-clock hour that repeats and fills periods longer than an hour", () => {
    const n = normalizeHourly({
      properties: {
        periods: [
          { startTime: "2026-11-01T01:00:00-05:00", endTime: "2026-11-01T01:00:00-06:00", temperature: 40, temperatureUnit: "F" },
          { startTime: "2026-11-01T01:00:00-06:00", endTime: "2026-11-01T04:00:00-06:00", temperature: 38, temperatureUnit: "F" },
        ],
      },
    });
    expect(n.hours.map((h) => [h.start, h.tempF])).toEqual([
      ["2026-11-01T01:00", 40],
      ["2026-11-01T02:00", 38],
      ["2026-11-01T03:00", 38],
    ]);
  });

  it("a point outside the service's area is a plain message, not retried", async () => {
    const e = await failure(fetchHourlyForecast(10, 10, fast()));
    expect(e.kind).toBe("notCovered");
    expect(e.message).toMatch(/has no forecast for this location \(HTTP 404: Data Unavailable For Requested Point\)/);
  });

  it("a service that does not answer times out, is retried, and says so", async () => {
    const s = loc("Silent Hollow");
    const e = await failure(fetchHourlyForecast(s.latitude, s.longitude, fast()));
    expect(e.kind).toBe("timeout");
    expect(e.message).toBe("The National Weather Service did not answer within 0.3 s (tried 3 times).");
  });

  it("an HTTP 500 is retried, then reported with the service's own title", async () => {
    const b = loc("Broken Office");
    const e = await failure(fetchHourlyForecast(b.latitude, b.longitude, fast()));
    expect(e.kind).toBe("server");
    expect(e.message).toBe("The National Weather Service answered with an error (HTTP 500: Unexpected Problem) (tried 3 times).");
  });

  it("a malformed body is reported, and so is a well-formed body missing what the contract promises", async () => {
    const g = loc("Garbled Grid");
    const e = await failure(fetchHourlyForecast(g.latitude, g.longitude, fast()));
    expect(e.kind).toBe("malformed");
    expect(e.message).toMatch(/not valid JSON/);
    // A failure switched on for one point only, at the hourly step.
    const k = loc("Rainy Point");
    await fetch(`${base}/__fake/fail?point=${k.latitude},${k.longitude}&mode=malformed`, { method: "POST" });
    try {
      expect((await failure(fetchHourlyForecast(k.latitude, k.longitude, fast()))).kind).toBe("malformed");
    } finally {
      await fetch(`${base}/__fake/fail?point=${k.latitude},${k.longitude}&mode=ok`, { method: "POST" });
    }
    expect((await fetchHourlyForecast(k.latitude, k.longitude, fast())).hours.length).toBe(156);
  });

  it("does not follow an hourly link to another site", async () => {
    // A stand-in whose points answer links elsewhere: the client must refuse before fetching it.
    const { createServer } = await import("node:http");
    const rogue = createServer((_req, res) => {
      res.writeHead(200, { "content-type": "application/geo+json" });
      res.end(JSON.stringify({ type: "Feature", properties: { forecastHourly: "http://elsewhere.invalid/gridpoints/KBY/1,1/forecast/hourly" } }));
    });
    await new Promise<void>((r) => rogue.listen(0, "127.0.0.1", r));
    try {
      const e = await failure(fetchHourlyForecast(30, -88, { ...fast(), baseUrl: `http://127.0.0.1:${(rogue.address() as AddressInfo).port}` }));
      expect(e.kind).toBe("malformed");
      expect(e.message).toBe("The National Weather Service sent an hourly forecast link to another site (http://elsewhere.invalid); it is not followed.");
    } finally {
      rogue.closeAllConnections();
      await new Promise((r) => rogue.close(r));
    }
  });
});
