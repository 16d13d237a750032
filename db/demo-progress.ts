/**
 * A week of invented field progress for the main demo scenario (Kestrel Bay Causeway, two seasons), for the
 * seed to call inside its transaction: `insertDemoProgress(tx, { projectId, scenarioId, userId, scenario })`.
 * The plan starts Mon 2027-04-05, after the real "today" of the demo; so these entries are dated in the
 * plan's first week for illustration only, and they are checked by the same rules as the API with "today"
 * set to the last demo date (DEMO_PROGRESS_TODAY). Stations follow the plan's sequence and lags: setup leads,
 * milling stays 200 ft behind it, hydrodemolition 300 ft behind milling.
 */
import { checkProgressEntry, progressEntrySchema, type RuleEntry } from "../src/lib/progress-schema";
import type { Scenario } from "../sim/schema";
import type { Database } from "./client";
import { progressEntries, progressHistory } from "./schema";

export const DEMO_PROGRESS_TODAY = "2027-04-09";

const raw = [
  { workDate: "2027-04-05", shift: "night", operationId: "setup", fromStationFt: 1200, toStationFt: 1250, crew: "Traffic crew 1", tempF: 48, lostReason: "", lostHours: 0 },
  { workDate: "2027-04-06", shift: "night", operationId: "setup", fromStationFt: 1250, toStationFt: 1700, crew: "Traffic crew 1", tempF: 51, lostReason: "", lostHours: 0 },
  { workDate: "2027-04-06", shift: "night", operationId: "milling", fromStationFt: 1200, toStationFt: 1250, crew: "Milling crew", tempF: 51, lostReason: "", lostHours: 0 },
  { workDate: "2027-04-07", shift: "night", operationId: "setup", fromStationFt: 1700, toStationFt: 2150, crew: "Traffic crew 1", tempF: 46, lostReason: "", lostHours: 0 },
  { workDate: "2027-04-07", shift: "night", operationId: "milling", fromStationFt: 1250, toStationFt: 1390, crew: "Milling crew", tempF: 46, lostReason: "", lostHours: 0 },
  { workDate: "2027-04-08", shift: "night", operationId: "setup", fromStationFt: 2150, toStationFt: 2500, crew: "Traffic crew 1", tempF: 44, rain: true, lostHours: 2, lostReason: "Rain 01:00–03:00, lane closure held" },
  { workDate: "2027-04-08", shift: "night", operationId: "milling", fromStationFt: 1390, toStationFt: 1500, crew: "Milling crew", tempF: 44, rain: true, lostHours: 2, lostReason: "Rain 01:00–03:00" },
  { workDate: "2027-04-09", shift: "night", operationId: "setup", fromStationFt: 2500, toStationFt: 2950, crew: "Traffic crew 1", tempF: 50, lostReason: "", lostHours: 0 },
  { workDate: "2027-04-09", shift: "night", operationId: "milling", fromStationFt: 1500, toStationFt: 1640, crew: "Milling crew", tempF: 50, lostReason: "", lostHours: 0 },
  {
    workDate: "2027-04-09", shift: "night", operationId: "hydrodemolition", fromStationFt: 1200, toStationFt: 1240, crew: "Hydro crews A and B", tempF: 50, lostReason: "", lostHours: 0,
    discovered: [{ kind: "bottom-mat" as const, fromStationFt: 1215, toStationFt: 1225, areaSqFt: 38 }],
  },
];

/** The demo entries, parsed and checked against the plan in order; throws if the plan no longer accepts them. */
export function demoProgressEntries(scenario: Scenario) {
  const accepted: RuleEntry[] = [];
  return raw.map((r, i) => {
    const entry = progressEntrySchema.parse(r);
    const problems = checkProgressEntry({ scenario, entry, others: accepted, today: DEMO_PROGRESS_TODAY });
    if (problems.length) throw new Error(`demo progress entry ${i} is invalid: ${problems.map((p) => `${p.path}: ${p.message}`).join("; ")}`);
    accepted.push({ ...entry, id: String(i) });
    return { ...entry, tempF: entry.tempF ?? null };
  });
}

/** Inserts the demo week (each entry with its "created" history row). Call inside the seed's transaction. */
export async function insertDemoProgress(tx: Pick<Database, "insert">, args: { projectId: string; scenarioId: string; userId: string; scenario: Scenario }) {
  for (const fields of demoProgressEntries(args.scenario)) {
    const [row] = await tx
      .insert(progressEntries)
      .values({ projectId: args.projectId, scenarioId: args.scenarioId, ...fields, enteredById: args.userId })
      .returning({ id: progressEntries.id });
    await tx.insert(progressHistory).values({ entryId: row.id, changedById: args.userId, before: null, after: fields });
  }
}
