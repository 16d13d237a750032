"use client";
/** The run's confidence curve with P50/P80/P90 marked and the target date's probability, plus its text alternative. */
import type { RunSummary } from "@sim/summary";
import { formatIsoDate, formatPercent } from "@/lib/format";
import { seriesStyle } from "./chart-style";
import { cdfPoints, ConfidenceChart, type Marker } from "./confidence-chart";
import { isoToDay } from "./date-axis";
import { quantileText } from "./summary-text";

const LEVELS = [
  { key: "p50", label: "P50", y: 50 },
  { key: "p80", label: "P80", y: 80 },
  { key: "p90", label: "P90", y: 90 },
] as const;

export function ConfidencePanel({ summary }: { summary: RunSummary }) {
  const points = cdfPoints(summary.cdf);
  const markers: Marker[] = [];
  for (const l of LEVELS) {
    const x = isoToDay(summary.finishAt[l.key]);
    if (x !== null) markers.push({ label: `${l.label} · ${formatIsoDate(summary.finish[l.key]).replace(/ \d{4}$/, "")}`, x, y: l.y });
  }
  const target = summary.target;
  const targetX = target ? isoToDay(target.date) : null;
  const aria =
    `Cumulative confidence curve: the share of iterations finished by each date. ` +
    LEVELS.map((l) => `${l.y} % finish by ${quantileText(summary.finish[l.key])}`).join("; ") +
    (target ? `. Target ${formatIsoDate(target.date)}: ${formatPercent(target.probability)} of iterations finish by the end of that day.` : ".");
  return (
    <figure aria-label={aria} className="m-0" data-testid="confidence-curve" data-drawn-seed={summary.seed}>
      {points.length === 0 ? (
        <p className="rounded-md border border-dashed border-line p-6 text-center text-sm text-muted">No iteration finished, so there is no curve to draw.</p>
      ) : (
        <div aria-hidden="true">
          <ConfidenceChart
            curves={[{ id: "run", name: summary.scenarioName, points, ...seriesStyle(0) }]}
            markers={markers}
            target={target && targetX !== null ? { x: targetX + 1, label: `Target ${formatIsoDate(target.date)}: ${formatPercent(target.probability)}` } : null}
          />
        </div>
      )}
      <div className="sr-only">
        <table>
        <caption>Finish date by confidence level</caption>
        <thead>
          <tr>
            <th scope="col">Confidence</th>
            <th scope="col">Finished by</th>
          </tr>
        </thead>
        <tbody>
          {(["p10", "p50", "p80", "p90"] as const).map((k) => (
            <tr key={k}>
              <th scope="row">{k.slice(1)} %</th>
              <td>{quantileText(summary.finish[k])}</td>
            </tr>
          ))}
          {target && (
            <tr>
              <th scope="row">{formatPercent(target.probability)}</th>
              <td>the target, {formatIsoDate(target.date)}</td>
            </tr>
          )}
        </tbody>
      </table>
      </div>
    </figure>
  );
}
