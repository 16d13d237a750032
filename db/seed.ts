/**
 * Seeds the invented demo — the Kestrel Bay Causeway (fictional State Route 19, Marrin County) — with users of
 * every role and saved scenarios, each with a stored run. Runs only on an empty database, in one transaction,
 * so a second `npm start` keeps what users saved and a failed seed leaves nothing half-written.
 */
import { readFileSync } from "node:fs";
import { fileURLToPath } from "node:url";
import { createHash, randomUUID } from "node:crypto";
import { sql } from "drizzle-orm";
import { createPool, databaseUrl } from "./client";
import { closureSubscribers, projectMembers, projects, scenarioRevisions, scenarios, simulationRuns, users, type Role } from "./schema";
import { hashPassword } from "../src/lib/server/password";
import { parseScenario } from "../sim/validate";
import { compileScenario, runIterations, summarizeRun } from "../sim/index";
import { headlineOf, inputsHash } from "../src/lib/run-record";
import { insertDemoProgress } from "./demo-progress";

export const DEMO_SCENARIO_FILES = [
  "kestrel-two-season.json",
  "kestrel-single-season.json",
  "kestrel-holiday-work.json",
  "kestrel-two-placement-crews.json",
];
export const DEMO_SEED = "kestrel";
const DEMO_ITERATIONS = 500;

interface DemoUser {
  email: string;
  password: string;
  name: string;
  title: string;
  role: Role;
}

const readJson = (rel: string) => JSON.parse(readFileSync(fileURLToPath(new URL(rel, import.meta.url)), "utf8"));

export async function seed(url: string): Promise<"seeded" | "skipped"> {
  const pool = createPool(url, 2);
  try {
    const [{ n }] = await pool.db.select({ n: sql<number>`count(*)::int` }).from(users);
    if (n > 0) return "skipped";

    const demoUsers = readJson("./demo-users.json") as DemoUser[];
    const definitions = DEMO_SCENARIO_FILES.map((f) => {
      const parsed = parseScenario(readJson(`../scenarios/${f}`));
      if (!parsed.ok) throw new Error(`scenarios/${f} is invalid: ${parsed.problems.map((p) => `${p.path}: ${p.message}`).join("; ")}`);
      return { file: f, raw: readJson(`../scenarios/${f}`) as Record<string, unknown>, scenario: parsed.scenario };
    });
    // The engine runs before the transaction opens, so the transaction is short.
    const runs = definitions.map(({ scenario }) => {
      const started = Date.now();
      const compiled = compileScenario(scenario);
      const partial = runIterations(compiled, DEMO_SEED, 0, DEMO_ITERATIONS);
      const summary = summarizeRun(compiled, partial);
      return { summary, durationMs: Date.now() - started };
    });
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
      await tx.insert(projectMembers).values(demoUsers.map((u, i) => ({ projectId: kestrel.id, userId: ids[i], role: u.role })));
      await tx.insert(projectMembers).values({ projectId: tern.id, userId: ids[demoUsers.findIndex((u) => u.role === "admin")], role: "admin" });

      const engineerId = ids[demoUsers.findIndex((u) => u.role === "engineer")];
      await tx.insert(closureSubscribers).values([
        { projectId: kestrel.id, email: "info@marrin-county.example", label: "Marrin County public information office", addedById: engineerId },
        { projectId: kestrel.id, email: "traffic-ops@marrin-transit.example", label: "Marrin Transit operations (bus detours)", addedById: engineerId },
      ]);
      const ownerId = ids[demoUsers.findIndex((u) => u.role === "scheduler")];
      for (let k = 0; k < definitions.length; k++) {
        const { raw, scenario } = definitions[k];
        const [row] = await tx
          .insert(scenarios)
          .values({
            projectId: kestrel.id,
            name: scenario.name,
            description: scenario.description,
            definition: raw,
            ownerId,
            updatedById: ownerId,
            changeNote: "Demo scenario",
          })
          .returning({ id: scenarios.id, version: scenarios.version });
        await tx.insert(scenarioRevisions).values({ scenarioId: row.id, version: row.version, definition: raw, savedById: ownerId, changeNote: "Demo scenario" });
        // The main demo carries an illustrative first week of field progress (see db/demo-progress.ts).
        if (k === 0) await insertDemoProgress(tx, { projectId: kestrel.id, scenarioId: row.id, userId: ids[demoUsers.findIndex((u) => u.role === "inspector")], scenario });
        const { summary, durationMs } = runs[k];
        await tx.insert(simulationRuns).values({
          scenarioId: row.id,
          scenarioVersion: row.version,
          inputsHash: inputsHash(raw, DEMO_SEED, DEMO_ITERATIONS),
          seed: DEMO_SEED,
          iterations: DEMO_ITERATIONS,
          summary: headlineOf(summary),
          results: summary as unknown as Record<string, unknown>,
          durationMs,
          createdById: ownerId,
          // Computed here by the engine on the server side, not sent by a browser.
          verification: "server",
        });
      }
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
