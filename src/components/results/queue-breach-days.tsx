"use client";
/**
 * The days of the representative iteration whose longest queue broke the plan's queue limit (miles of queue or
 * minutes of delay, `traffic.queueLimit`, sim/queue-limit), with when the queue cleared — the list a traffic
 * engineer checks before signing off the closure plan. Reads only `summary.traffic.days` and the limit.
 */
import type { RunSummary } from "@sim/summary";
import { daysOverLimit, describeQueueLimit, type QueueLimit } from "@sim/queue-limit";
import { formatClockOnDay, formatIsoDate } from "@/lib/format";
import { ScrollBox } from "@/components/scroll-box";

const SHOWN = 40;

export function QueueBreachDays({ summary, limit }: { summary: RunSummary; limit: QueueLimit }) {
  const t = summary.traffic;
  if (!t) return null;
  const over = daysOverLimit(t.days, limit);
  const words = describeQueueLimit(limit);
  return (
    <div className="mt-4" data-testid="queue-breach-days">
      <h3>Days whose longest queue passed {words}</h3>
      {over === null ? (
        <p className="mt-1 text-sm">This run was stored before delay minutes were kept day by day; run the plan again to list the days over a limit in minutes.</p>
      ) : over.length === 0 ? (
        <p className="mt-1 text-sm">None: on every day of the iteration nearest the P50 the longest queue stayed within {words}.</p>
      ) : (
        <>
          <p className="mt-1 text-sm">
            {over.length} day{over.length === 1 ? "" : "s"} in the iteration nearest the P50 (the limit is part of the plan, in the plan editor&apos;s Traffic section).
          </p>
          {/* Figures right-aligned under right-aligned headings, in even-width digits, so a column reads down. */}
          <ScrollBox label="Days past the queue limit (scrolls sideways)" className="mt-2">
            <table className="w-full max-w-2xl text-sm tabular-nums [&_td]:px-2 [&_td]:text-right [&_th]:px-2 [&_thead_th]:text-right [&_thead_th:first-child]:text-left">
              <thead>
                <tr>
                  <th scope="col">Date</th>
                  <th scope="col">Longest queue (mi)</th>
                  <th scope="col">Vehicles</th>
                  <th scope="col">Longest delay (min)</th>
                  <th scope="col">Queue cleared</th>
                </tr>
              </thead>
              <tbody>
                {over.slice(0, SHOWN).map((d) => (
                  <tr key={d.date}>
                    <th scope="row" className="whitespace-nowrap text-left">{formatIsoDate(d.date)}</th>
                    <td>{d.peakQueueMiles.toFixed(2)}</td>
                    <td>{d.peakQueueVeh.toLocaleString("en-US")}</td>
                    <td>{d.peakDelayMinutes === undefined ? "—" : Math.round(d.peakDelayMinutes).toLocaleString("en-US")}</td>
                    <td>{formatClockOnDay(d.clearsAt, d.date)}</td>
                  </tr>
                ))}
              </tbody>
            </table>
          </ScrollBox>
          {over.length > SHOWN && <p className="mt-1 text-xs text-muted">The first {SHOWN} are listed; the day-by-day table above has them all.</p>}
        </>
      )}
    </div>
  );
}
