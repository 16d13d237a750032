/** Small figures of a run: weather-lost shifts, discovered-condition hours, lane-closed hours by closure. */
import type { RunSummary } from "@sim/summary";

const num = (v: number, digits = 0) => (Number.isFinite(v) ? v.toLocaleString("en-US", { maximumFractionDigits: digits }) : "—");

function Stat({ title, children, note }: { title: string; children: React.ReactNode; note?: string }) {
  return (
    <div className="rounded-md border border-line bg-paper/60 px-4 py-3">
      <h3 className="text-sm font-semibold text-muted">{title}</h3>
      <div className="mt-1 text-ink">{children}</div>
      {note && <p className="mt-1 text-xs text-muted">{note}</p>}
    </div>
  );
}

export function StatCards({ summary }: { summary: RunSummary }) {
  const closures = (summary.laneClosedHours?.byClosure ?? []).map((c) => ({ id: c.closure, name: c.name, hours: c.p50 }));
  return (
    <div className="grid gap-3 sm:grid-cols-3" data-testid="run-stats">
      <Stat title="Weather-lost shifts" note="Shifts with a ready crew and an open calendar but no production because of weather.">
        <p>
          <span className="text-xl font-semibold">{num(summary.weatherLostShifts.p50)}</span> <span className="text-sm">P50</span>
          <span className="mx-2 text-muted">·</span>
          <span className="text-xl font-semibold">{num(summary.weatherLostShifts.p80)}</span> <span className="text-sm">P80</span>
        </p>
      </Stat>
      <Stat title="Discovered-condition hours" note="Extra work where milling or demolition finds deeper deterioration.">
        <p>
          <span className="text-xl font-semibold">{num(summary.discoveredHours.p50, 1)} h</span> <span className="text-sm">P50</span>
          <span className="mx-2 text-muted">·</span>
          <span className="text-xl font-semibold">{num(summary.discoveredHours.p80, 1)} h</span> <span className="text-sm">P80</span>
        </p>
      </Stat>
      <Stat title="Lane-closed hours by closure" note="P50 over iterations: lanes closed × hours the closure stands (set-up and take-down included).">
        {closures.length === 0 ? (
          <p className="text-sm text-muted">No closure was used.</p>
        ) : (
          <dl className="space-y-0.5 text-sm">
            {summary.laneClosedHours && (
              <div className="flex justify-between gap-3 border-b border-line pb-0.5">
                <dt className="font-medium">All closures (a lane closed twice at once counts once)</dt>
                <dd className="whitespace-nowrap font-semibold tabular-nums">{num(summary.laneClosedHours.total.p50)} h</dd>
              </div>
            )}
            {closures.map((c) => (
              <div key={c.id} className="flex justify-between gap-3">
                <dt>{c.name}</dt>
                <dd className="whitespace-nowrap font-semibold tabular-nums">{num(c.hours)} h</dd>
              </div>
            ))}
          </dl>
        )}
      </Stat>
    </div>
  );
}
