"use client";
/**
 * The run the Outlook shows: the server's latest run with its notices and exports (`header`, rendered by the
 * server), or — from the moment the workers hand over a run computed in this browser until the server's page
 * has caught up with its save — that run, drawn at once (../run/local-runs.ts). The results view keeps its
 * place in the tree through the switch, and is given the summary object it already drew when the server's
 * run is the same computation, so the refresh after the save draws no chart again.
 */
import type { ReactNode } from "react";
import { useEffect } from "react";
import type { RunSummary } from "@sim/summary";
import { chooseShownRun, useLocalRun, updateLocalRun, type LocalRun } from "../run/local-runs";
import { ResultsView, type ResultsRun } from "./results-view";

export interface ShownRun {
  /** `planComputationKey` of the run. */
  key: string;
  summary: RunSummary;
  run: ResultsRun;
}

function LocalRunHeader({ local }: { local: LocalRun }) {
  return (
    <p className="rounded-md border border-warn/30 bg-warn-bg px-4 py-2 text-sm" role="status" data-testid="local-run">
      Newest run, computed in this browser just now: {local.iterations.toLocaleString("en-US")} iterations, seed “{local.seed}”.{" "}
      {local.save === "saving" ? "Being stored with the scenario; not yet verified." : "Stored with the scenario; not yet verified."}
    </p>
  );
}

export function OutlookRun({
  scenarioId,
  scenarioVersion,
  definition,
  shown,
  header,
  empty,
  shownHeading,
  tradeoffNote,
}: {
  scenarioId: string;
  scenarioVersion: number;
  definition: unknown;
  shown: ShownRun | null;
  header: ReactNode;
  empty: ReactNode;
  /** The heading of the server's run when it is not the forecast (ResultsView `heading`); a run just made here is. */
  shownHeading?: string;
  /** ResultsView `tradeoffNote`. */
  tradeoffNote?: ReactNode;
}) {
  const local = useLocalRun(scenarioId);
  const { show, sameAsLocal } = chooseShownRun(local, shown?.key ?? null, scenarioVersion);
  // The server's page now shows the saved run: from here on its notices and exports lead.
  useEffect(() => {
    if (sameAsLocal && local && !local.acknowledged) updateLocalRun(scenarioId, local.key, { acknowledged: true });
  }, [sameAsLocal, local, scenarioId]);

  if (show === "none") return <>{empty}</>;
  const showLocal = show === "local";
  const summary = showLocal || sameAsLocal ? local!.summary : shown!.summary;
  const run: ResultsRun = showLocal
    ? { id: "local", iterations: local!.iterations, seed: local!.seed, createdAt: local!.computedAt, createdByName: "", stale: false }
    : shown!.run;
  return (
    <>
      <div className="space-y-5">{showLocal ? <LocalRunHeader local={local!} /> : header}</div>
      <ResultsView summary={summary} definition={definition} run={run} heading={showLocal ? undefined : shownHeading} tradeoffNote={tradeoffNote} />
    </>
  );
}
