"use client";
/**
 * A run just computed in this browser, shown at once: the Outlook draws its summary as soon as the workers
 * hand it over, while the save (POST, then the page's refresh from the server) is still under way. The run
 * panel publishes the run and its save's progress here; the Outlook's run view (`results/outlook-run.tsx`)
 * reads it.
 *
 * When the server's page shows the same computation (same scenario version, iterations and seed: the engine
 * is deterministic, so the same summary), the view keeps the summary object it already drew, so the refresh
 * does not draw every chart a second time. A run whose save failed is no longer shown (the panel says why).
 */
import { useSyncExternalStore } from "react";
import type { RunSummary } from "@sim/summary";

export interface LocalRun {
  scenarioId: string;
  /** Names the computation (version, iterations, seed): `planComputationKey` of src/lib/run-keys.ts. */
  key: string;
  iterations: number;
  seed: string;
  summary: RunSummary;
  computedAt: string;
  /** saving → saved (the server has it) | failed (not shown any more). */
  save: "saving" | "saved" | "failed";
  /** True once the page's server render has caught up with the save: from then on the server's run is shown. */
  acknowledged: boolean;
}

const runs = new Map<string, LocalRun>();
const listeners = new Set<() => void>();
const emit = () => listeners.forEach((l) => l());

function subscribe(listener: () => void) {
  listeners.add(listener);
  return () => listeners.delete(listener);
}

export function publishLocalRun(run: Omit<LocalRun, "save" | "acknowledged">): void {
  runs.set(run.scenarioId, { ...run, save: "saving", acknowledged: false });
  emit();
}

/** Updates the run of `scenarioId` if it is still the one with `key` (a newer run replaces an older one). */
export function updateLocalRun(scenarioId: string, key: string, change: Partial<Pick<LocalRun, "save" | "acknowledged">>): void {
  const run = runs.get(scenarioId);
  if (!run || run.key !== key) return;
  runs.set(scenarioId, { ...run, ...change });
  emit();
}

export function useLocalRun(scenarioId: string): LocalRun | null {
  return useSyncExternalStore(
    subscribe,
    () => runs.get(scenarioId) ?? null,
    () => null,
  );
}

/**
 * What the Outlook shows, given the run this browser computed (if any) and the run the server's page shows:
 * - "local": a run of the current version whose save is under way or done, which the server's page has not
 *   shown yet (nor stopped showing: once acknowledged, the server's run leads again);
 * - "server" with `sameAsLocal`: the server shows the same computation, so its summary is the one already drawn;
 * - "server": the server's run; "none": nothing to show.
 */
export function chooseShownRun(local: LocalRun | null, shownKey: string | null, scenarioVersion: number): { show: "local" | "server" | "none"; sameAsLocal: boolean } {
  const usable = local && local.key.startsWith(`v${scenarioVersion}:`) && local.save !== "failed" ? local : null;
  const sameAsLocal = !!usable && shownKey === usable.key;
  if (usable && !usable.acknowledged && !sameAsLocal) return { show: "local", sameAsLocal };
  return { show: shownKey === null ? "none" : "server", sameAsLocal };
}
