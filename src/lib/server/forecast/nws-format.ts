/**
 * The U.S. National Weather Service web API's documented JSON (the contract), read into Pourline's hourly
 * values. Sources: the service's documentation page (weather.gov/documentation/services-web-api: the
 * `/points/{lat},{lon}` look-up gives the grid's `forecastHourly` URL; a User-Agent identifying the
 * application, with contact, is required) and its OpenAPI schemas (api.weather.gov/openapi.json):
 * - `PointGeoJson`: a GeoJSON Feature whose `properties` (`Point`) carry `gridId`, `gridX`, `gridY`,
 *   `forecastHourly` (URI), `timeZone` and `relativeLocation`;
 * - `GridpointHourlyForecastGeoJson`: a Feature whose `properties` (`GridpointHourlyForecast`) carry `units`
 *   (`us` | `si`), `generatedAt`, `updateTime` and `periods[]` (`GridpointHourlyForecastPeriod`):
 *   `startTime`/`endTime` (ISO 8601 with the location's UTC offset), `temperature` (an integer with
 *   `temperatureUnit` "F" | "C", or — with the `forecast_temperature_qv` feature flag — a QuantitativeValue
 *   `{value, unitCode: "wmoUnit:degF" | "wmoUnit:degC"}`), `probabilityOfPrecipitation` and
 *   `relativeHumidity` (QuantitativeValue, `wmoUnit:percent`, `value` may be null), `windSpeed` (a string such
 *   as "10 mph", "5 to 10 mph" or "15 km/h", or — `forecast_wind_speed_qv` — a QuantitativeValue in
 *   `wmoUnit:km_h-1`, possibly with `minValue`/`maxValue`).
 * Rules of ours: a wind range counts at its upper value (the wind gate is a limit); a missing or unreadable
 * value is `null` (the board then says it cannot judge) and is counted in `gaps`; times are the location's
 * wall clock read from `startTime` itself (its date and hour, before the offset), so no time-zone table is
 * needed; a period longer than an hour fills each hour it covers; a repeated wall-clock hour (the autumn
 * daylight-saving change) keeps its first value.
 */
import { z } from "zod";

const quantitative = z.object({
  value: z.number().nullable().optional(),
  maxValue: z.number().optional(),
  minValue: z.number().optional(),
  unitCode: z.string().optional(),
});
type Quantitative = z.infer<typeof quantitative>;

export const pointSchema = z.object({
  properties: z.object({
    gridId: z.string().optional(),
    gridX: z.number().optional(),
    gridY: z.number().optional(),
    forecastHourly: z.string().min(1, "has no hourly forecast link"),
    timeZone: z.string().optional(),
    relativeLocation: z.object({ properties: z.object({ city: z.string().optional(), state: z.string().optional() }).optional() }).optional(),
  }),
});

const periodSchema = z.object({
  startTime: z.string().regex(/^\d{4}-\d{2}-\d{2}T\d{2}:\d{2}/, "startTime must be an ISO date-time"),
  endTime: z.string().optional(),
  temperature: z.union([z.number(), quantitative]).nullable().optional(),
  temperatureUnit: z.string().nullable().optional(),
  probabilityOfPrecipitation: quantitative.nullable().optional(),
  relativeHumidity: quantitative.nullable().optional(),
  windSpeed: z.union([z.string(), quantitative]).nullable().optional(),
});

export const hourlySchema = z.object({
  properties: z.object({
    units: z.string().optional(),
    generatedAt: z.string().optional(),
    updateTime: z.string().optional(),
    periods: z.array(periodSchema).min(1, "has no forecast periods"),
  }),
});

/** One hour of the location's wall clock. */
export interface ForecastHour {
  /** `YYYY-MM-DDTHH:00`, local. */
  start: string;
  tempF: number | null;
  popPct: number | null;
  rhPct: number | null;
  windMph: number | null;
}

export interface NormalizedForecast {
  hours: ForecastHour[];
  generatedAt: string | null;
  updateTime: string | null;
  /** How many hours lack each value. */
  gaps: { tempF: number; popPct: number; rhPct: number; windMph: number };
}

const MPH_PER_KMH = 1 / 1.609344;
const MPH_PER_MS = 3600 / 1609.344;

function tempF(p: z.infer<typeof periodSchema>): number | null {
  const t = p.temperature;
  if (t === null || t === undefined) return null;
  if (typeof t === "number") {
    const unit = (p.temperatureUnit ?? "F").toUpperCase();
    return unit === "C" ? (t * 9) / 5 + 32 : unit === "F" ? t : null;
  }
  if (t.value === null || t.value === undefined) return null;
  const unit = t.unitCode ?? "";
  if (/degC$/.test(unit)) return (t.value * 9) / 5 + 32;
  if (/degF$/.test(unit)) return t.value;
  return null;
}

function percent(q: Quantitative | null | undefined): number | null {
  if (!q || q.value === null || q.value === undefined) return null;
  if (q.unitCode && !/percent$/.test(q.unitCode)) return null;
  return Math.max(0, Math.min(100, q.value));
}

/** "10 mph", "5 to 10 mph", "15 km/h", "20 to 30 km/h" → mph at the upper value. */
export function windStringMph(s: string): number | null {
  const m = /^\s*(\d+(?:\.\d+)?)(?:\s*to\s*(\d+(?:\.\d+)?))?\s*(mph|km\/h|kph|m\/s|kt|knots?)\s*$/i.exec(s);
  if (!m) return null;
  const v = Number(m[2] ?? m[1]);
  const unit = m[3].toLowerCase();
  if (unit === "mph") return v;
  if (unit === "km/h" || unit === "kph") return v * MPH_PER_KMH;
  if (unit === "m/s") return v * MPH_PER_MS;
  return v * 1.150779; // knots
}

function windMph(w: z.infer<typeof periodSchema>["windSpeed"]): number | null {
  if (w === null || w === undefined) return null;
  if (typeof w === "string") return windStringMph(w);
  const v = w.maxValue ?? w.value;
  if (v === null || v === undefined) return null;
  const unit = w.unitCode ?? "";
  if (/km_h-1$/.test(unit)) return v * MPH_PER_KMH;
  if (/m_s-1$/.test(unit)) return v * MPH_PER_MS;
  if (/mi_h-1$|mph$/.test(unit)) return v;
  if (/kt$|knot/.test(unit)) return v * 1.150779;
  return null;
}

const pad = (n: number) => String(n).padStart(2, "0");

/** Wall-clock hour label `YYYY-MM-DDTHH:00` `n` hours after the wall-clock hour `start` (no time zone needed). */
export function addHours(start: string, n: number): string {
  const ms = Date.UTC(+start.slice(0, 4), +start.slice(5, 7) - 1, +start.slice(8, 10), +start.slice(11, 13)) + n * 3_600_000;
  const d = new Date(ms);
  return `${d.getUTCFullYear()}-${pad(d.getUTCMonth() + 1)}-${pad(d.getUTCDate())}T${pad(d.getUTCHours())}:00`;
}

export function normalizeHourly(body: z.infer<typeof hourlySchema>): NormalizedForecast {
  const byHour = new Map<string, ForecastHour>();
  for (const p of body.properties.periods) {
    const start = `${p.startTime.slice(0, 13)}:00`;
    const spanMs = p.endTime ? Date.parse(p.endTime) - Date.parse(p.startTime) : 3_600_000;
    const span = Number.isFinite(spanMs) && spanMs > 0 ? Math.min(24, Math.max(1, Math.round(spanMs / 3_600_000))) : 1;
    const values = { tempF: tempF(p), popPct: percent(p.probabilityOfPrecipitation), rhPct: percent(p.relativeHumidity), windMph: windMph(p.windSpeed) };
    for (let i = 0; i < span; i++) {
      const h = addHours(start, i);
      if (!byHour.has(h)) byHour.set(h, { start: h, ...values });
    }
  }
  const hours = [...byHour.values()].sort((a, b) => (a.start < b.start ? -1 : 1));
  const gaps = { tempF: 0, popPct: 0, rhPct: 0, windMph: 0 };
  for (const h of hours) for (const k of ["tempF", "popPct", "rhPct", "windMph"] as const) if (h[k] === null) gaps[k]++;
  return { hours, generatedAt: body.properties.generatedAt ?? null, updateTime: body.properties.updateTime ?? null, gaps };
}

/** The board's input: hourly arrays from 00:00 of the first forecast day, null before the first hour and in gaps. */
export function toHourlyArrays(hours: ForecastHour[]) {
  if (hours.length === 0) return null;
  const firstDate = hours[0].start.slice(0, 10);
  const origin = `${firstDate}T00:00`;
  const index = new Map(hours.map((h) => [h.start, h]));
  const last = hours[hours.length - 1].start;
  const tempF: (number | null)[] = [];
  const popPct: (number | null)[] = [];
  const rhPct: (number | null)[] = [];
  const windMph: (number | null)[] = [];
  for (let n = 0; n < 24 * 20; n++) {
    const label = addHours(origin, n);
    const h = index.get(label);
    tempF.push(h?.tempF ?? null);
    popPct.push(h?.popPct ?? null);
    rhPct.push(h?.rhPct ?? null);
    windMph.push(h?.windMph ?? null);
    if (label === last) break;
  }
  return { firstDate, tempF, popPct, rhPct, windMph };
}
