/** Builders of small scenarios for the engine tests (invented data). */
import { readFileSync } from "node:fs";
import type { ScenarioInput } from "../../sim/schema";

export function loadScenario(name: string): ScenarioInput {
  return JSON.parse(readFileSync(new URL(`../../scenarios/${name}`, import.meta.url), "utf8"));
}

/** The small deterministic scenario with parts replaced (deep copy). */
export function small(patch: (s: ScenarioInput) => void = () => {}): ScenarioInput {
  const s = structuredClone(loadScenario("small-deterministic.json"));
  delete s.targetDate;
  patch(s);
  return s;
}
