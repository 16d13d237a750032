/**
 * Which column of a daily weather history is which, and in what unit. Station records name their columns many
 * ways (`TMAX`, `temp_max`, `Max Temp (°F)`, `temperature_2m_max (°C)`, `PRCP`, `precipitation_sum (mm)`,
 * `AWND`, `wind_speed_10m_max (km/h)` …): a header is lower-cased, its unit (in brackets or as a suffix) taken
 * off, and the rest matched against the common names below. Columns that match nothing (station, name,
 * snow, weather type …) are ignored and listed as such, so the person sees how the file was read.
 */

export type TemperatureUnit = "F" | "C";
export type PrecipitationUnit = "in" | "mm";
export type WindUnit = "mph" | "kmh" | "ms";
export type WeatherField = "date" | "tmax" | "tmin" | "precip" | "wind";

export const FIELD_LABELS: Record<WeatherField, string> = {
  date: "date",
  tmax: "daily maximum temperature",
  tmin: "daily minimum temperature",
  precip: "daily precipitation",
  wind: "daily mean wind speed",
};

export const UNIT_LABELS: Record<TemperatureUnit | PrecipitationUnit | WindUnit, string> = {
  F: "°F",
  C: "°C",
  in: "inches",
  mm: "millimetres",
  mph: "mph",
  kmh: "km/h",
  ms: "m/s",
};

// Names after normalising (lower case, unit removed, every other character run → "_"); common practice in
// station exports and weather APIs, no published source.
const NAMES: Record<WeatherField, RegExp> = {
  date: /^(date|day|obs_?date|observation_?date|date_?time|time|valid|local_?date)$/,
  tmax: /^(tmax|tx|max_?t|temp_?max|t_?max|max_?temp(erature)?|maximum_?temp(erature)?|temperature_?max(imum)?|temperature_2m_max|high(_?temp(erature)?)?|max_?air_?temp(erature)?|daily_?max(imum)?_?temp(erature)?)$/,
  tmin: /^(tmin|tn|min_?t|temp_?min|t_?min|min_?temp(erature)?|minimum_?temp(erature)?|temperature_?min(imum)?|temperature_2m_min|low(_?temp(erature)?)?|min_?air_?temp(erature)?|daily_?min(imum)?_?temp(erature)?)$/,
  precip: /^(prcp|precip|precipitation|precipitation_?sum|precipitation_?total|total_?precip(itation)?|rain|rainfall|rain_?sum|ppt|pcp|prec)$/,
  wind: /^(awnd|wind|wind_?speed|windspeed|avg_?wind(_?speed)?|average_?wind(_?speed)?|mean_?wind(_?speed)?|wind_?speed_?(mean|avg)|wind_speed_10m_(mean|max)|wdsp|ws)$/,
};

const UNIT_WORDS: Array<[RegExp, TemperatureUnit | PrecipitationUnit | WindUnit]> = [
  [/^(°|º|deg_?|degrees_?)?f(ahrenheit)?$/, "F"],
  [/^(°|º|deg_?|degrees_?)?c(elsius)?$/, "C"],
  [/^(in|inch|inches)$/, "in"],
  [/^(mm|millimet(er|re)s?)$/, "mm"],
  [/^(mph|mi_?h|miles_?per_?hour)$/, "mph"],
  [/^(km_?h|kmh|kph|km_?hr)$/, "kmh"],
  [/^(m_?s|mps|m_?s_?1)$/, "ms"],
];

const unitOfWord = (w: string) => UNIT_WORDS.find(([re]) => re.test(w))?.[1];

const squash = (s: string) => s.toLowerCase().replace(/[°º]/g, "°").replace(/[^a-z0-9°]+/g, "_").replace(/^_+|_+$/g, "");

/** A header's field and the unit it states, if any: "Max Temp (°F)" → tmax, F; "tmax_c" → tmax, C. */
export function readHeader(header: string): { field: WeatherField | null; unit: TemperatureUnit | PrecipitationUnit | WindUnit | null } {
  let name = header.trim();
  let unit: ReturnType<typeof unitOfWord> = undefined;
  const bracket = name.match(/^(.*?)[([{]\s*([^)\]}]*)\s*[)\]}]\s*$/);
  if (bracket) {
    name = bracket[1];
    unit = unitOfWord(squash(bracket[2]).replace(/^_+/, ""));
  }
  let key = squash(name);
  if (!unit) {
    // A unit written as the last word: "tmax_c", "precip_mm", "wind_kmh", "temp max F".
    const m = key.match(/^(.*)_(°?[a-z0-9]+(?:_[a-z0-9]+)?)$/);
    if (m) {
      const u = unitOfWord(m[2]);
      if (u && fieldOf(m[1])) {
        key = m[1];
        unit = u;
      }
    }
  }
  return { field: fieldOf(key), unit: unit ?? null };
}

function fieldOf(key: string): WeatherField | null {
  for (const f of Object.keys(NAMES) as WeatherField[]) if (NAMES[f].test(key)) return f;
  return null;
}

const UNIT_KIND: Record<string, "temperature" | "precipitation" | "wind"> = { F: "temperature", C: "temperature", in: "precipitation", mm: "precipitation", mph: "wind", kmh: "wind", ms: "wind" };
const FIELD_KIND: Partial<Record<WeatherField, "temperature" | "precipitation" | "wind">> = { tmax: "temperature", tmin: "temperature", precip: "precipitation", wind: "wind" };

export interface ColumnMap {
  /** Column index per field read (the first matching column wins). */
  index: Partial<Record<WeatherField, number>>;
  /** Units stated by the headers, per field. */
  headerUnits: Partial<Record<WeatherField, string>>;
  ignored: string[];
  /** Headers that name a field already taken by an earlier column. */
  duplicates: string[];
}

export function mapColumns(headers: string[]): ColumnMap {
  const map: ColumnMap = { index: {}, headerUnits: {}, ignored: [], duplicates: [] };
  headers.forEach((h, i) => {
    const { field, unit } = readHeader(h);
    if (!field) return void (h.trim() && map.ignored.push(h.trim()));
    if (map.index[field] !== undefined) return void map.duplicates.push(h.trim());
    map.index[field] = i;
    if (unit && UNIT_KIND[unit] === FIELD_KIND[field]) map.headerUnits[field] = unit;
  });
  return map;
}
