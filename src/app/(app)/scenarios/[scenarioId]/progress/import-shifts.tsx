"use client";
/**
 * Loading shifts into the field log from a CSV file — a job that comes to Pourline part-way through has its shifts so
 * far in a spreadsheet. The columns are the field log's own download; every row is checked as a shift recorded by
 * hand. Two steps: "Check the file" says what it would add, operation by operation, storing nothing
 * (POST …/progress/import/check); "Load" stores it whole or not at all (POST …/progress/import), checked again.
 */
import { useRouter } from "next/navigation";
import { useState } from "react";
import { useMutation } from "@tanstack/react-query";
import { uploadFile } from "@/lib/api-client";
import { countText, formatIsoDate } from "@/lib/format";
import type { ProgressImportAnswer, ProgressImportPreview } from "@/lib/progress-contract";
import { UploadProblems } from "@/components/upload-problems";

function fileForm(f: File): FormData {
  const data = new FormData();
  data.set("file", f);
  return data;
}

/** What the checked file holds, before anything is stored. */
function Preview({ preview }: { preview: ProgressImportPreview }) {
  return (
    <div className="mt-3" data-testid="import-shifts-preview">
      <p>
        The file holds {countText(preview.shifts, "shift")}
        {preview.from && preview.to ? `, worked ${formatIsoDate(preview.from)} to ${formatIsoDate(preview.to)}` : ""}
        {preview.skippedDeleted ? ` (${countText(preview.skippedDeleted, "row")} marked deleted will be left out)` : ""}; every row passed the field log&apos;s checks. Nothing is
        stored yet.
      </p>
      {/* On a phone the table scrolls sideways rather than breaking its figures. */}
      <div className="mt-2 overflow-x-auto">
        <table className="w-full min-w-[560px] border-collapse">
          <caption className="sr-only">What the file would add, by operation</caption>
          <thead>
            <tr>
              <th scope="col" className="table-head">Operation</th>
              <th scope="col" className="table-head text-right">Shifts</th>
              <th scope="col" className="table-head text-right">Feet</th>
              <th scope="col" className="table-head">Worked</th>
              <th scope="col" className="table-head text-right">Hours lost</th>
            </tr>
          </thead>
          <tbody>
            {preview.operations.map((o) => (
              <tr key={o.operationId}>
                <th scope="row" className="table-cell text-left font-medium">{o.name}</th>
                <td className="table-cell text-right">{o.shifts.toLocaleString("en-US")}</td>
                <td className="table-cell whitespace-nowrap text-right">{o.feet.toLocaleString("en-US", { maximumFractionDigits: 1 })} ft</td>
                <td className="table-cell whitespace-nowrap">{o.first === o.last ? formatIsoDate(o.first) : `${formatIsoDate(o.first)} – ${formatIsoDate(o.last)}`}</td>
                <td className="table-cell text-right">{o.lostHours.toLocaleString("en-US", { maximumFractionDigits: 1 })}</td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
      <p className="mt-2 text-muted">
        {countText(preview.rainShifts, "shift")} with rain; {countText(preview.discovered, "discovered condition")}.
      </p>
    </div>
  );
}

export function ImportShifts({ scenarioId }: { scenarioId: string }) {
  const router = useRouter();
  const [file, setFile] = useState<File | null>(null);
  const check = useMutation({
    mutationFn: (f: File) => uploadFile<ProgressImportPreview>(`/api/scenarios/${scenarioId}/progress/import/check`, fileForm(f)),
  });
  const load = useMutation({
    mutationFn: (f: File) => uploadFile<ProgressImportAnswer>(`/api/scenarios/${scenarioId}/progress/import`, fileForm(f)),
    onSuccess: () => router.refresh(),
  });
  const preview = check.data;
  const done = load.data;
  const busy = check.isPending || load.isPending;
  return (
    <details className="mt-4 rounded-md border border-line px-4 py-3 text-sm" data-testid="import-shifts">
      <summary className="cursor-pointer font-medium">Load shifts from a file (CSV)</summary>
      <p className="mt-2 text-muted">
        For a job already under way, or a log kept in a spreadsheet: one row per shift, with the columns of{" "}
        <strong>Download the field log (CSV)</strong> — <code>work_date</code>, <code>shift</code>, <code>operation</code> (or <code>operation_name</code>), the
        stations in feet (<code>station_from_ft</code>, <code>station_to_ft</code>) or as stations (<code>station_from</code>, <code>station_to</code>: 1250 or
        12+50), and if you have them <code>crew</code>, <code>temp_f</code>, <code>rain</code> (yes/no), <code>lost_hours</code>, <code>lost_reason</code> and{" "}
        <code>discovered</code>. Each row is checked as a shift recorded here is. Check the file first to see what it would add; it then loads whole, or
        nothing is loaded and each problem is named by its line.
      </p>
      <form
        className="mt-3 flex flex-wrap items-end gap-3"
        onSubmit={(e) => {
          e.preventDefault();
          if (file) check.mutate(file);
        }}
      >
        <label className="flex flex-col gap-1">
          <span className="font-medium">CSV file</span>
          <input
            type="file"
            accept=".csv,.txt,text/csv"
            onChange={(e) => {
              setFile(e.target.files?.[0] ?? null);
              check.reset();
              load.reset();
            }}
          />
        </label>
        <button type="submit" className={preview ? "btn-secondary" : "btn-primary"} disabled={!file || busy}>
          {check.isPending ? "Checking…" : "Check the file"}
        </button>
      </form>
      <div aria-live="polite">
        {preview && !done && (
          <>
            <Preview preview={preview} />
            <button type="button" className="btn-primary mt-3" disabled={!file || busy} onClick={() => file && load.mutate(file)}>
              {load.isPending ? "Loading…" : `Load the ${countText(preview.shifts, "shift")}`}
            </button>
          </>
        )}
        {done && (
          <p className="mt-3 text-ok" data-testid="import-shifts-done">
            Loaded {countText(done.imported, "shift")}, worked {formatIsoDate(done.from)} to {formatIsoDate(done.to)}
            {done.skippedDeleted ? ` (${countText(done.skippedDeleted, "row")} marked deleted left out)` : ""}. The forecast knows them from the next
            re-forecast.
          </p>
        )}
      </div>
      {check.isError && <UploadProblems error={check.error} />}
      {load.isError && <UploadProblems error={load.error} />}
    </details>
  );
}
