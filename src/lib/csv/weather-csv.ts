/**
 * A daily weather history: `date, tmax, tmin, precip[, wind]`, one row a day, in the units the uploader states.
 * Converted to °F, inches and mph for `fitClimateProfile` (sim/weather-fit).
 */
import type { DailyObservation } from "@sim/weather-fit";
import { numberCell, readCsv, type RowProblem } from "./common";

export interface WeatherUnits {
  temperature: "F" | "C";
  precipitation: "in" | "mm";
  wind: "mph" | "kmh";
}

// Source: exact unit definitions (1 in = 25.4 mm; 1 mile = 1.609344 km; °F = °C × 9/5 + 32).
export const cToF = (c: number) => (c * 9) / 5 + 32;
export const mmToIn = (mm: number) => mm / 25.4;
export const kmhToMph = (k: number) => k / 1.609344;

export function parseWeatherCsv(text: string, units: WeatherUnits): { observations: DailyObservation[]; problems: RowProblem[] } {
  const table = readCsv(text, ["date", "tmax", "tmin", "precip"], ["wind"]);
  const problems = [...table.problems];
  if (problems.some((p) => p.row === 1)) return { observations: [], problems };
  const toF = units.temperature === "C" ? cToF : (x: number) => x;
  const seen = new Map<string, number>();
  const observations: DailyObservation[] = [];
  for (const { line, values } of table.rows) {
    const before = problems.length;
    const date = values.date;
    if (!/^\d{4}-\d{2}-\d{2}$/.test(date) || Number.isNaN(new Date(`${date}T00:00:00Z`).getTime()) || new Date(`${date}T00:00:00Z`).toISOString().slice(0, 10) !== date) {
      problems.push({ row: line, field: "date", message: `"${date}" is not a date YYYY-MM-DD` });
    } else if (seen.has(date)) {
      problems.push({ row: line, field: "date", message: `${date} is repeated (first on row ${seen.get(date)})` });
    } else seen.set(date, line);
    const tlim = units.temperature === "C" ? { min: -60, max: 60 } : { min: -80, max: 140 };
    const tmax = numberCell(values.tmax, line, "tmax", problems, tlim);
    const tmin = numberCell(values.tmin, line, "tmin", problems, tlim);
    const precip = numberCell(values.precip, line, "precip", problems, { min: 0, max: units.precipitation === "mm" ? 1000 : 40 });
    const wind = numberCell(values.wind, line, "wind", problems, { min: 0, max: 200, optional: true });
    if (tmax !== undefined && tmin !== undefined && tmin > tmax) problems.push({ row: line, field: "tmin", message: `${tmin} is above tmax ${tmax}` });
    if (problems.length > before) continue;
    observations.push({
      date,
      tmaxF: toF(tmax!),
      tminF: toF(tmin!),
      precipIn: units.precipitation === "mm" ? mmToIn(precip!) : precip!,
      ...(wind !== undefined ? { windMph: units.wind === "kmh" ? kmhToMph(wind) : wind } : {}),
    });
  }
  return { observations, problems };
}
