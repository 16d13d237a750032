/**
 * The printed brief's traffic section: the closure plan, the longest expected backups, the days over the
 * plan's queue limit, the holiday trade-off in one place, and the work-zone safety caution. Reads the stored
 * run and the plan (src/lib/brief-traffic.ts); only the trade-off is computed, in the browser (./brief-tradeoff).
 */
import type { RunSummary } from "@sim/run-summary-schema";
import type { Scenario } from "@sim/schema";
import { describeQueueLimit } from "@sim/queue-limit";
import { closurePlanRows, limitCheck, longestBackups } from "@/lib/brief-traffic";
import { formatClockOnDay, formatIsoDate } from "@/lib/format";
import { BriefTradeoff } from "./brief-tradeoff";

const SHOWN_DAYS = 20;
const hours = (h: number | null) => (h === null ? "—" : Math.round(h).toLocaleString("en-US"));

export function BriefTraffic({ plan, summary, seed, iterations }: { plan: Scenario; summary: RunSummary; seed: string; iterations: number }) {
  const closures = closurePlanRows(plan, summary);
  const backups = longestBackups(summary);
  const check = limitCheck(plan, summary);
  const hasTraffic = !!summary.traffic;
  if (closures.length === 0 && !hasTraffic) return null;
  return (
    <section className="card space-y-4" aria-labelledby="brief-traffic-heading" data-testid="brief-traffic">
      <h2 id="brief-traffic-heading">Traffic and closures</h2>

      <div>
        <h3>Closure plan</h3>
        <p className="mt-1 text-sm">
          When each lane closure may stand and how often it stood in the iteration nearest the P50 (the same closures the calendar feed and the public
          advisory publish).
        </p>
        <table className="mt-2 w-full text-xs" data-testid="brief-closure-plan">
          <thead>
            <tr>
              <th scope="col" className="text-left">Closure</th>
              <th scope="col" className="text-left">Lanes closed</th>
              <th scope="col" className="text-left">When it may stand</th>
              <th scope="col" className="text-right">Times it stood</th>
              <th scope="col" className="text-left">First – last day</th>
              <th scope="col" className="text-right">Lane-closed hours (P50)</th>
            </tr>
          </thead>
          <tbody>
            {closures.map((c) => (
              <tr key={c.closure}>
                <th scope="row" className="text-left">
                  {c.name}
                  {c.kind === "standing" ? " (behind barrier)" : ""}
                </th>
                <td>{c.lanes.join(", ")}</td>
                <td>{c.hours}</td>
                <td className="text-right tabular-nums">{c.periods.toLocaleString("en-US")}</td>
                <td>{c.first ? `${formatIsoDate(c.first)} – ${formatIsoDate(c.last)}` : "—"}</td>
                <td className="text-right tabular-nums">{hours(c.laneHoursP50)}</td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>

      {hasTraffic && (
        <div>
          <h3>Longest expected backups</h3>
          {backups.length === 0 ? (
            <p className="mt-1 text-sm">No queue forms in the iteration nearest the P50.</p>
          ) : (
            <table className="mt-2 w-full text-xs" data-testid="brief-backups">
              <thead>
                <tr>
                  <th scope="col" className="text-left">Date</th>
                  <th scope="col" className="text-right">Longest queue (mi)</th>
                  <th scope="col" className="text-right">Vehicles</th>
                  <th scope="col" className="text-right">Longest delay (min)</th>
                  <th scope="col" className="text-right">Queue cleared</th>
                </tr>
              </thead>
              <tbody>
                {backups.map((d) => (
                  <tr key={d.date}>
                    <th scope="row" className="text-left">
                      {formatIsoDate(d.date)}
                    </th>
                    <td className="text-right tabular-nums">{d.peakQueueMiles.toFixed(1)}</td>
                    <td className="text-right tabular-nums">{d.peakQueueVeh.toLocaleString("en-US")}</td>
                    <td className="text-right tabular-nums">{d.peakDelayMinutes === undefined ? "—" : Math.round(d.peakDelayMinutes).toLocaleString("en-US")}</td>
                    <td className="text-right tabular-nums">{formatClockOnDay(d.clearsAt, d.date)}</td>
                  </tr>
                ))}
              </tbody>
            </table>
          )}
        </div>
      )}

      {check && (
        <div data-testid="brief-over-limit">
          <h3>Days over the queue limit of {describeQueueLimit(check.limit)}</h3>
          <p className="mt-1 text-sm">
            {check.days === null
              ? "This run was stored before delay minutes were kept day by day; run the plan again to count the days over a limit in minutes."
              : check.days.length === 0
                ? "None: on every day of the iteration nearest the P50 the longest queue stayed within the limit."
                : `${check.days.length.toLocaleString("en-US")} day${check.days.length === 1 ? "" : "s"} in the iteration nearest the P50: ${check.days
                    .slice(0, SHOWN_DAYS)
                    .map((d) => formatIsoDate(d.date))
                    .join(", ")}${check.days.length > SHOWN_DAYS ? `, and ${check.days.length - SHOWN_DAYS} more` : ""}.`}
          </p>
        </div>
      )}

      <div>
        <h3>Holiday trade-off</h3>
        <BriefTradeoff definition={plan} seed={seed} iterations={iterations} />
      </div>

      <aside aria-label="Work-zone safety" className="rounded-md border border-warn/30 bg-warn-bg px-4 py-3 text-sm" data-testid="brief-work-zone-caution">
        <p className="font-semibold text-warn">Work-zone safety</p>
        <p className="mt-1">
          Queues and delays here are planning estimates from typical traffic for each kind of day; a crash, rain or a slow load backs traffic up faster
          and further. Lane-closure hours, the traffic control plan and queue warning ahead of the closure are decided and approved by the agency&apos;s
          traffic engineer; crews should watch the end of the queue and take a closure down early when it grows past the limit. Workers and drivers get
          hurt at the back of queues.
        </p>
      </aside>
    </section>
  );
}
