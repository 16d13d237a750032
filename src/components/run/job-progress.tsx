"use client";
/**
 * An engine job followed from the browser: `useJob` polls GET /api/jobs/:id once a second until the job
 * ends; `JobProgress` draws its progress bar with the time left and, for its owner, a cancel button.
 */
import { useEffect } from "react";
import { useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import type { JobAnswer, JobView } from "@/lib/job-contract";
import { ProgressLine } from "./progress-line";

export const jobEnded = (j: JobView | undefined) => !!j && (j.status === "completed" || j.status === "failed" || j.status === "cancelled");

export function useJob(jobId: string | null, onEnd?: (job: JobView) => void) {
  const query = useQuery({
    queryKey: ["jobs", jobId],
    queryFn: () => api<JobAnswer>(`/api/jobs/${jobId}`).then((r) => r.job),
    enabled: !!jobId,
    refetchInterval: (q) => (jobEnded(q.state.data) ? false : 1000),
  });
  const ended = jobEnded(query.data);
  useEffect(() => {
    if (ended && query.data) onEnd?.(query.data);
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [ended]);
  return query;
}

export function formatSecondsLeft(s: number | null) {
  if (s == null || !Number.isFinite(s)) return "estimating…";
  if (s < 1) return "under a second left";
  if (s < 90) return `about ${Math.round(s)} s left`;
  return `about ${Math.round(s / 60)} min left`;
}

const STATUS_TEXT: Record<JobView["status"], string> = {
  queued: "Waiting for a server worker…",
  running: "",
  completed: "Done.",
  failed: "Failed.",
  cancelled: "Cancelled; nothing was saved.",
};

export function JobProgress({ job, label, unit = "iterations", canCancel }: { job: JobView; label: string; unit?: string; canCancel: boolean }) {
  const qc = useQueryClient();
  const cancel = useMutation({
    mutationFn: () => api(`/api/jobs/${job.id}`, { method: "DELETE" }),
    onSettled: () => qc.invalidateQueries({ queryKey: ["jobs", job.id] }),
  });
  const pct = Math.floor(job.progress.fraction * 100);
  const ended = `${STATUS_TEXT[job.status]}${job.status === "failed" && job.error ? ` ${job.error}` : ""}`;
  const live = job.status === "queued" || job.status === "running";
  return (
    <div className="mt-3" data-testid={`job-${job.kind}`} data-status={job.status}>
      <div className="flex items-center gap-3">
        <div role="progressbar" aria-label={label} aria-valuemin={0} aria-valuemax={100} aria-valuenow={pct} className="h-3 flex-1 overflow-hidden rounded-full bg-paper ring-1 ring-line">
          <div className="h-full bg-brand-600 transition-[width] duration-300" style={{ width: `${pct}%` }} />
        </div>
        {live && canCancel && (
          <button type="button" className="btn-secondary" onClick={() => cancel.mutate()} disabled={cancel.isPending} data-testid="cancel-job">
            Cancel
          </button>
        )}
      </div>
      <ProgressLine
        className="mt-1 text-sm text-muted"
        detail={job.status === "running" ? `${job.progress.done.toLocaleString("en-US")} of ${job.progress.total.toLocaleString("en-US")} ${unit} · ${formatSecondsLeft(job.progress.secondsLeft)}` : null}
        fraction={job.progress.fraction}
        ended={ended}
      />
    </div>
  );
}
