/**
 * The local stand-in for the National Weather Service web API (development and tests only), on 127.0.0.1:
 * FORECAST_FAKE_PORT (default 2700). It answers in the service's documented GeoJSON format (see
 * src/lib/server/forecast/nws-format.ts for the fields and their sources):
 * - `GET /points/{lat},{lon}`: a `Point` feature whose `forecastHourly` links back here; an unknown point is a
 *   404 problem document, as the service answers outside its area;
 * - `GET /gridpoints/{office}/{x},{y}/forecast/hourly`: 156 one-hour periods from the current hour, wall-clock
 *   times in FORECAST_FAKE_TIME_ZONE (default America/Chicago) with their UTC offset; `?units=si` (or a
 *   metric location) answers in °C and km/h as QuantitativeValue objects.
 * The weather of each invented location is in ./fake-forecast-weather.ts. Failing on request, per point so
 * tests do not disturb each other: `POST /__fake/fail?point=lat,lon&mode=timeout|500|malformed|ok`
 * (timeout = no answer for 60 s), besides the locations that always fail. `GET /__fake/requests` counts
 * the requests per path (tests check the cache with it).
 * Run: node_modules/.bin/tsx scripts/fake-forecast.ts
 */
import { createServer, type IncomingMessage, type Server, type ServerResponse } from "node:http";
import { pathToFileURL } from "node:url";
import { FAKE_LOCATIONS, hourWeather, type FailMode, type FakeLocation } from "./fake-forecast-weather";

const PERIODS = 156;

interface Wall {
  y: number;
  m: number;
  d: number;
  h: number;
  offsetMin: number;
}

/** The wall clock of `zone` at instant `ms`, with its UTC offset (Intl, no time-zone table of our own). */
function wallClock(ms: number, zone: string): Wall {
  const parts = Object.fromEntries(
    new Intl.DateTimeFormat("en-US", { timeZone: zone, hourCycle: "h23", year: "numeric", month: "2-digit", day: "2-digit", hour: "2-digit" })
      .formatToParts(new Date(ms))
      .map((p) => [p.type, p.value]),
  );
  const w = { y: +parts.year, m: +parts.month, d: +parts.day, h: +parts.hour };
  const asUtc = Date.UTC(w.y, w.m - 1, w.d, w.h);
  const hourStart = Math.floor(ms / 3_600_000) * 3_600_000;
  return { ...w, offsetMin: Math.round((asUtc - hourStart) / 60_000) };
}

const pad = (n: number) => String(Math.abs(n)).padStart(2, "0");
function isoLocal(w: Wall): string {
  const sign = w.offsetMin < 0 ? "-" : "+";
  const off = Math.abs(w.offsetMin);
  return `${w.y}-${pad(w.m)}-${pad(w.d)}T${pad(w.h)}:00:00${sign}${pad(Math.floor(off / 60))}:${pad(off % 60)}`;
}
const dayNumber = (w: Wall) => Math.floor(Date.UTC(w.y, w.m - 1, w.d) / 86_400_000);

const key = (lat: number, lon: number) => `${Math.round(lat * 1e4) / 1e4},${Math.round(lon * 1e4) / 1e4}`;

export function hourlyBody(loc: FakeLocation, now: number, zone: string, si: boolean) {
  const first = Math.floor(now / 3_600_000) * 3_600_000;
  const today = dayNumber(wallClock(now, zone));
  const periods = [];
  for (let i = 0; i < PERIODS; i++) {
    const w = wallClock(first + i * 3_600_000, zone);
    const end = wallClock(first + (i + 1) * 3_600_000, zone);
    const x = hourWeather(loc.week, dayNumber(w) - today, w.h);
    const gap = (n: number) => loc.gaps === true && i % n === n - 1;
    const tempC = Math.round((((x.tempF - 32) * 5) / 9) * 10) / 10;
    const windKmh = Math.round(x.windMph * 1.609344);
    periods.push({
      number: i + 1,
      name: "",
      startTime: isoLocal(w),
      endTime: isoLocal(end),
      isDaytime: w.h >= 6 && w.h < 18,
      ...(si
        ? { temperature: { unitCode: "wmoUnit:degC", value: tempC }, windSpeed: { unitCode: "wmoUnit:km_h-1", value: windKmh } }
        : { temperature: x.tempF, temperatureUnit: "F", windSpeed: gap(11) ? "" : `${Math.round(x.windMph)} mph` }),
      temperatureTrend: null,
      probabilityOfPrecipitation: { unitCode: "wmoUnit:percent", value: gap(7) ? null : x.popPct },
      dewpoint: { unitCode: "wmoUnit:degC", value: tempC - 5 },
      relativeHumidity: { unitCode: "wmoUnit:percent", value: gap(5) ? null : x.rhPct },
      windDirection: "S",
      shortForecast: x.popPct >= 50 ? "Rain Likely" : "Partly Cloudy",
      detailedForecast: "",
    });
  }
  const generated = new Date(first).toISOString().replace(/\.\d{3}Z$/, "+00:00");
  return {
    "@context": ["https://geojson.org/geojson-ld/geojson-context.jsonld", { "@version": "1.1", wx: "https://api.weather.gov/ontology#" }],
    type: "Feature",
    geometry: { type: "Polygon", coordinates: [[[loc.longitude, loc.latitude], [loc.longitude + 0.02, loc.latitude], [loc.longitude + 0.02, loc.latitude + 0.02], [loc.longitude, loc.latitude]]] },
    properties: { units: si ? "si" : "us", forecastGenerator: "HourlyForecastGenerator", generatedAt: generated, updateTime: generated, validTimes: `${generated}/P7DT1H`, elevation: { unitCode: "wmoUnit:m", value: 3 }, periods },
  };
}

function pointBody(loc: FakeLocation, base: string, zone: string) {
  const grid = `${base}/gridpoints/${loc.office}/${loc.gridX},${loc.gridY}`;
  return {
    "@context": ["https://geojson.org/geojson-ld/geojson-context.jsonld"],
    id: `${base}/points/${key(loc.latitude, loc.longitude)}`,
    type: "Feature",
    geometry: { type: "Point", coordinates: [loc.longitude, loc.latitude] },
    properties: {
      "@id": `${base}/points/${key(loc.latitude, loc.longitude)}`,
      "@type": "wx:Point",
      cwa: loc.office,
      forecastOffice: `${base}/offices/${loc.office}`,
      gridId: loc.office,
      gridX: loc.gridX,
      gridY: loc.gridY,
      forecast: `${grid}/forecast`,
      forecastHourly: `${grid}/forecast/hourly`,
      forecastGridData: grid,
      observationStations: `${grid}/stations`,
      relativeLocation: { type: "Feature", geometry: { type: "Point", coordinates: [loc.longitude, loc.latitude] }, properties: { city: loc.name, state: "ZZ", distance: { unitCode: "wmoUnit:m", value: 0 }, bearing: { unitCode: "wmoUnit:degree_(angle)", value: 0 } } },
      timeZone: zone,
      radarStation: "KBYX",
    },
  };
}

function send(res: ServerResponse, status: number, body: unknown, type = "application/geo+json") {
  res.writeHead(status, { "content-type": type, "cache-control": "public, max-age=3600" });
  res.end(typeof body === "string" ? body : JSON.stringify(body));
}
const problem = (res: ServerResponse, status: number, title: string, detail: string) =>
  send(res, status, { correlationId: "fake", title, type: "https://api.weather.gov/problems/" + title.replace(/\s+/g, ""), status, detail, instance: "https://api.weather.gov/requests/fake" }, "application/problem+json");

export function createFakeForecast(opts: { now?: () => number; timeZone?: string } = {}): Server {
  const now = opts.now ?? (() => Date.now());
  const zone = opts.timeZone ?? process.env.FORECAST_FAKE_TIME_ZONE ?? "America/Chicago";
  const byPoint = new Map(FAKE_LOCATIONS.map((l) => [key(l.latitude, l.longitude), l]));
  const byGrid = new Map(FAKE_LOCATIONS.map((l) => [`${l.office}/${l.gridX},${l.gridY}`, l]));
  const failing = new Map<string, FailMode>();
  const counts = new Map<string, number>();
  const held = new Set<ServerResponse>();

  const fail = (res: ServerResponse, mode: FailMode) => {
    if (mode === "500") return problem(res, 500, "Unexpected Problem", "An unexpected problem has occurred.");
    if (mode === "malformed") return send(res, 200, '{"type":"Feature","properties":{"periods":[{"startTime":"2026-');
    held.add(res); // timeout: say nothing for a minute
    const timer = setTimeout(() => { held.delete(res); res.destroy(); }, 60_000);
    res.on("close", () => { clearTimeout(timer); held.delete(res); });
  };

  const server = createServer((req: IncomingMessage, res: ServerResponse) => {
    const url = new URL(req.url ?? "/", "http://fake");
    const base = `http://${req.headers.host ?? "127.0.0.1"}`;
    counts.set(url.pathname, (counts.get(url.pathname) ?? 0) + 1);
    if (req.method === "POST" && url.pathname === "/__fake/fail") {
      const [lat, lon] = (url.searchParams.get("point") ?? "").split(",").map(Number);
      const mode = url.searchParams.get("mode");
      if (mode === "ok") failing.delete(key(lat, lon));
      else if (mode === "timeout" || mode === "500" || mode === "malformed") failing.set(key(lat, lon), mode);
      else return send(res, 400, { error: "mode must be timeout, 500, malformed or ok" }, "application/json");
      return send(res, 200, { ok: true }, "application/json");
    }
    if (url.pathname === "/__fake/requests") return send(res, 200, Object.fromEntries(counts), "application/json");
    if (!req.headers["user-agent"]) return problem(res, 403, "Forbidden", "A User-Agent header is required.");
    const point = /^\/points\/(-?\d+(?:\.\d+)?),(-?\d+(?:\.\d+)?)$/.exec(url.pathname);
    if (point) {
      const k = key(+point[1], +point[2]);
      const loc = byPoint.get(k);
      if (!loc) return problem(res, 404, "Data Unavailable For Requested Point", `Unable to provide data for requested point ${k}`);
      const mode = failing.get(k) ?? loc.fails;
      if (mode) return fail(res, mode);
      return send(res, 200, pointBody(loc, base, zone));
    }
    const grid = /^\/gridpoints\/([A-Z]{3})\/(\d+),(\d+)\/forecast\/hourly$/.exec(url.pathname);
    if (grid) {
      const loc = byGrid.get(`${grid[1]}/${grid[2]},${grid[3]}`);
      if (!loc) return problem(res, 404, "Not Found", "No such grid point.");
      const mode = failing.get(key(loc.latitude, loc.longitude));
      if (mode) return fail(res, mode);
      return send(res, 200, hourlyBody(loc, now(), zone, loc.metric === true || url.searchParams.get("units") === "si"));
    }
    return problem(res, 404, "Not Found", "Not a path of this fake.");
  });
  server.on("close", () => held.forEach((r) => r.destroy()));
  return server;
}

if (process.argv[1] && import.meta.url === pathToFileURL(process.argv[1]).href) {
  const port = Number(process.env.FORECAST_FAKE_PORT || 2700);
  const server = createFakeForecast();
  server.on("error", (e) => console.error(`[fake-forecast] ${e.message}`));
  server.listen(port, "127.0.0.1", () => console.log(`fake forecast service listening on ${port}`));
  for (const sig of ["SIGINT", "SIGTERM"] as const) process.on(sig, () => { server.closeAllConnections(); server.close(() => process.exit(0)); });
}
