"use client";
/**
 * "Re-forecast from <data date>": a server worker re-runs the engine from the as-built state at the data date
 * (at most 5,000 iterations) and stores it; a data date after today is refused (nothing can be recorded yet).
 * The panel follows the job, and the page then shows the new point on the drift chart.
 */
import { useRouter } from "next/navigation";
import { useState } from "react";
import { useMutation } from "@tanstack/react-query";
import { api, ApiError } from "@/lib/api-client";
import { formatIsoDate } from "@/lib/format";
import { JobProgress, useJob } from "@/components/run/job-progress";
import type { JobAnswer } from "@/lib/job-contract";

const ITERATIONS = [500, 1_000, 2_000, 5_000];

export function ReforecastPanel({ scenarioId, defaultDate, minDate, maxDate }: { scenarioId: string; defaultDate: string; minDate: string; maxDate: string }) {
  const router = useRouter();
  const [dataDate, setDataDate] = useState(defaultDate);
  const [iterations, setIterations] = useState(1_000);
  const [seed, setSeed] = useState("pourline");
  const run = useMutation({
    mutationFn: () => api<JobAnswer>(`/api/scenarios/${scenarioId}/reforecast`, { method: "POST", body: { dataDate, iterations, seed } }),
  });
  const job = useJob(run.data?.job.id ?? null, (j) => j.status === "completed" && router.refresh());
  const busy = run.isPending || job.data?.status === "queued" || job.data?.status === "running";
  const problem = run.error instanceof ApiError && run.error.fields.length ? run.error.fields.map((f) => f.message).join(". ") : run.error?.message;
  return (
    <div className="flex flex-wrap items-end gap-4">
      <div>
        <label htmlFor="reforecast-date" className="field-label">
          Data date
        </label>
        <input id="reforecast-date" type="date" className="field-input" min={minDate} max={maxDate} value={dataDate} onChange={(e) => setDataDate(e.target.value)} />
      </div>
      <div>
        <label htmlFor="reforecast-iterations" className="field-label">
          Iterations
        </label>
        <select id="reforecast-iterations" className="field-input w-32" value={iterations} onChange={(e) => setIterations(Number(e.target.value))}>
          {ITERATIONS.map((n) => (
            <option key={n} value={n}>
              {n.toLocaleString("en-US")}
            </option>
          ))}
        </select>
      </div>
      <div>
        <label htmlFor="reforecast-seed" className="field-label">
          Seed
        </label>
        <input id="reforecast-seed" className="field-input w-32" value={seed} maxLength={60} onChange={(e) => setSeed(e.target.value)} />
      </div>
      <button type="button" className="btn-primary" data-testid="reforecast-button" disabled={busy || !dataDate || !seed.trim()} onClick={() => run.mutate()}>
        {busy ? "Re-forecasting…" : `Re-forecast from ${formatIsoDate(dataDate)}`}
      </button>
      {job.data && <div className="w-full"><JobProgress job={job.data} label="Re-forecast progress" canCancel /></div>}
      <p className="w-full text-sm" aria-live="polite">
        {job.data?.status === "completed" && <span className="text-muted" data-testid="reforecast-done">Re-forecast saved from {formatIsoDate(dataDate)}; the drift chart below shows it.</span>}
        {run.isError && (
          <span role="alert" className="text-bad">
            The re-forecast failed: {problem}
          </span>
        )}
      </p>
    </div>
  );
}
