"use client";
import { useRouter } from "next/navigation";
import { useMemo, useState } from "react";
import { budgetProblem } from "@sim/budget";
import { parseScenario } from "@sim/validate";
import { useMutation, useQueryClient } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import type { RunStoredAnswer } from "@/lib/run-contract";
import { mark, RUN_MARKS } from "@workers/run-marks";
import { planComputationKey } from "@/lib/run-keys";
import type { RunSummary } from "@sim/summary";
import { useJsonStable } from "../use-json-stable";
import { publishLocalRun, updateLocalRun } from "./local-runs";
import { useEnginePool } from "./use-engine-pool";
import { formatSecondsLeft, JobProgress, useJob } from "./job-progress";
import { ProgressLine } from "./progress-line";

interface SaveBody {
  seed: string;
  iterations: number;
  scenarioVersion: number;
  summary: RunSummary;
  durationMs: number;
}

const ITERATION_CHOICES = [1_000, 2_000, 5_000, 10_000, 20_000];

/** Start a Monte Carlo run in the browser's workers, watch it, cancel it, and store the result with the scenario. */
export function RunPanel({ scenarioId, version, definition: given, canRun, blockers = [] }: { scenarioId: string; version: number; definition: unknown; canRun: boolean; blockers?: string[] }) {
  // The page's refresh after a save brings the same plan as a new object: keep the one parsed and prepared.
  const definition = useJsonStable(given);
  const router = useRouter();
  const qc = useQueryClient();
  const [iterations, setIterations] = useState(2_000);
  const [seed, setSeed] = useState("pourline");
  // The same budget the server checks when the run is saved: refuse here instead of computing in vain.
  const plan = useMemo(() => parseScenario(definition), [definition]);
  const overBudget = plan.ok ? budgetProblem(plan.scenario, iterations, "browser") : null;
  // The workers start and compile the plan while the page is read, when a run is possible at all.
  const pool = useEnginePool(canRun && plan.ok && blockers.length === 0 ? definition : null);
  const save = useMutation({
    mutationFn: (body: SaveBody) => api<RunStoredAnswer>(`/api/scenarios/${scenarioId}/runs`, { method: "POST", body }),
    onSuccess: (_, body) => {
      mark(RUN_MARKS.saved);
      updateLocalRun(scenarioId, planComputationKey(body), { save: "saved" });
      qc.invalidateQueries({ queryKey: ["scenarios", scenarioId] });
      router.refresh();
    },
    onError: (_, body) => updateLocalRun(scenarioId, planComputationKey(body), { save: "failed" }),
  });

  // The server reproduces the stored run; the page shows it as verified (or not) once that job ends.
  const verify = useJob(save.data?.verifyJobId ?? null, () => router.refresh());

  if (!canRun) return null;
  const running = pool.state.phase === "running";
  const progress = pool.state.phase === "running" ? pool.state.progress : null;
  const pct = progress ? Math.floor((progress.done / progress.total) * 100) : pool.state.phase === "done" ? 100 : 0;
  const doneText =
    pool.state.phase === "done"
      ? `Done: ${iterations.toLocaleString("en-US")} iterations in ${(pool.state.durationMs / 1000).toFixed(1)} s. ${save.isPending ? "Saving…" : save.isSuccess ? "Saved with this version." : ""}`
      : "";

  async function start() {
    if (overBudget) return;
    save.reset();
    const result = await pool.start(definition, iterations, seed);
    if (!result) return;
    const body = { seed, iterations, scenarioVersion: version, summary: result.summary, durationMs: result.durationMs };
    // Drawn at once from the workers' summary; the save follows (the Outlook marks the run as being saved).
    publishLocalRun({ scenarioId, key: planComputationKey(body), iterations, seed, summary: result.summary, computedAt: new Date().toISOString() });
    save.mutate(body);
  }

  return (
    <section className="card" aria-labelledby="run-heading">
      <div className="flex flex-wrap items-end gap-4">
        <h2 id="run-heading" className="mr-auto">
          Run the forecast
        </h2>
        <div>
          <label htmlFor="run-iterations" className="field-label">
            Iterations
          </label>
          <select id="run-iterations" className="field-input w-32" value={iterations} disabled={running} onChange={(e) => setIterations(Number(e.target.value))}>
            {ITERATION_CHOICES.map((n) => (
              <option key={n} value={n}>
                {n.toLocaleString("en-US")}
              </option>
            ))}
          </select>
        </div>
        <div>
          <label htmlFor="run-seed" className="field-label">
            Seed
          </label>
          <input id="run-seed" className="field-input w-32" value={seed} disabled={running} maxLength={60} onChange={(e) => setSeed(e.target.value)} />
        </div>
        {running ? (
          <button type="button" className="btn-secondary" onClick={pool.cancel} data-testid="cancel-run">
            Cancel
          </button>
        ) : (
          <button type="button" className="btn-primary" onClick={start} disabled={!seed.trim() || save.isPending || blockers.length > 0 || overBudget !== null} data-testid="start-run">
            Run {iterations.toLocaleString("en-US")} iterations
          </button>
        )}
      </div>
      {blockers.length > 0 && (
        <div role="alert" className="mt-4 rounded-md border border-bad/40 bg-bad-bg px-3 py-2 text-sm" data-testid="run-blockers">
          <p className="font-medium text-bad">This plan can never finish, so a run would only wait for the six-year horizon:</p>
          <ul className="mt-1 list-disc pl-5">
            {blockers.map((b) => (
              <li key={b}>{b}</li>
            ))}
          </ul>
        </div>
      )}
      {(running || pool.state.phase === "done") && (
        // Contained: the progress text and bar change a few times a second, and nothing outside depends on their layout or paint.
        <div className="mt-4 [contain:content]">
          <div
            role="progressbar"
            aria-label="Run progress"
            aria-valuemin={0}
            aria-valuemax={100}
            aria-valuenow={pct}
            data-testid="run-progress"
            className="h-3 w-full overflow-hidden rounded-full bg-paper ring-1 ring-line"
          >
            {/* No width transition: the bar moves a few times a second anyway, and an animated width is laid out and painted
                every frame on the main thread — a core's share the engine workers lose on a small machine. */}
            <div className="h-full bg-brand-600" style={{ width: `${pct}%` }} />
          </div>
          <ProgressLine
            className="mt-2 text-sm text-muted"
            detail={progress && `${progress.done.toLocaleString("en-US")} of ${progress.total.toLocaleString("en-US")} iterations · ${Math.round(progress.perSecond).toLocaleString("en-US")} per second · ${formatSecondsLeft(progress.secondsLeft)} · ${workerCount(pool.state.phase === "running" ? pool.state.workers : 1)}`}
            fraction={progress ? progress.done / progress.total : 1}
            ended={doneText}
          />
        </div>
      )}
      {overBudget && (
        <p role="alert" className="mt-3 text-sm text-bad" data-testid="run-over-budget">
          Too large to run: {overBudget.message}
        </p>
      )}
      {/* Whether the server has reproduced the run is said here only, so the line above never goes stale. */}
      {verify.data && (
        <div data-testid="verify-progress">
          <p className="mt-3 text-sm">
            {verify.data.status === "completed" ? "The server has checked this run." : "The server is reproducing this run to verify it (same version, seed and iterations)."}
          </p>
          <JobProgress job={verify.data} label="Verification progress" canCancel={false} />
        </div>
      )}
      {pool.state.phase === "cancelled" && <p className="mt-3 text-sm text-muted">Run cancelled; nothing was saved.</p>}
      {pool.state.phase === "failed" && (
        <p role="alert" className="mt-3 text-sm text-bad">
          The run failed: {pool.state.message}
        </p>
      )}
      {save.isError && (
        <p role="alert" className="mt-3 text-sm text-bad">
          The run finished but could not be saved: {save.error.message}
        </p>
      )}
    </section>
  );
}

/** How many engine workers run this forecast, in words a scheduler reads: "on 1 browser thread", "on 2 browser threads". */
function workerCount(n: number): string {
  return `on ${n} browser ${n === 1 ? "thread" : "threads"}`;
}
