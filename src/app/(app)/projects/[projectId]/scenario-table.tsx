"use client";
import Link from "next/link";
import { useMemo, useState } from "react";
import { useQuery } from "@tanstack/react-query";
import { createColumnHelper, getCoreRowModel, getSortedRowModel, useReactTable, type SortingState } from "@tanstack/react-table";
import { RowCards, SortableHead, TableRows } from "@/components/sortable-table";
import { useNarrowScreen } from "@/components/use-narrow-screen";
import { api } from "@/lib/api-client";
import { formatDateTime, formatIsoDate, formatPercent } from "@/lib/format";
import type { ScenarioListAnswer, ScenarioListRow } from "@/lib/scenario-list-contract";
import { VerificationBadge } from "@/components/results/verification-badge";

const col = createColumnHelper<ScenarioListRow>();

export function ScenarioTable({ projectId, canEdit, planScenarioId = null }: { projectId: string; canEdit: boolean; planScenarioId?: string | null }) {
  const query = useQuery({
    queryKey: ["projects", projectId, "scenarios"],
    queryFn: () => api<ScenarioListAnswer>(`/api/projects/${projectId}/scenarios`).then((r) => r.scenarios),
  });
  const [sorting, setSorting] = useState<SortingState>([{ id: "updatedAt", desc: true }]);

  const columns = useMemo(
    () => [
      col.accessor("name", {
        header: "Scenario",
        sortingFn: "text", // without case, whatever the table's length (see search-plans.tsx)
        meta: { sortWords: ["A to Z", "Z to A"] },
        cell: (c) => (
          <div>
            <Link href={`/scenarios/${c.row.original.id}`} className="font-medium text-brand-700 hover:underline">
              {c.getValue()}
            </Link>
            {c.row.original.id === planScenarioId && <span className="badge ml-2 bg-brand-50 text-brand-800">Plan of record</span>}
            {c.row.original.description && <p className="mt-0.5 line-clamp-1 text-xs text-muted">{c.row.original.description}</p>}
            {c.row.original.reforecastP80 && c.row.original.reforecastDataDate && (
              // The dates in the row are the plan run's; a job under way has moved on since.
              <p className="mt-0.5 text-xs" data-testid="reforecast-line">
                Re-forecast from the field log as of {formatIsoDate(c.row.original.reforecastDataDate)}: P80 finish{" "}
                <span className="font-semibold">{formatIsoDate(c.row.original.reforecastP80)}</span>
              </p>
            )}
          </div>
        ),
      }),
      col.accessor((r) => r.runSummary?.finish.p50 ?? "", { id: "p50", header: "P50 finish", meta: { sortWords: ["earliest first", "latest first"] }, cell: (c) => formatIsoDate(c.getValue() || null) }),
      col.accessor((r) => r.runSummary?.finish.p80 ?? "", { id: "p80", header: "P80 finish", meta: { sortWords: ["earliest first", "latest first"] }, cell: (c) => <span className="font-semibold">{formatIsoDate(c.getValue() || null)}</span> }),
      col.accessor((r) => r.runSummary?.targetProbability ?? -1, {
        id: "target",
        header: "Meets target",
        cell: (c) => (c.getValue() < 0 ? "—" : formatPercent(c.getValue())),
      }),
      col.accessor((r) => (r.runId ? (r.runStale ? "stale" : "current") : "none"), {
        id: "run",
        header: "Forecast",
        meta: { sortWords: ["current first", "stale first"] },
        cell: (c) => {
          const v = c.getValue();
          const r = c.row.original;
          const pending = r.pendingRunAt && (!r.runAt || r.pendingRunAt > r.runAt) ? <VerificationBadge verification="pending" /> : null;
          if (v === "none") return <span className="flex flex-wrap gap-1">{pending ?? <span className="badge border border-line text-muted">Not run</span>}</span>;
          return (
            <span className="flex flex-wrap gap-1">
              {/* "Current" is said only of a run of today's plan and today's model rules. */}
              {v === "stale" ? (
                <span className="badge bg-warn-bg text-warn" title="The scenario changed after this run">
                  Stale
                </span>
              ) : (
                !r.runOlderRules && <span className="badge bg-brand-50 text-brand-800">Current</span>
              )}
              {r.runOlderRules && (
                <span className="badge bg-warn-bg text-warn" title="Computed under earlier model rules: run it again for today's">
                  Older rules
                </span>
              )}
              <VerificationBadge verification={r.runVerification} />
              {pending}
            </span>
          );
        },
      }),
      col.accessor("version", { header: "Version", cell: (c) => `v${c.getValue()}` }),
      col.accessor("updatedAt", {
        header: "Last change",
        meta: { sortWords: ["oldest first", "newest first"] },
        cell: (c) => (
          <span>
            {formatDateTime(c.getValue())}
            <span className="block text-xs text-muted">
              {c.row.original.updatedByName}
              {c.row.original.changeNote ? ` — ${c.row.original.changeNote}` : ""}
            </span>
          </span>
        ),
      }),
    ],
    [planScenarioId],
  );

  const narrow = useNarrowScreen();
  const table = useReactTable({
    data: query.data ?? [],
    columns,
    state: { sorting },
    onSortingChange: setSorting,
    getCoreRowModel: getCoreRowModel(),
    getSortedRowModel: getSortedRowModel(),
  });

  if (query.isPending) {
    return (
      <div className="card" aria-busy="true">
        <p className="text-sm text-muted">Loading scenarios…</p>
        <div className="mt-3 space-y-2">{[0, 1, 2].map((i) => <div key={i} className="h-8 animate-pulse rounded bg-paper" />)}</div>
      </div>
    );
  }
  if (query.isError) {
    return (
      <div className="card border-bad/40" role="alert">
        <h2 className="text-bad">Could not load the scenarios</h2>
        <p className="mt-1 text-sm">{query.error.message}</p>
        <button className="btn-secondary mt-3" onClick={() => query.refetch()}>
          Try again
        </button>
      </div>
    );
  }
  if (query.data.length === 0) {
    return (
      <div className="card text-center">
        <h2>No scenarios yet</h2>
        <p className="mt-2 text-sm text-muted">{canEdit ? "Create the first plan for this structure." : "Engineers and schedulers create scenarios; they will appear here."}</p>
        {canEdit && (
          <Link href={`/projects/${projectId}/scenarios/new`} className="btn-primary mt-4">
            New scenario
          </Link>
        )}
      </div>
    );
  }

  return (
    <section className="card scroll-x p-0" aria-labelledby="scenarios-heading">
      <div className="flex items-center justify-between px-5 py-4">
        <h2 id="scenarios-heading">Scenarios</h2>
        {canEdit && (
          <Link href={`/projects/${projectId}/scenarios/new`} className="btn-primary">
            New scenario
          </Link>
        )}
      </div>
      {narrow ? (
        <div className="px-5 pb-5" data-testid="scenario-table">
          <RowCards table={table} label="Scenarios" />
        </div>
      ) : (
        <table className="w-full min-w-[720px] border-collapse" data-testid="scenario-table">
          <SortableHead table={table} />
          <TableRows table={table} cellClassName="table-cell align-top" />
        </table>
      )}
    </section>
  );
}
