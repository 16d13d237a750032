/**
 * Field paths in words: `definition.deck.survey` → "Deck › Survey ranges", `operations[3].closure` →
 * "Operation 4 › Closure". Every refused request names its fields this way beside the path, so a person
 * reads which field is wrong without knowing the format. Unknown keys fall back to their words
 * (`tmaxMeanF` → "Tmax mean F").
 */

/** key → label, or [label of the whole list, label of one item]. */
const LABELS: Record<string, string | [string, string]> = {
  "(body)": "Request body",
  "(root)": "Whole request",
  "(entry)": "Entry",
  schemaVersion: "Format version",
  name: "Name",
  description: "Description",
  startDate: "Start date",
  targetDate: "Target date",
  timeZone: "Time zone",
  deck: "Deck",
  startStationFt: "Start station",
  structureName: "Structure",
  region: "Region",
  deckLengthFt: "Deck length",
  lengthFt: "Length",
  packetFt: "Packet length",
  lanes: ["Lanes", "Lane"],
  lanesClosed: ["Lanes closed", "Lane closed"],
  survey: ["Survey ranges", "Survey range"],
  fromStationFt: "From station",
  toStationFt: "To station",
  probability: "Probability",
  discovered: ["Discovered conditions", "Discovered condition"],
  defaultProbability: "Default probability",
  extraHours: "Extra hours",
  calendar: "Calendar",
  shifts: ["Shifts", "Shift"],
  startHour: "Start hour",
  endHour: "End hour",
  lengthHours: "Length (hours)",
  workDays: ["Work days", "Work day"],
  closures: ["Closures", "Closure"],
  setupHours: "Set-up hours",
  takedownHours: "Take-down hours",
  closureWindows: ["Closure windows", "Closure window"],
  dayTypes: ["Day types", "Day type"],
  holidays: "Holidays",
  policy: "Policy",
  observeFederal: "Federal holidays",
  blackoutDates: ["Blackout dates", "Blackout date"],
  standDownStartHour: "Stand-down start hour",
  standDownThroughMonday: "Stand down through Monday",
  season: "Season",
  plan: "Plan",
  winterStart: "Winter start",
  winterEnd: "Winter end",
  demobilizeHours: "Demobilization hours",
  remobilizeHours: "Remobilization hours",
  cutoffDate: "Cut-off date",
  cutoffStationFt: "Cut-off station",
  operations: ["Operations", "Operation"],
  id: "Id",
  kind: "Kind",
  crews: "Crews",
  rate: "Production rate",
  unit: "Unit",
  dist: "Distribution",
  closure: "Closure",
  mobilizationHours: "Mobilization hours",
  continuous: "Continuous",
  discovers: "Discovers conditions",
  gates: "Weather gates",
  minTempF: "Minimum temperature",
  maxTempF: "Maximum temperature",
  protectAfter: "Protection after a pour",
  countAboveF: "Count only hours above",
  maxWindMph: "Maximum wind",
  maxEvaporation: "Maximum evaporation",
  durationHours: "Duration",
  links: ["Links", "Link"],
  stages: ["Stages", "Stage"],
  standingLanesClosed: ["Lanes behind barrier", "Lane behind barrier"],
  after: "Follows stage",
  stage: "Stage",
  when: "Starts when",
  capacityVehPerHour: "Capacity override (veh/h)",
  from: "From",
  to: "To",
  lagFt: "Distance lag",
  lagHours: "Time lag",
  weather: "Weather",
  monthly: ["Months", "Month"],
  fixedWetDates: ["Fixed wet dates", "Fixed wet date"],
  tmaxMeanF: "Mean daily high",
  tmaxSdF: "Daily high, standard deviation",
  tminMeanF: "Mean daily low",
  tminSdF: "Daily low, standard deviation",
  pWetAfterDry: "Chance of rain after a dry day",
  pWetAfterWet: "Chance of rain after a wet day",
  windMeanMph: "Mean wind",
  rhMean: "Mean relative humidity",
  traffic: "Traffic",
  directions: ["Directions", "Direction"],
  demand: "Demand",
  queueLimit: "Queue limit",
  costs: "Costs",
  definition: "Scenario",
  changeNote: "Change note",
  version: "Version",
  seed: "Seed",
  iterations: "Iterations",
  scenarioVersion: "Scenario version",
  summary: "Run summary",
  durationMs: "Duration",
  label: "Label",
  expiresInDays: "Days until it expires",
  emailTo: ["E-mail addresses", "E-mail address"],
  email: "E-mail",
  role: "Role",
  password: "Password",
  currentPassword: "Current password",
  newPassword: "New password",
  confirm: "New password again",
  title: "Title",
  archived: "Archived",
  planScenarioId: "Plan of record",
  forecastAlerts: "Forecast e-mails",
  dailyReforecastHour: "Daily re-forecast hour",
  closureWeeklyDay: "Weekly closure e-mail day",
  closureWeeklyHour: "Weekly closure e-mail hour",
  deleted: "Deleted shifts in the export",
  part: "Part of the export",
  of: "Run the calendar is of",
  workDate: "Work date",
  operationId: "Operation",
  crew: "Crew",
  tempF: "Temperature",
  rain: "Rain",
  lostHours: "Lost hours",
  lostReason: "Reason for lost hours",
  areaSqFt: "Area",
  dataDate: "Data date",
  spec: "Search",
  dimensions: ["Things to vary", "Thing to vary"],
  maxVariants: "At most plans",
  fromFieldLog: "From the field log",
};

const MONTHS = ["January", "February", "March", "April", "May", "June", "July", "August", "September", "October", "November", "December"];

/** `a.b[2].c` → ["a", "b", 2, "c"]. */
export function pathParts(path: string): (string | number)[] {
  const out: (string | number)[] = [];
  for (const m of path.matchAll(/([^.[\]]+)|\[(\d+)\]/g)) out.push(m[2] !== undefined ? Number(m[2]) : m[1]);
  return out;
}

function words(key: string): string {
  const spaced = key.replace(/([a-z0-9])([A-Z])/g, "$1 $2").replace(/[_-]+/g, " ").toLowerCase();
  return spaced.charAt(0).toUpperCase() + spaced.slice(1);
}

/** The readable label of a field path. `definition.` (the scenario inside a save request) is left out. */
export function fieldLabel(path: string | ReadonlyArray<PropertyKey>): string {
  const parts = typeof path === "string" ? pathParts(path) : path.map((p) => (typeof p === "number" ? p : String(p)));
  const out: string[] = [];
  parts.forEach((part, i) => {
    if (part === "definition" && i === 0 && parts.length > 1) return;
    if (typeof part === "number") {
      const prev = parts[i - 1];
      const entry = typeof prev === "string" ? LABELS[prev] : undefined;
      const item = prev === "monthly" ? MONTHS[part] ?? `Month ${part + 1}` : `${Array.isArray(entry) ? entry[1] : "Item"} ${part + 1}`;
      if (out.length && typeof prev === "string") out[out.length - 1] = item;
      else out.push(item);
      return;
    }
    const entry = LABELS[part];
    out.push(entry === undefined ? words(part) : Array.isArray(entry) ? entry[0] : entry);
  });
  return out.join(" › ") || "Whole request";
}
