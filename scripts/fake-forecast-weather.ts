/**
 * The invented weather the local forecast fake serves (scripts/fake-forecast.ts). Each location has a week
 * described day by day from the location's "today" (day 0): an ordinary spring day, a cold snap (a hard-freeze
 * night and a day that stays below 45 °F), a rainy day, or an evaporation-risk afternoon (hot, dry and windy).
 * Values are hourly, by local wall-clock hour; nothing here is a real forecast.
 */
export type DayKind = "mild" | "coldSnap" | "rainy" | "evaporation";

export interface HourWeather {
  tempF: number;
  popPct: number;
  rhPct: number;
  windMph: number;
}

export interface FakeLocation {
  latitude: number;
  longitude: number;
  name: string;
  office: string;
  gridX: number;
  gridY: number;
  week: DayKind[];
  /** Answers in SI units (°C, km/h) and as QuantitativeValue objects, as the service does on request. */
  metric?: boolean;
  /** Leaves values out: every 5th hour has no humidity, every 7th no rain chance, every 11th no wind. */
  gaps?: boolean;
  /** Always fails this way. */
  fails?: FailMode;
}

export type FailMode = "timeout" | "500" | "malformed";

const DAY = { mild: { min: 48, max: 66 }, coldSnap: { min: 26, max: 41 }, rainy: { min: 50, max: 58 }, evaporation: { min: 70, max: 96 } } as const;

/** Minimum at 06:00, maximum at 15:00, cosine in between (the same shape the engine assumes). */
function curve(min: number, max: number, prevMax: number, nextMin: number, hour: number): number {
  if (hour >= 6 && hour <= 15) return min + ((max - min) * (1 - Math.cos((Math.PI * (hour - 6)) / 9))) / 2;
  if (hour > 15) return nextMin + ((max - nextMin) * (1 + Math.cos((Math.PI * (hour - 15)) / 15))) / 2;
  return min + ((prevMax - min) * (1 + Math.cos((Math.PI * (hour + 9)) / 15))) / 2;
}

export function hourWeather(week: DayKind[], day: number, hour: number): HourWeather {
  const kind = (d: number) => week[Math.max(0, Math.min(week.length - 1, d))];
  const today = DAY[kind(day)];
  const tempF = Math.round(curve(today.min, today.max, DAY[kind(day - 1)].max, DAY[kind(day + 1)].min, hour));
  const k = kind(day);
  const afternoon = hour >= 12 && hour <= 18;
  return {
    tempF,
    popPct: k === "rainy" && hour >= 6 && hour <= 20 ? 80 : k === "coldSnap" ? 5 : 10,
    rhPct: k === "evaporation" && afternoon ? 15 : k === "rainy" ? 92 : 60,
    windMph: k === "evaporation" && afternoon ? 22 : k === "coldSnap" ? 14 : 8,
  };
}

/** Invented points. The first is the demo project's; the failing ones exist so the failure paths are tested. */
export const FAKE_LOCATIONS: FakeLocation[] = [
  { latitude: 30.25, longitude: -88.1, name: "Kestrel Bay", office: "KBY", gridX: 40, gridY: 60, week: ["mild", "coldSnap", "mild", "rainy", "mild", "evaporation", "mild", "mild"] },
  // The seeded south-approach project (scripts/seed.ts), next cell to the causeway's: the same week.
  { latitude: 30.22, longitude: -88.12, name: "Kestrel Bay south approach", office: "KBY", gridX: 39, gridY: 60, week: ["mild", "coldSnap", "mild", "rainy", "mild", "evaporation", "mild", "mild"] },
  { latitude: 30.3, longitude: -88.2, name: "Cold Snap Flats", office: "KBY", gridX: 41, gridY: 60, week: ["mild", "coldSnap", "coldSnap", "mild", "mild", "mild", "mild", "mild"] },
  { latitude: 30.35, longitude: -88.3, name: "Rainy Point", office: "KBY", gridX: 42, gridY: 60, week: ["mild", "rainy", "rainy", "mild", "mild", "mild", "mild", "mild"] },
  { latitude: 30.4, longitude: -88.4, name: "Dry Wind Mesa", office: "KBY", gridX: 43, gridY: 60, week: ["evaporation", "evaporation", "mild", "mild", "mild", "mild", "mild", "mild"] },
  { latitude: 30.45, longitude: -88.5, name: "Metric Landing", office: "KBY", gridX: 44, gridY: 60, week: ["mild", "coldSnap", "mild", "mild", "mild", "mild", "mild", "mild"], metric: true },
  { latitude: 30.5, longitude: -88.6, name: "Patchy Ridge", office: "KBY", gridX: 45, gridY: 60, week: ["mild", "mild", "mild", "mild", "mild", "mild", "mild", "mild"], gaps: true },
  { latitude: 31, longitude: -88, name: "Silent Hollow", office: "KBY", gridX: 50, gridY: 60, week: ["mild"], fails: "timeout" },
  { latitude: 31.1, longitude: -88, name: "Broken Office", office: "KBY", gridX: 51, gridY: 60, week: ["mild"], fails: "500" },
  { latitude: 31.2, longitude: -88, name: "Garbled Grid", office: "KBY", gridX: 52, gridY: 60, week: ["mild"], fails: "malformed" },
];
