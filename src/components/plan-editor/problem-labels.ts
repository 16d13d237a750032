/**
 * Problem paths in words (pure, unit-tested in tests/unit/plan-editor-labels.test.ts). The engine and the server
 * name a field by its path in the scenario (`operations[7].rate.dist.min`, `calendar.season.winterStart`);
 * people know it by the section it sits in, the row it belongs to (the operation's name) and the field's label.
 * A path this table does not know still reads as words (camelCase split), never as a path.
 */
import { fieldLabel } from "@sim/field-labels";
import { monthName } from "@/lib/format";
import { sectionOf, toFormPath, type SectionId } from "./plan-logic";

export const SECTION_LABELS: Record<SectionId, string> = {
  sequence: "Sequence",
  stages: "Stages",
  crews: "Crews and rates",
  calendar: "Calendar and closures",
  weather: "Weather",
  traffic: "Traffic and costs",
};

/** The labels the editor shows beside each field, by the last key of its path (lower case where mid-sentence). */
const FIELD_WORDS: Record<string, string> = {
  name: "name",
  description: "description",
  id: "identifier",
  kind: "kind",
  startDate: "start date",
  targetDate: "target date",
  timeZone: "time zone",
  startStationFt: "start station (ft)",
  lengthFt: "deck length (ft)",
  packetFt: "packet length (ft)",
  lanes: "lanes",
  fromStationFt: "from station (ft)",
  toStationFt: "to station (ft)",
  probability: "chance of deeper damage",
  workDays: "work days",
  shifts: "shifts",
  startHour: "start hour",
  lengthHours: "length (h)",
  endHour: "end hour",
  lanesClosed: "lanes closed",
  dayTypes: "day types",
  closure: "closure",
  policy: "holiday policy",
  observeFederal: "observe federal holidays",
  blackoutDates: "blackout dates",
  plan: "season plan",
  winterStart: "winter starts (MM-DD)",
  winterEnd: "winter ends (MM-DD)",
  demobilizeHours: "demobilize before winter (h)",
  remobilizeHours: "remobilize after winter (h)",
  cutoffDate: "cut-off date",
  cutoffStationFt: "cut-off station (ft)",
  rate: "production rate",
  unit: "rate unit",
  dist: "production rate",
  type: "distribution",
  min: "lowest",
  mode: "most likely",
  max: "highest",
  value: "value",
  median: "median",
  sigma: "spread (sigma)",
  durationHours: "duration (h)",
  crews: "crews",
  mobilizationHours: "mobilization (h)",
  continuous: "continuous",
  discovers: "discovers deeper damage",
  gates: "weather gates",
  minTempF: "minimum temperature (°F)",
  rising: "rising temperature",
  noRain: "no rain",
  noRainHoursAfter: "no rain hours after",
  maxWindMph: "maximum wind (mph)",
  maxEvaporation: "maximum evaporation (lb/ft²/h)",
  concreteDeltaF: "concrete − air (°F)",
  from: "from",
  to: "to",
  lagFt: "lag (ft)",
  lagHours: "lag (h)",
  monthly: "monthly climate",
  tmaxMeanF: "mean high (°F)",
  tmaxSdF: "high spread (°F)",
  tminMeanF: "mean low (°F)",
  tminSdF: "low spread (°F)",
  pWetAfterDry: "wet after a dry day",
  pWetAfterWet: "wet after a wet day",
  windMeanMph: "mean wind (mph)",
  rhMean: "mean humidity (%)",
  wetTmaxShiftF: "wet-day Tmax shift (°F)",
  wetTminShiftF: "wet-day Tmin shift (°F)",
  serialCorrelation: "day-to-day temperature correlation",
  rainHoursMean: "mean rain hours on a wet day",
  fixedWetDates: "fixed wet dates",
  method: "work-zone capacity method",
  basePcPerHourPerLane: "base capacity (pc/h/ln)",
  truckPce: "truck equivalent (pc)",
  areaType: "area type",
  lateralClearanceFt: "lateral clearance (ft)",
  openRoadPcPerHourPerLane: "queue discharge, all lanes open (pc/h/ln)",
  jamDensityPcPerMiPerLane: "jam density (pc/mi/ln)",
  heavyVehicleShare: "heavy-vehicle share",
  workIntensityPcPerHourPerLane: "work intensity (pc/h/ln)",
  barrier: "barrier",
  night: "night",
  capacityVehPerHour: "capacity override (veh/h)",
  year: "dollar year",
  carPerVehHour: "value of time, car ($/veh-h)",
  truckPerVehHour: "value of time, truck ($/veh-h)",
  fieldCostPerDay: "field cost per working day ($)",
  mobilizationPerSeason: "mobilization per season ($)",
  winterProtectionPerWinter: "winter protection per winter ($)",
  incentivePerDay: "incentive per day early ($)",
  disincentivePerDay: "disincentive per day late ($)",
  weekday: "weekday demand",
  friday: "Friday demand",
  saturday: "Saturday demand",
  sunday: "Sunday demand",
  holidayPeak: "holiday-peak demand",
};

/** Keys that only group fields: "calendar.season.winterStart" reads "winter starts", not "calendar season …". */
const GROUPS = new Set(["calendar", "season", "holidays", "deck", "weather", "traffic", "costs", "valueOfTime", "demand", "discovered", "rate", "dist", "gates", "durationHours", "extraHours"]);

const upper = (s: string) => (s ? s[0].toUpperCase() + s.slice(1) : s);
const isIndex = (s: string | undefined) => s !== undefined && /^\d+$/.test(s);

/** A key this table does not list reads as the engine's own label for it (sim/field-labels.ts), else as words. */
export function humanizeKey(key: string): string {
  return FIELD_WORDS[key] ?? fieldLabel(key).toLowerCase();
}

type Values = Record<string, unknown>;
const at = (values: unknown, parts: string[]): unknown => parts.reduce<unknown>((o, k) => (o && typeof o === "object" ? (o as Values)[k] : undefined), values);
const nameAt = (values: unknown, parts: string[]): string | undefined => {
  const v = at(values, [...parts, "name"]);
  return typeof v === "string" && v.trim() ? v.trim() : undefined;
};

/** What a list element is called: the operation's or shift's name, the month, the link's ends, or "… 3". */
function rowLabel(values: unknown, list: string[], index: number): string {
  const key = list.join(".");
  const path = [...list, String(index)];
  const named = (what: string) => {
    const n = nameAt(values, path);
    return n ? `${what} “${n}”` : `${what} ${index + 1}`;
  };
  switch (key) {
    case "operations":
      return nameAt(values, path) ?? `operation ${index + 1}`;
    case "calendar.shifts":
      return named("shift");
    case "calendar.closures":
      return named("closure");
    case "calendar.closureWindows":
      return `closure window ${index + 1}`;
    case "links": {
      const ops = (at(values, ["operations"]) as Values[] | undefined) ?? [];
      const nameOf = (id: unknown) => (ops.find((o) => o?.id === id)?.name as string | undefined) ?? (typeof id === "string" ? id : "?");
      const l = at(values, path) as Values | undefined;
      return l ? `link ${nameOf(l.from)} → ${nameOf(l.to)}` : `link ${index + 1}`;
    }
    case "weather.monthly":
      return index >= 0 && index < 12 ? monthName(index + 1, true) : `month ${index + 1}`;
    case "traffic.directions":
      return named("direction");
    case "traffic.closures": {
      const id = at(values, [...path, "closure"]);
      const closures = (at(values, ["calendar", "closures"]) as Values[] | undefined) ?? [];
      const c = closures.find((x) => x?.id === id);
      return c?.name ? `closure “${String(c.name)}”` : `closure ${index + 1}`;
    }
    case "deck.survey":
      return `survey range ${index + 1}`;
    case "stages":
      return named("stage");
    default:
      return `${humanizeKey(list[list.length - 1])} ${index + 1}`;
  }
}

export interface ProblemLabel {
  section: SectionId;
  sectionLabel: string;
  /** e.g. "Placement — lowest" or "Winter starts (MM-DD)". */
  field: string;
}

/** `operations[7].rate.dist.min` with the plan's values → Crews and rates · "Placement — production rate, lowest". */
export function describeProblemPath(problemPath: string, values: unknown): ProblemLabel {
  const section = sectionOf(problemPath);
  const parts = toFormPath(problemPath).split(".").filter(Boolean);
  const rows: string[] = [];
  const fields: string[] = [];
  for (let i = 0; i < parts.length; i++) {
    const key = parts[i];
    if (isIndex(key)) continue;
    if (isIndex(parts[i + 1])) {
      const index = Number(parts[i + 1]);
      if (key === "shifts" && parts[i - 2] === "operations") fields.push(`shift ${index + 1}`);
      else if (["weekday", "friday", "saturday", "sunday", "holidayPeak"].includes(key)) fields.push(`${humanizeKey(key)} ${String(index).padStart(2, "0")}:00`);
      else if (["lanes", "lanesClosed", "dayTypes", "blackoutDates", "fixedWetDates"].includes(key)) fields.push(`${humanizeKey(key)} (entry ${index + 1})`);
      else rows.push(rowLabel(values, parts.slice(0, i + 1), index));
      i++;
      continue;
    }
    const last = i === parts.length - 1;
    if (!last && GROUPS.has(key)) continue;
    if (last || !GROUPS.has(key)) fields.push(humanizeKey(key));
  }
  // "production rate, lowest": the group that gives a leaf its meaning stays when the leaf alone is vague.
  if (["dist", "durationHours", "extraHours"].some((g) => parts.includes(g)) && fields.length && ["lowest", "most likely", "highest", "value", "median", "spread (sigma)", "distribution"].includes(fields[fields.length - 1])) {
    fields.unshift(parts.includes("durationHours") ? "duration (h)" : parts.includes("extraHours") ? "extra hours" : "production rate");
  }
  if (parts[0] === "discovered" && parts[1] === "defaultProbability") fields.splice(0, fields.length, "chance of deeper damage (default)");
  const row = rows.join(", ");
  const field = fields.join(", ");
  const text = row && field ? `${upper(row)} — ${field}` : upper(row || field || "the plan as a whole");
  return { section, sectionLabel: SECTION_LABELS[section], field: text };
}

/**
 * Messages from the engine may quote a path or a key ("must come before winterStart", "(calendar.closures[0])"):
 * those read as the field's words too.
 */
export function plainMessage(message: string, values: unknown): string {
  return message
    .replace(/^Invalid input: expected number, received (NaN|undefined|string)$/, "must be a number")
    .replace(/^Too big: expected number to be <=\s*(\S+)$/, "must be ≤ $1")
    .replace(/^Too small: expected number to be >=\s*(\S+)$/, "must be ≥ $1")
    .replace(/\b([a-z][A-Za-z]*(?:\[\d+\]|\.[a-zA-Z]+)+(?:\[\d+\]|\.[a-zA-Z]+)*)/g, (m) => (/[.[]/.test(m) && !/^(e\.g|i\.e)$/.test(m) ? describeProblemPath(m, values).field : m))
    .replace(/\b([a-z]+[A-Z][A-Za-z]*)\b/g, (m) => (FIELD_WORDS[m] ? FIELD_WORDS[m] : m));
}
