import "server-only";
import { parseScenario } from "@sim/validate";
import type { Scenario } from "@sim/schema";
import { badRequest } from "./errors";

/** The engine's own validation decides what may be saved; its field paths are reported under `definition`. */
export function validateDefinition(definition: unknown): Scenario {
  const parsed = parseScenario(definition);
  if (!parsed.ok) {
    throw badRequest(
      parsed.problems.map((p) => ({ path: `definition.${p.path}`, message: p.message })),
      "The scenario has problems; nothing was saved.",
    );
  }
  return parsed.scenario;
}
