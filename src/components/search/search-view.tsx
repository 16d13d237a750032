"use client";
/**
 * A plan search as it runs and after: progress (with cancel), the frontier chart and a sortable, filterable
 * table of every plan (./search-plans), each variant one click from becoming a scenario. Partial results
 * appear as they arrive.
 */
import { useState } from "react";
import { useRouter } from "next/navigation";
import { useMutation, useQuery } from "@tanstack/react-query";
import { JobProgress, useJob } from "@/components/run/job-progress";
import { ConfirmDialog } from "@/components/confirm-dialog";
import { api } from "@/lib/api-client";
import { formatIsoDate } from "@/lib/format";
import { UNDER_OLDER_RULES } from "@/lib/model-rules-text";
import type { ScenarioCreatedAnswer } from "@/lib/scenario-contract";
import type { SearchAdoptedAnswer, SearchAnswer, SharedSearchRecord, VariantRow } from "@/lib/search-contract";
import { SearchPlans } from "./search-plans";

export function SearchView({ searchId, targetDate, canRun, canEdit }: { searchId: string; targetDate: string | null; canRun: boolean; canEdit: boolean }) {
  const router = useRouter();
  const query = useQuery({
    queryKey: ["searches", searchId],
    queryFn: () => api<SearchAnswer>(`/api/searches/${searchId}`),
    refetchInterval: (q) => (q.state.data?.search.jobStatus === "queued" || q.state.data?.search.jobStatus === "running" ? 2000 : false),
  });
  const job = useJob(query.data?.search.jobId ?? null, () => query.refetch());
  const [adopting, setAdopting] = useState<VariantRow | null>(null);
  const adopt = useMutation({
    mutationFn: (row: VariantRow) => api<SearchAdoptedAnswer>(`/api/searches/${searchId}/adopt`, { method: "POST", body: { idx: row.idx } }),
    // On a job under way the next step is the re-forecast from the Field log; otherwise the Outlook's run. A whole
    // page load: the scenario's header (version, last saved) is a layout the router would keep from before.
    onSuccess: (r) => window.location.assign(`/scenarios/${r.scenarioId}${query.data?.search.fromFieldLog ? "/progress" : ""}`),
  });
  const save = useMutation({
    mutationFn: (row: VariantRow) => api<ScenarioCreatedAnswer>(`/api/searches/${searchId}/scenarios`, { method: "POST", body: { idx: row.idx, name: `${query.data?.search.name ?? "Search"} — variant ${row.idx}`.slice(0, 120) } }),
    onSuccess: (r) => router.push(`/scenarios/${r.id}`),
  });

  if (query.isLoading) return <p className="text-sm text-muted">Loading the search…</p>;
  if (query.isError || !query.data) return <p role="alert" className="text-sm text-bad">The search could not be loaded: {query.error?.message}</p>;
  const s = query.data.search;
  return (
    <div className="space-y-5" data-testid="search-view">
      <section className="card">
        <h2>{s.name}</h2>
        <p className="mt-1 text-sm text-muted">
          <SearchSize search={s} variants={query.data.variants} />
        </p>
        {job.data && <JobProgress job={job.data} label="Search progress" unit="iterations" canCancel={canRun} />}
        {save.isError && <p role="alert" className="mt-2 text-sm text-bad">Could not save the variant: {save.error.message}</p>}
      </section>
      <SearchPlans
        variants={query.data.variants}
        targetDate={targetDate}
        onSave={canEdit ? (row) => save.mutate(row) : undefined}
        onAdopt={canEdit && !s.stale ? (row) => setAdopting(row) : undefined}
        saving={save.isPending || adopt.isPending}
      />
      {canEdit && s.fromFieldLog && (
        // A saved variant is a new scenario without this one's field log: its forecasts plan the whole job again.
        <p className="text-sm text-muted" data-testid="search-save-note">
          A plan saved as a scenario is the whole plan from its start: the new scenario has no field log of its own. To carry a change into the job under
          way, choose Use in this plan, then re-forecast from the Field log.
        </p>
      )}
      {adopting && (
        <ConfirmDialog
          title="Use this variant in the plan?"
          confirmLabel="Use in this plan"
          busyLabel="Saving…"
          busy={adopt.isPending}
          error={adopt.isError ? adopt.error.message : null}
          onConfirm={() => adopt.mutate(adopting)}
          onCancel={() => {
            setAdopting(null);
            adopt.reset();
          }}
          testId="adopt-dialog"
        >
          <p>
            “{adopting.label}” becomes version {s.scenarioVersion + 1} of this scenario, with that in its change note; its field log stays with it. Its
            forecasts are out of date until it is run{s.fromFieldLog ? " or re-forecast" : ""} again, and this search&apos;s other variants can then only be
            saved as scenarios of their own.
          </p>
        </ConfirmDialog>
      )}
    </div>
  );
}

/** "Every combination: 2 variants, plus the plan as saved (version 3); … 3 of 3 finished." */
export function SearchSize({ search: s, variants }: { search: SharedSearchRecord; variants: readonly VariantRow[] }) {
  const done = variants.filter((v) => v.status !== "pending").length;
  const shifts = s.fieldLogShifts ?? 0;
  return (
    <>
      {s.fromFieldLog && (
        <span className="block font-medium text-ink" data-testid="search-from-field-log">
          The rest of the job: each plan starts from the field log as of {formatIsoDate(s.fromFieldLog.dataDate)} ({shifts.toLocaleString("en-US")} shift{shifts === 1 ? "" : "s"} when the search began), as a re-forecast does.
        </span>
      )}
      {s.method === "grid" ? `Every combination: ${s.variantCount} variants` : `A space-filling sample of ${s.variantCount} variants out of ${s.gridSize.toLocaleString("en-US")} combinations`}, plus the plan as saved
      (version {s.scenarioVersion}
      {s.stale ? ", since changed" : ""}); every plan runs with the same seed. {done} of {variants.length} finished.
      {s.olderRules && (
        <span className="block text-warn" data-testid="search-older-rules">
          Its plans were {UNDER_OLDER_RULES}; a new search computes them under today&apos;s.
        </span>
      )}
    </>
  );
}
