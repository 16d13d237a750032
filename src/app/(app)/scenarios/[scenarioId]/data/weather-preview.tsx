"use client";
/** What a checked weather history would change: how each column was read, then current → fitted per month. */
import type { ColumnReading } from "@/lib/csv/weather-csv";
import type { WeatherUploadPreview } from "@/lib/upload-contract";
import { monthName } from "@/lib/format";

const MONTHS = Array.from({ length: 12 }, (_, i) => monthName(i + 1));
const FROM: Record<NonNullable<ColumnReading["unitFrom"]>, string> = { chosen: "as you chose", header: "stated in the header", guessed: "guessed from the values — choose the unit if it is wrong" };

function ColumnsRead({ p }: { p: WeatherUploadPreview }) {
  return (
    <div className="text-sm" data-testid="weather-columns">
      <p className="font-medium">How the file was read</p>
      <ul className="mt-1 list-disc pl-5">
        {p.columns.map((c) => (
          <li key={c.header}>
            <span className="font-mono text-xs">{c.header}</span> → {c.readAs}
            {c.unit && (
              <>
                {" "}
                in <strong>{c.unit}</strong> <span className="text-muted">({FROM[c.unitFrom!]})</span>
              </>
            )}
          </li>
        ))}
      </ul>
      {p.ignored.length > 0 && <p className="mt-1 text-muted">Ignored: {p.ignored.join(", ")}.</p>}
      {p.skipped > 0 && <p className="mt-1 text-muted">{p.skipped.toLocaleString("en-US")} days skipped because a value was missing.</p>}
    </div>
  );
}

export function WeatherPreview({ p }: { p: WeatherUploadPreview }) {
  const cell = (cur: number, fit: number | null | undefined, digits = 1) => (
    <td className="table-cell whitespace-nowrap">
      {cur.toFixed(digits)} <span className="text-muted">→</span> <span className="font-semibold">{fit == null ? "—" : fit.toFixed(digits)}</span>
    </td>
  );
  return (
    <div className="mt-4 scroll-x">
      <ColumnsRead p={p} />
      <p className="mt-3 text-sm">
        {p.days.toLocaleString("en-US")} days from {p.from} to {p.to}. Current value → fitted value (means of dry days, °F; wet-day chances per day).
      </p>
      {p.fit.problems.length > 0 && (
        <ul className="mt-2 list-disc pl-5 text-sm text-warn">
          {p.fit.problems.slice(0, 12).map((m) => (
            <li key={m}>{m}</li>
          ))}
        </ul>
      )}
      <table className="mt-3 w-full min-w-[640px] border-collapse" data-testid="weather-fit-table">
        <thead>
          <tr>
            <th className="table-head">Month</th>
            <th className="table-head">Max °F</th>
            <th className="table-head">Min °F</th>
            <th className="table-head">P(wet | dry)</th>
            <th className="table-head">P(wet | wet)</th>
            <th className="table-head">Wind mph</th>
            <th className="table-head">Days</th>
          </tr>
        </thead>
        <tbody>
          {MONTHS.map((m, i) => {
            const cur = p.current.monthly[i];
            const f = p.fit.monthly[i];
            return (
              <tr key={m}>
                <th scope="row" className="table-cell text-left font-medium">
                  {m}
                </th>
                {cell(cur.tmaxMeanF, f?.tmaxMeanF)}
                {cell(cur.tminMeanF, f?.tminMeanF)}
                {cell(cur.pWetAfterDry, f?.pWetAfterDry, 2)}
                {cell(cur.pWetAfterWet, f?.pWetAfterWet, 2)}
                {cell(cur.windMeanMph, f?.windMeanMph)}
                <td className="table-cell">{f?.counts.days ?? 0}</td>
              </tr>
            );
          })}
        </tbody>
      </table>
    </div>
  );
}

