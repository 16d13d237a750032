"use client";
/**
 * A plan search as it runs and after: progress (with cancel), the frontier chart and a sortable, filterable
 * table of every plan, each variant one click from becoming a scenario. Partial results appear as they arrive.
 */
import { useMemo, useState } from "react";
import { useRouter } from "next/navigation";
import { useMutation, useQuery } from "@tanstack/react-query";
import { createColumnHelper, getCoreRowModel, getSortedRowModel, useReactTable, type SortingState } from "@tanstack/react-table";
import { SortableHead, TableRows } from "@/components/sortable-table";
import { JobProgress, useJob } from "@/components/run/job-progress";
import { api } from "@/lib/api-client";
import { formatIsoDate, formatPercent } from "@/lib/format";
import { FrontierChart } from "./frontier-chart";
import { filterRows, type VariantRow } from "./search-logic";

interface SearchReply {
  search: { id: string; name: string; method: "grid" | "sample"; gridSize: number; variantCount: number; jobId: string | null; jobStatus: string | null; stale: boolean; scenarioVersion: number; scenarioId: string };
  variants: VariantRow[];
}

const col = createColumnHelper<VariantRow>();
const finishKey = (r: VariantRow) => (r.outcome ? (r.outcome.p80Finish === "unfinished" ? "9999" : r.outcome.p80Finish) : "");

export function SearchView({ searchId, targetDate, canRun, canEdit }: { searchId: string; targetDate: string | null; canRun: boolean; canEdit: boolean }) {
  const router = useRouter();
  const query = useQuery({
    queryKey: ["searches", searchId],
    queryFn: () => api<SearchReply>(`/api/searches/${searchId}`),
    refetchInterval: (q) => (q.state.data?.search.jobStatus === "queued" || q.state.data?.search.jobStatus === "running" ? 2000 : false),
  });
  const job = useJob(query.data?.search.jobId ?? null, () => query.refetch());
  const [sorting, setSorting] = useState<SortingState>([{ id: "p80", desc: false }]);
  const [byTarget, setByTarget] = useState(false);
  const [frontierOnly, setFrontierOnly] = useState(false);
  const save = useMutation({
    mutationFn: (row: VariantRow) => api<{ id: string }>(`/api/searches/${searchId}/scenarios`, { method: "POST", body: { idx: row.idx, name: `${query.data?.search.name ?? "Search"} — variant ${row.idx}`.slice(0, 120) } }),
    onSuccess: (r) => router.push(`/scenarios/${r.id}`),
  });

  const rows = useMemo(() => filterRows(query.data?.variants ?? [], { p80By: byTarget ? targetDate : null, frontierOnly }), [query.data, byTarget, frontierOnly, targetDate]);
  const columns = useMemo(
    () => [
      col.accessor("label", {
        header: "Plan",
        cell: (c) => (
          <span>
            {c.row.original.current ? <strong>The plan as saved</strong> : c.getValue()}
            {c.row.original.onFrontier && <span className="badge ml-2 bg-brand-50 text-brand-800">Frontier</span>}
          </span>
        ),
      }),
      col.accessor(finishKey, { id: "p80", header: "P80 finish", cell: (c) => (c.row.original.outcome ? formatIsoDate(c.row.original.outcome.p80Finish === "unfinished" ? null : c.row.original.outcome.p80Finish) || "unfinished" : statusText(c.row.original)) }),
      col.accessor((r) => r.outcome?.targetProbability ?? -1, { id: "target", header: "Meets target", cell: (c) => (c.getValue() < 0 ? "—" : formatPercent(c.getValue())) }),
      col.accessor((r) => r.outcome?.delayVehHours ?? -1, { id: "delay", header: "Delay (veh-h)", cell: (c) => (c.getValue() < 0 ? "—" : Math.round(c.getValue()).toLocaleString("en-US")) }),
      col.accessor((r) => r.outcome?.contractCost ?? -1, { id: "cost", header: "Contract cost", cell: (c) => (c.getValue() < 0 ? "—" : `$${Math.round(c.getValue()).toLocaleString("en-US")}`) }),
      col.display({
        id: "save",
        header: "",
        cell: (c) =>
          canEdit && !c.row.original.current && c.row.original.status === "done" ? (
            <button type="button" className="btn-secondary" disabled={save.isPending} onClick={() => save.mutate(c.row.original)} data-testid="save-variant">
              Save as scenario
            </button>
          ) : null,
      }),
    ],
    [canEdit, save],
  );
  const table = useReactTable({ data: rows, columns, state: { sorting }, onSortingChange: setSorting, getCoreRowModel: getCoreRowModel(), getSortedRowModel: getSortedRowModel() });

  if (query.isLoading) return <p className="text-sm text-muted">Loading the search…</p>;
  if (query.isError || !query.data) return <p role="alert" className="text-sm text-bad">The search could not be loaded: {query.error?.message}</p>;
  const s = query.data.search;
  const done = query.data.variants.filter((v) => v.status !== "pending").length;
  return (
    <div className="space-y-5" data-testid="search-view">
      <section className="card">
        <h2>{s.name}</h2>
        <p className="mt-1 text-sm text-muted">
          {s.method === "grid" ? `Every combination: ${s.variantCount} variants` : `A space-filling sample of ${s.variantCount} variants out of ${s.gridSize.toLocaleString("en-US")} combinations`}, plus the plan as saved
          (version {s.scenarioVersion}{s.stale ? ", since changed" : ""}); every plan runs with the same seed. {done} of {query.data.variants.length} finished.
        </p>
        {job.data && <JobProgress job={job.data} label="Search progress" unit="iterations" canCancel={canRun} />}
        {save.isError && <p role="alert" className="mt-2 text-sm text-bad">Could not save the variant: {save.error.message}</p>}
      </section>
      <section className="card">
        <h2>Finish, delay and cost</h2>
        <FrontierChart rows={query.data.variants} />
      </section>
      <section className="card">
        <div className="flex flex-wrap items-center gap-4">
          <h2 className="mr-auto">Plans</h2>
          {targetDate && (
            <label className="flex items-center gap-2 text-sm">
              <input type="checkbox" checked={byTarget} onChange={(e) => setByTarget(e.target.checked)} /> Finish by the target ({formatIsoDate(targetDate)}) at P80
            </label>
          )}
          <label className="flex items-center gap-2 text-sm">
            <input type="checkbox" checked={frontierOnly} onChange={(e) => setFrontierOnly(e.target.checked)} /> Frontier only
          </label>
        </div>
        <div className="mt-3 overflow-x-auto">
          <table className="w-full text-sm" data-testid="search-table">
            <SortableHead table={table} />
            <TableRows table={table} />
          </table>
        </div>
      </section>
    </div>
  );
}

function statusText(r: VariantRow) {
  if (r.status === "pending") return "running…";
  if (r.status === "infeasible") return `not a valid plan: ${r.problem ?? ""}`;
  return `failed: ${r.problem ?? ""}`;
}
