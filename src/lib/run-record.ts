/**
 * What is stored about a run besides its full summary: the headline figures lists and compare need, and the
 * hash of the inputs that produced it (so a stored run can be matched to the scenario version it belongs to).
 */
import type { RunSummary } from "@sim/summary";

export interface RunHeadline {
  iterations: number;
  finish: { p10: string; p50: string; p80: string; p90: string };
  targetDate: string | null;
  targetProbability: number | null;
  /** Lane-closed hours, P50 (the closure timeline). */
  closureHoursTotal: number;
  weatherLostShiftsP50: number;
}

export function headlineOf(s: RunSummary): RunHeadline & Record<string, unknown> {
  const closureHoursTotal = s.laneClosedHours.total.p50;
  return {
    iterations: s.iterations,
    finish: { p10: s.finish.p10, p50: s.finish.p50, p80: s.finish.p80, p90: s.finish.p90 },
    targetDate: s.target?.date ?? null,
    targetProbability: s.target?.probability ?? null,
    closureHoursTotal,
    weatherLostShiftsP50: s.weatherLostShifts.p50,
  };
}

/** Key-sorted JSON, so the hash does not depend on property order. */
function stableStringify(v: unknown): string {
  if (Array.isArray(v)) return `[${v.map(stableStringify).join(",")}]`;
  if (v && typeof v === "object") {
    return `{${Object.keys(v as object)
      .sort()
      .map((k) => `${JSON.stringify(k)}:${stableStringify((v as Record<string, unknown>)[k])}`)
      .join(",")}}`;
  }
  return JSON.stringify(v);
}

/** cyrb53 twice with different seeds (106 bits): an identity check, not a security measure. */
function cyrb53(str: string, seed: number): string {
  let h1 = 0xdeadbeef ^ seed;
  let h2 = 0x41c6ce57 ^ seed;
  for (let i = 0; i < str.length; i++) {
    const ch = str.charCodeAt(i);
    h1 = Math.imul(h1 ^ ch, 2654435761);
    h2 = Math.imul(h2 ^ ch, 1597334677);
  }
  h1 = Math.imul(h1 ^ (h1 >>> 16), 2246822507) ^ Math.imul(h2 ^ (h2 >>> 13), 3266489909);
  h2 = Math.imul(h2 ^ (h2 >>> 16), 2246822507) ^ Math.imul(h1 ^ (h1 >>> 13), 3266489909);
  return (4294967296 * (2097151 & h2) + (h1 >>> 0)).toString(16).padStart(14, "0");
}

export function inputsHash(definition: unknown, seed: string, iterations: number): string {
  const text = stableStringify({ definition, seed, iterations });
  return cyrb53(text, 1) + cyrb53(text, 2);
}

/** A stored run as the results view shows it: stale when the plan was saved again after the run. */
export function resultsRunOf(
  run: { id: string; iterations: number; seed: string; createdAt: Date; createdByName: string | null; scenarioVersion: number },
  currentVersion: number,
) {
  return { id: run.id, iterations: run.iterations, seed: run.seed, createdAt: run.createdAt.toISOString(), createdByName: run.createdByName ?? "", stale: run.scenarioVersion !== currentVersion };
}
