/**
 * Seeds the invented demo — the Kestrel Bay Causeway (fictional State Route 19, Marrin County) — with users of
 * every role and saved scenarios, each with a stored run. The demo is a job in progress on the seeding day
 * (`now`, injected so tests pin the clock; see scripts/demo-job.ts): its dates are moved so the first season
 * has started before today, the main scenario carries the field log up to yesterday, and re-forecasts at
 * several data dates give the forecast drift. A second Kestrel project holds next season's staged, lane-by-lane
 * plan of the south approach (not started). Runs are stored with the same record builders the app uses
 * (`src/lib/run-record.ts`). Runs only on an empty database, in one transaction, so a second `npm start`
 * keeps what users saved and a failed seed leaves nothing half-written.
 */
import { readFileSync } from "node:fs";
import { fileURLToPath } from "node:url";
import { createHash, randomUUID } from "node:crypto";
import { eq, sql } from "drizzle-orm";
import { createPool, databaseUrl } from "../db/client";
import { storedResultsOf } from "../db/stored-results";
import { closureSubscribers, progressEntries, progressHistory, projectMembers, projects, scenarioRevisions, scenarios, simulationRuns, users, type Role } from "../db/schema";
import { hashPassword } from "../src/lib/server/password";
import { todayIn } from "../src/lib/progress-schema";
import { planRunRecord, reforecastRunRecord } from "../src/lib/run-record";
import { MODEL_REVISION } from "../sim/model-revision";
import { parseScenario } from "../sim/validate";
import type { Scenario } from "../sim/schema";
import { parseIsoDate, formatDayNumber } from "../sim/dates";
import { demoDataDates, demoDayShift, demoFieldLog, shiftDates } from "./demo-job";

export const DEMO_SCENARIO_FILES = [
  "kestrel-two-season.json",
  "kestrel-single-season.json",
  "kestrel-holiday-work.json",
  "kestrel-two-placement-crews.json",
];
/** A second structure, planned lane by lane in two stages, for next season: not started, no field log. */
export const DEMO_STAGED_FILE = "kestrel-staged-three-lane.json";
export const DEMO_SEED = "kestrel";
// Plan runs large enough for the owner brief (it asks for at least 1,000 and flags an unsettled P80); the
// monthly re-forecasts of the field log at the editor's default. Seeding runs them once, in about ten seconds.
const DEMO_PLAN_ITERATIONS = 2_000;
const DEMO_REFORECAST_ITERATIONS = 1_000;

interface DemoUser {
  email: string;
  password: string;
  name: string;
  title: string;
  role: Role;
}

const readJson = (rel: string) => JSON.parse(readFileSync(fileURLToPath(new URL(rel, import.meta.url)), "utf8"));

/** Noon UTC of a day number: a stored time for a run made that day. */
const noonOf = (day: number) => new Date(`${formatDayNumber(day)}T12:00:00Z`);

export async function seed(url: string, { now = new Date() }: { now?: Date } = {}): Promise<"seeded" | "skipped"> {
  const pool = createPool(url, 2);
  try {
    const [{ n }] = await pool.db.select({ n: sql<number>`count(*)::int` }).from(users);
    if (n > 0) return "skipped";

    const demoUsers = readJson("../db/demo-users.json") as DemoUser[];
    const files = DEMO_SCENARIO_FILES.map((f) => ({ file: f, raw: readJson(`../scenarios/${f}`) as Record<string, unknown> & { startDate: string; timeZone?: string } }));
    const today = todayIn(files[0].raw.timeZone ?? "America/Chicago", now);
    const shift = demoDayShift(files[0].raw.startDate, today);
    const definitions = files.map(({ file, raw: original }) => {
      const raw = shiftDates(original, shift);
      const parsed = parseScenario(raw);
      if (!parsed.ok) throw new Error(`scenarios/${file} is invalid: ${parsed.problems.map((p) => `${p.path}: ${p.message}`).join("; ")}`);
      return { file, raw, scenario: parsed.scenario };
    });
    // The engine runs before the transaction opens, so the transaction is short.
    const runs = definitions.map(({ raw, scenario }) => planRunRecord({ plan: scenario, definition: raw, seed: DEMO_SEED, iterations: DEMO_PLAN_ITERATIONS }));
    const main = definitions[0];
    const fieldLog = demoFieldLog(main.scenario, today);
    const reforecasts = demoDataDates(main.scenario, fieldLog, today).map((dataDate) =>
      reforecastRunRecord({ plan: main.scenario, definition: main.raw, records: fieldLog, dataDate, seed: DEMO_SEED, iterations: DEMO_REFORECAST_ITERATIONS }),
    );
    // Next season's job: its dates move a whole number of weeks (weekdays stay) past the main demo's.
    const stagedRaw = shiftDates(readJson(`../scenarios/${DEMO_STAGED_FILE}`) as Record<string, unknown>, shift + 364);
    const stagedParsed = parseScenario(stagedRaw);
    if (!stagedParsed.ok) throw new Error(`scenarios/${DEMO_STAGED_FILE} is invalid: ${stagedParsed.problems.map((p) => `${p.path}: ${p.message}`).join("; ")}`);
    const staged = { raw: stagedRaw, scenario: stagedParsed.scenario };
    const stagedRun = planRunRecord({ plan: staged.scenario, definition: staged.raw, seed: DEMO_SEED, iterations: DEMO_PLAN_ITERATIONS });
    const hashes = await Promise.all(demoUsers.map((u) => hashPassword(u.password)));

    await pool.db.transaction(async (tx) => {
      const ids = demoUsers.map(() => randomUUID());
      await tx.insert(users).values(demoUsers.map((u, i) => ({ id: ids[i], email: u.email, name: u.name, title: u.title, passwordHash: hashes[i] })));
      const [kestrel] = await tx
        .insert(projects)
        .values({
          name: "SR 19 Kestrel Bay Causeway — deck overlay",
          structureName: "Kestrel Bay Causeway (eastbound)",
          region: "Marrin County",
          deckLengthFt: definitions[0].scenario.deck.lengthFt,
          startStationFt: definitions[0].scenario.deck.startStationFt,
          lanes: definitions[0].scenario.deck.lanes,
          description: "Hydrodemolition and latex-modified concrete overlay of the eastbound causeway deck, under traffic.",
          // An invented point; the local weather-service fake (scripts/fake-forecast.ts) serves a week for it.
          latitude: 30.25,
          longitude: -88.1,
        })
        .returning({ id: projects.id });
      // A second project the demo scheduler does not belong to: it must stay invisible to them.
      const [tern] = await tx
        .insert(projects)
        .values({
          name: "Tern Point Bridge — joint replacement",
          structureName: "Tern Point Bridge",
          region: "Marrin County",
          deckLengthFt: 1200,
          startStationFt: 400,
          lanes: ["NB", "SB"],
          description: "Expansion joint replacement; planning not started.",
        })
        .returning({ id: projects.id });
      const [southApproach] = await tx
        .insert(projects)
        .values({
          name: "SR 19 Kestrel Bay south approach — lane-by-lane overlay",
          structureName: "Kestrel Bay Causeway south approach viaduct (southbound)",
          region: "Marrin County",
          deckLengthFt: staged.scenario.deck.lengthFt,
          startStationFt: staged.scenario.deck.startStationFt,
          lanes: staged.scenario.deck.lanes,
          description: "Next season's overlay of the south approach, one lane and then two, with traffic on the rest.",
          latitude: 30.22,
          longitude: -88.12,
        })
        .returning({ id: projects.id });
      await tx.insert(projectMembers).values(demoUsers.map((u, i) => ({ projectId: kestrel.id, userId: ids[i], role: u.role })));
      await tx.insert(projectMembers).values(demoUsers.map((u, i) => ({ projectId: southApproach.id, userId: ids[i], role: u.role })));
      await tx.insert(projectMembers).values({ projectId: tern.id, userId: ids[demoUsers.findIndex((u) => u.role === "admin")], role: "admin" });

      const engineerId = ids[demoUsers.findIndex((u) => u.role === "engineer")];
      await tx.insert(closureSubscribers).values([
        { projectId: kestrel.id, email: "info@marrin-county.example", label: "Marrin County public information office", addedById: engineerId },
        { projectId: kestrel.id, email: "traffic-ops@marrin-transit.example", label: "Marrin Transit operations (bus detours)", addedById: engineerId },
      ]);
      const ownerId = ids[demoUsers.findIndex((u) => u.role === "scheduler")];
      /**
       * A demo scenario, its first revision and its plan run. The seed's runs are computed here by the engine on
       * the server side, not sent by a browser: nothing to verify.
       */
      const insertScenario = async (projectId: string, raw: Record<string, unknown>, scenario: Scenario, run: (typeof runs)[number], runAt: Date) => {
        const [row] = await tx
          .insert(scenarios)
          .values({ projectId, name: scenario.name, description: scenario.description, definition: raw, ownerId, updatedById: ownerId, changeNote: "Demo scenario" })
          .returning({ id: scenarios.id, version: scenarios.version });
        await tx.insert(scenarioRevisions).values({ scenarioId: row.id, version: row.version, definition: raw, savedById: ownerId, changeNote: "Demo scenario" });
        await tx.insert(simulationRuns).values({ scenarioId: row.id, scenarioVersion: row.version, ...run, ...storedResultsOf(run.results), createdById: ownerId, createdAt: runAt, verification: "server", modelRevision: MODEL_REVISION });
        return row;
      };
      for (let k = 0; k < definitions.length; k++) {
        const { raw, scenario } = definitions[k];
        // The plan run is the baseline, made the week before work began.
        const row = await insertScenario(kestrel.id, raw, scenario, runs[k], noonOf(parseIsoDate(scenario.startDate) - 7));
        if (k !== 0) continue;
        // The two-season plan is the one the job is run by: the plan of record the project list shows.
        await tx.update(projects).set({ planScenarioId: row.id }).where(eq(projects.id, kestrel.id));
        // The main demo is under way: the inspector's field log up to yesterday, and the engineer's
        // re-forecasts the day after each data date (the drift history).
        const inspectorId = ids[demoUsers.findIndex((u) => u.role === "inspector")];
        const inserted = await tx
          .insert(progressEntries)
          .values(
            fieldLog.map((e) => {
              // Recorded (and last changed) the day after the shift: no re-forecast made after that misses it.
              const at = noonOf(parseIsoDate(e.workDate) + 1);
              return { projectId: kestrel.id, scenarioId: row.id, ...e, enteredById: inspectorId, createdAt: at, updatedAt: at };
            }),
          )
          .returning({ id: progressEntries.id });
        await tx.insert(progressHistory).values(inserted.map((r, i) => ({ entryId: r.id, changedById: inspectorId, action: "create" as const, before: null, after: fieldLog[i], changedAt: noonOf(parseIsoDate(fieldLog[i].workDate) + 1) })));
        for (const { headline: _h, reforecast: _r, ...columns } of reforecasts) {
          await tx.insert(simulationRuns).values({ scenarioId: row.id, scenarioVersion: row.version, ...columns, ...storedResultsOf(columns.results), createdById: engineerId, createdAt: noonOf(parseIsoDate(columns.dataDate) + 1), verification: "server", modelRevision: MODEL_REVISION });
        }
      }
      // Next season's plan was run today, and is that project's plan of record.
      const next = await insertScenario(southApproach.id, staged.raw, staged.scenario, stagedRun, noonOf(parseIsoDate(today)));
      await tx.update(projects).set({ planScenarioId: next.id }).where(eq(projects.id, southApproach.id));
      // The demo's forecasts are its history, not news: none is e-mailed to members who ask for forecast e-mails.
      await tx.execute(sql`
        UPDATE projects p SET plan_announced_run_id = (
          SELECT r.id FROM simulation_runs r
          WHERE r.scenario_id = p.plan_scenario_id AND r.verification IN ('server', 'verified')
          ORDER BY r.created_at DESC, r.id DESC LIMIT 1)`);
    });
    return "seeded";
  } finally {
    await pool.sql.end({ timeout: 5 });
  }
}

export function sha256(text: string) {
  return createHash("sha256").update(text).digest("hex");
}

if (process.argv[1] && fileURLToPath(import.meta.url) === process.argv[1]) {
  seed(databaseUrl())
    .then((r) => console.log(r === "seeded" ? "[pourline] demo data seeded" : "[pourline] database already has data; seed skipped"))
    .catch((e) => {
      console.error(`[pourline] seed failed: ${e instanceof Error ? e.message : e}`);
      process.exit(1);
    });
}
