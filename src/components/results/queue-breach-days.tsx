"use client";
/**
 * The days of the representative iteration whose longest queue broke the user's queue limit (miles; the
 * limit is the person's own setting, ../use-queue-limit), with when the queue cleared — the list a traffic
 * engineer checks before signing off the closure plan. Reads only `summary.traffic.days`.
 */
import type { RunSummary } from "@sim/summary";
import { formatIsoDate } from "@/lib/format";
import { useQueueLimit } from "../use-queue-limit";

const SHOWN = 40;

export function QueueBreachDays({ summary }: { summary: RunSummary }) {
  const [limit] = useQueueLimit();
  const t = summary.traffic;
  if (!t) return null;
  const over = t.days.filter((d) => d.peakQueueMiles > limit.miles);
  return (
    <div className="mt-4" data-testid="queue-breach-days">
      <h3>Days whose longest queue passed {limit.miles} mi</h3>
      {over.length === 0 ? (
        <p className="mt-1 text-sm">None: on every day of the iteration nearest the P50 the longest queue stayed within {limit.miles} mi.</p>
      ) : (
        <>
          <p className="mt-1 text-sm">
            {over.length} day{over.length === 1 ? "" : "s"} in the iteration nearest the P50 (the limit is set in the plan editor&apos;s Traffic section).
          </p>
          <table className="mt-2 w-full max-w-2xl text-sm">
            <thead>
              <tr>
                <th scope="col">Date</th>
                <th scope="col">Longest queue (mi)</th>
                <th scope="col">Vehicles</th>
                <th scope="col">Queue cleared</th>
              </tr>
            </thead>
            <tbody>
              {over.slice(0, SHOWN).map((d) => (
                <tr key={d.date}>
                  <th scope="row">{formatIsoDate(d.date)}</th>
                  <td>{d.peakQueueMiles.toFixed(2)}</td>
                  <td>{d.peakQueueVeh.toLocaleString("en-US")}</td>
                  <td>{d.clearsAt ? d.clearsAt.replace("T", " ") : "—"}</td>
                </tr>
              ))}
            </tbody>
          </table>
          {over.length > SHOWN && <p className="mt-1 text-xs text-muted">The first {SHOWN} are listed; the day-by-day table above has them all.</p>}
        </>
      )}
    </div>
  );
}
