/**
 * A daily weather history as station records and weather services export it: one row a day with a date, the
 * maximum and minimum temperature, precipitation and optionally wind; any other columns are ignored. Columns
 * are found by their common names (`weather-columns.ts`); units are the ones the person picks or, on "read
 * from the file", the ones the headers state (else guessed from the values and said so). Days with a value
 * missing are skipped and counted. Before anything is fitted the monthly means are checked against what any
 * place could have ("did you mean °C?"). Converted to °F, inches and mph for `fitClimateProfile`.
 */
import type { DailyObservation } from "@sim/weather-fit";
import { readCsvRows, type RowProblem } from "./common";
import { FIELD_LABELS, mapColumns, UNIT_LABELS, type PrecipitationUnit, type TemperatureUnit, type WeatherField, type WindUnit } from "./weather-columns";
import { checkPlausible } from "./weather-plausibility";

export interface WeatherUnits {
  temperature: TemperatureUnit | "auto";
  precipitation: PrecipitationUnit | "auto";
  wind: WindUnit | "auto";
}

/** How one column of the file was read: shown to the person beside the fitted values. */
export interface ColumnReading {
  header: string;
  readAs: string;
  unit: string | null;
  /** Where the unit came from. */
  unitFrom: "chosen" | "header" | "guessed" | null;
}

export interface WeatherCsvResult {
  observations: DailyObservation[];
  problems: RowProblem[];
  columns: ColumnReading[];
  ignored: string[];
  /** Rows skipped because a needed value was empty or marked missing. */
  skipped: number;
}

// Source: exact unit definitions (1 in = 25.4 mm; 1 mile = 1.609344 km; °F = °C × 9/5 + 32; 1 m/s = 3.6 km/h).
export const cToF = (c: number) => (c * 9) / 5 + 32;
export const mmToIn = (mm: number) => mm / 25.4;
export const kmhToMph = (k: number) => k / 1.609344;
export const msToMph = (ms: number) => (ms * 3.6) / 1.609344;

// Missing-value markers of common station exports (empty, "M", -9999, NaN); "T" is a trace of precipitation.
const MISSING = /^(|m|na|n\/a|nan|null|-|--|-9999(\.0+)?|9999(\.0+)?|-999(\.0+)?)$/i;

/** ISO, slashed or compact dates, or a date-time: the day as YYYY-MM-DD, or null. */
export function readDate(raw: string): string | null {
  const s = raw.trim();
  let y: number, m: number, d: number;
  let g: RegExpMatchArray | null;
  if ((g = s.match(/^(\d{4})[-/.](\d{1,2})[-/.](\d{1,2})(?:[T ].*)?$/))) [y, m, d] = [Number(g[1]), Number(g[2]), Number(g[3])];
  else if ((g = s.match(/^(\d{4})(\d{2})(\d{2})$/))) [y, m, d] = [Number(g[1]), Number(g[2]), Number(g[3])];
  // US order, as US station exports write it (M/D/YYYY).
  else if ((g = s.match(/^(\d{1,2})\/(\d{1,2})\/(\d{4})(?: .*)?$/))) [m, d, y] = [Number(g[1]), Number(g[2]), Number(g[3])];
  else return null;
  const iso = `${y}-${String(m).padStart(2, "0")}-${String(d).padStart(2, "0")}`;
  const t = new Date(`${iso}T00:00:00Z`);
  return Number.isNaN(t.getTime()) || t.toISOString().slice(0, 10) !== iso ? null : iso;
}

function cell(raw: string | undefined, line: number, field: WeatherField, problems: RowProblem[]): number | null | undefined {
  const s = (raw ?? "").trim();
  if (MISSING.test(s)) return null;
  if (field === "precip" && /^t$/i.test(s)) return 0;
  const v = Number(s.replace(/,/g, ""));
  if (!Number.isFinite(v)) {
    problems.push({ row: line, field: FIELD_LABELS[field], message: `"${s}" is not a number` });
    return undefined;
  }
  return v;
}

/** The values' own system when no header states a unit: a warmest month averaging above 50 is °F. */
function guessTemperature(rows: { tmax: number; date: string }[]): TemperatureUnit {
  const byMonth = new Map<number, number[]>();
  for (const r of rows) {
    const mo = Number(r.date.slice(5, 7));
    byMonth.set(mo, [...(byMonth.get(mo) ?? []), r.tmax]);
  }
  const warmest = Math.max(...[...byMonth.values()].map((v) => v.reduce((a, b) => a + b, 0) / v.length));
  return warmest > 50 ? "F" : "C";
}

export function parseWeatherCsv(text: string, units: WeatherUnits): WeatherCsvResult {
  const table = readCsvRows(text);
  const problems = [...table.problems];
  const map = mapColumns(table.headers);
  const empty = { observations: [], columns: [], ignored: map.ignored, skipped: 0 };
  for (const f of ["date", "tmax", "tmin", "precip"] as const) {
    if (map.index[f] === undefined) {
      problems.push({ row: 1, field: FIELD_LABELS[f], message: `no column holds the ${FIELD_LABELS[f]} (looked for names such as ${EXAMPLES[f]}; found: ${table.headers.join(", ") || "nothing"})` });
    }
  }
  if (problems.some((p) => p.row === 1)) return { ...empty, problems };

  const raw: { line: number; date: string; tmax: number; tmin: number; precip: number; wind?: number }[] = [];
  const seen = new Map<string, number>();
  let skipped = 0;
  for (const { line, cells } of table.rows) {
    const before = problems.length;
    const get = (f: WeatherField) => (map.index[f] === undefined ? undefined : cells[map.index[f]!]);
    const date = readDate(get("date") ?? "");
    if (!date) problems.push({ row: line, field: "date", message: `"${(get("date") ?? "").trim()}" is not a date (YYYY-MM-DD, YYYY/MM/DD or M/D/YYYY)` });
    else if (seen.has(date)) problems.push({ row: line, field: "date", message: `${date} is repeated (first on row ${seen.get(date)})` });
    else seen.set(date, line);
    const tmax = cell(get("tmax"), line, "tmax", problems);
    const tmin = cell(get("tmin"), line, "tmin", problems);
    const precip = cell(get("precip"), line, "precip", problems);
    const wind = map.index.wind === undefined ? null : cell(get("wind"), line, "wind", problems);
    if (problems.length > before) continue;
    if (tmax === null || tmin === null || precip === null) {
      skipped++;
      continue;
    }
    if (tmin! > tmax!) problems.push({ row: line, field: FIELD_LABELS.tmin, message: `${tmin} is above the maximum ${tmax}` });
    if (precip! < 0) problems.push({ row: line, field: FIELD_LABELS.precip, message: `${precip} is below 0` });
    if (wind !== null && wind !== undefined && wind < 0) problems.push({ row: line, field: FIELD_LABELS.wind, message: `${wind} is below 0` });
    if (problems.length > before) continue;
    raw.push({ line, date: date!, tmax: tmax!, tmin: tmin!, precip: precip!, ...(wind !== null && wind !== undefined ? { wind } : {}) });
  }
  if (raw.length === 0 && problems.length === 0) problems.push({ row: 2, field: "(file)", message: `no day has all of date, maximum, minimum and precipitation (${skipped} rows had a value missing)` });
  if (problems.length) return { ...empty, problems, skipped };

  // Units: chosen, else stated by the header, else guessed from the values.
  const from = <U extends string>(f: WeatherField, chosen: U | "auto", guess: () => U): { unit: U; from: ColumnReading["unitFrom"] } => {
    if (chosen !== "auto") return { unit: chosen, from: "chosen" };
    const h = map.headerUnits[f] as U | undefined;
    return h ? { unit: h, from: "header" } : { unit: guess(), from: "guessed" };
  };
  const temp = from<TemperatureUnit>("tmax", units.temperature, () => (map.headerUnits.tmin as TemperatureUnit | undefined) ?? guessTemperature(raw));
  const tminUnit = units.temperature === "auto" && map.headerUnits.tmin ? (map.headerUnits.tmin as TemperatureUnit) : temp.unit;
  const precip = from<PrecipitationUnit>("precip", units.precipitation, () => (temp.unit === "C" ? "mm" : "in"));
  const windHeader = map.index.wind === undefined ? "" : table.headers[map.index.wind].trim().toLowerCase();
  const wind = from<WindUnit>("wind", units.wind, () => (temp.unit === "F" ? "mph" : /^(awnd|wdsp|ws)$/.test(windHeader) ? "ms" : "kmh"));
  const toF = (u: TemperatureUnit) => (u === "C" ? cToF : (x: number) => x);
  const windToMph = wind.unit === "kmh" ? kmhToMph : wind.unit === "ms" ? msToMph : (x: number) => x;
  const observations: DailyObservation[] = raw
    .map((r) => ({
      date: r.date,
      tmaxF: toF(temp.unit)(r.tmax),
      tminF: toF(tminUnit)(r.tmin),
      precipIn: precip.unit === "mm" ? mmToIn(r.precip) : r.precip,
      ...(r.wind !== undefined ? { windMph: windToMph(r.wind) } : {}),
    }))
    .sort((a, b) => (a.date < b.date ? -1 : 1));

  const columns: ColumnReading[] = (["date", "tmax", "tmin", "precip", "wind"] as const)
    .filter((f) => map.index[f] !== undefined)
    .map((f) => {
      const u = f === "date" ? null : f === "tmax" ? temp : f === "tmin" ? { unit: tminUnit, from: temp.from } : f === "precip" ? precip : wind;
      return { header: table.headers[map.index[f]!].trim(), readAs: FIELD_LABELS[f], unit: u ? UNIT_LABELS[u.unit] : null, unitFrom: u ? u.from : null };
    });
  const ignored = [...map.ignored, ...map.duplicates];
  const plausibility = checkPlausible(observations, { temperature: temp.unit, precipitation: precip.unit, wind: wind.unit });
  return { observations: plausibility.length ? [] : observations, problems: plausibility, columns, ignored, skipped };
}

const EXAMPLES: Record<"date" | "tmax" | "tmin" | "precip", string> = {
  date: "DATE or date",
  tmax: "TMAX, tmax, temp_max or Max Temp",
  tmin: "TMIN, tmin, temp_min or Min Temp",
  precip: "PRCP, precip or precipitation",
};
