"use client";
/**
 * The holiday trade-off on the printed brief: computed in the browser as soon as the brief opens (the same
 * worker as the results' trade-off panel, ./use-tradeoff), then stated in one sentence and one table — days
 * gained at P50/P80, the chance of meeting the target, the extra vehicle-hours, the longest holiday backup,
 * road-user and contract cost. Nothing to click: it is printed.
 */
import { useEffect } from "react";
import { tradeoffSentence } from "./tradeoff-panel";
import { TradeoffTable } from "./tradeoff-table";
import { useTradeoff } from "./use-tradeoff";

export function BriefTradeoff({ definition, seed, iterations }: { definition: unknown; seed: string; iterations: number }) {
  const { state, run, n } = useTradeoff(definition, seed, iterations);
  useEffect(() => {
    void run();
  }, [run]);
  return (
    <div data-testid="brief-tradeoff" data-state={state.phase} aria-live="polite" aria-busy={state.phase === "running" || state.phase === "idle"}>
      {(state.phase === "idle" || state.phase === "running") && (
        <p className="text-sm text-muted">
          Comparing standing down over holidays with working through them on seed “{seed}”, {n.toLocaleString("en-US")} iterations each… Wait for this line
          to be replaced before printing.
        </p>
      )}
      {state.phase === "failed" && <p className="text-sm text-bad">The holiday policies could not be compared: {state.message}</p>}
      {state.phase === "done" && (
        <>
          <p className="text-sm leading-relaxed" data-testid="brief-tradeoff-sentence">
            {tradeoffSentence(state.result)}
          </p>
          <p className="mt-1 text-xs text-muted">
            Both policies run on seed “{seed}”, {state.iterations.toLocaleString("en-US")} iterations each (the same weather and rates); working through
            opens every weekday closure window on holidays too.
          </p>
          <div className="mt-2">
            <TradeoffTable t={state.result} />
          </div>
        </>
      )}
    </div>
  );
}
