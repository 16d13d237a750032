"use client";
/**
 * Loading shifts into the field log from a CSV file — a job that comes to Pourline part-way through has its shifts so
 * far in a spreadsheet. The columns are the field log's own download; every row is checked as a shift recorded by
 * hand, and the file loads whole or not at all (POST /api/scenarios/:id/progress/import).
 */
import { useRouter } from "next/navigation";
import { useState } from "react";
import { useMutation } from "@tanstack/react-query";
import { uploadFile } from "@/lib/api-client";
import { formatIsoDate } from "@/lib/format";
import type { ProgressImportAnswer } from "@/lib/progress-contract";
import { UploadProblems } from "@/components/upload-problems";

export function ImportShifts({ scenarioId }: { scenarioId: string }) {
  const router = useRouter();
  const [file, setFile] = useState<File | null>(null);
  const load = useMutation({
    mutationFn: (f: File) => {
      const data = new FormData();
      data.set("file", f);
      return uploadFile<ProgressImportAnswer>(`/api/scenarios/${scenarioId}/progress/import`, data);
    },
    onSuccess: () => router.refresh(),
  });
  const done = load.data;
  return (
    <details className="mt-4 rounded-md border border-line px-4 py-3 text-sm" data-testid="import-shifts">
      <summary className="cursor-pointer font-medium">Load shifts from a file (CSV)</summary>
      <p className="mt-2 text-muted">
        For a job already under way, or a log kept in a spreadsheet: one row per shift, with the columns of{" "}
        <strong>Download the field log (CSV)</strong> — <code>work_date</code>, <code>shift</code>, <code>operation</code> (or <code>operation_name</code>), the
        stations in feet (<code>station_from_ft</code>, <code>station_to_ft</code>) or as stations (<code>station_from</code>, <code>station_to</code>: 1250 or
        12+50), and if you have them <code>crew</code>, <code>temp_f</code>, <code>rain</code> (yes/no), <code>lost_hours</code>, <code>lost_reason</code> and{" "}
        <code>discovered</code>. Each row is checked as a shift recorded here is; the file loads whole, or nothing is loaded and each problem is named by its line.
      </p>
      <form
        className="mt-3 flex flex-wrap items-end gap-3"
        onSubmit={(e) => {
          e.preventDefault();
          if (file) load.mutate(file);
        }}
      >
        <label className="flex flex-col gap-1">
          <span className="font-medium">CSV file</span>
          <input
            type="file"
            accept=".csv,.txt,text/csv"
            onChange={(e) => {
              setFile(e.target.files?.[0] ?? null);
              load.reset();
            }}
          />
        </label>
        <button type="submit" className="btn-primary" disabled={!file || load.isPending}>
          {load.isPending ? "Loading…" : "Load the shifts"}
        </button>
      </form>
      <div aria-live="polite">
        {done && (
          <p className="mt-3 text-ok" data-testid="import-shifts-done">
            Loaded {done.imported.toLocaleString("en-US")} shift{done.imported === 1 ? "" : "s"}, worked {formatIsoDate(done.from)} to {formatIsoDate(done.to)}
            {done.skippedDeleted ? ` (${done.skippedDeleted.toLocaleString("en-US")} row${done.skippedDeleted === 1 ? "" : "s"} marked deleted left out)` : ""}. The forecast
            knows them from the next re-forecast.
          </p>
        )}
      </div>
      {load.isError && <UploadProblems error={load.error} />}
    </details>
  );
}
