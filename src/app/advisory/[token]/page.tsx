import type { Metadata } from "next";
import { buildAdvisory, nothingBeforeText, AVOID_MILES } from "@/lib/advisory";
import { formatDateTimeIn, formatIsoDate } from "@/lib/format";
import { orNotFound } from "@/lib/server/page-access";
import { todayIn } from "@/lib/progress-schema";
import { requirePublishedPlan } from "@/lib/server/published-plan";
import { DriverAdvice } from "./driver-advice";
import { describeQueueLimit, queueLimitOf } from "@sim/queue-limit";

// The token is a bearer secret: keep the page out of search engines and out of Referer headers.
export const metadata: Metadata = { title: "Travel advisory", robots: { index: false, follow: false }, referrer: "no-referrer" };
export const dynamic = "force-dynamic";

/**
 * The public travel advisory of one published closure plan: no sign-in; the token opens this page and the
 * plan's calendar feed, nothing else (db/queries/published-plans). Day by day: what is closed and when, the
 * expected longest backup and the hours to avoid, holiday weekends flagged, and the usual advice to drivers.
 */
export default async function AdvisoryPage({ params }: { params: Promise<{ token: string }> }) {
  const { token } = await params;
  const plan = await orNotFound(requirePublishedPlan(token));
  const s = plan.definition;
  const today = todayIn(s.timeZone);
  const days = buildAdvisory(s, plan.summary, today) ?? [];
  const nothingBefore = nothingBeforeText(days, today);
  const hasTraffic = !!s.traffic && s.traffic.directions.length > 0;
  return (
    <div className="min-h-screen">
      <header className="border-b border-line bg-white">
        <div className="mx-auto flex max-w-4xl flex-wrap items-center justify-between gap-3 px-5 py-3">
          <p className="text-lg font-bold tracking-tight text-brand-700">Pourline</p>
          <p className="text-sm text-muted">Travel advisory</p>
        </div>
      </header>
      <main id="main" className="mx-auto max-w-4xl space-y-5 px-5 py-6">
        <div>
          {plan.region && <p className="text-sm text-muted">{plan.region}</p>}
          <h1 data-testid="advisory-title">{plan.structure}: lane closures and expected delays</h1>
          <p className="mt-1 text-sm">
            Last updated {formatDateTimeIn(plan.publishedAt, s.timeZone)} (this page shows each new publication). Times are local ({s.timeZone}). They are planning estimates and move with weather and progress; signs
            at the work zone always come first.
          </p>
        </div>

        <DriverAdvice />

        <section aria-labelledby="days-heading" className="space-y-3">
          <h2 id="days-heading">Day by day</h2>
          {hasTraffic ? (
            <p className="text-sm text-muted">
              Hours to avoid are the hours in which the backup is expected to pass {AVOID_MILES} mile. Days marked “Long delays expected” are those whose backup
              is expected to pass the project&apos;s own limit of {describeQueueLimit(queueLimitOf(s))}. Backups and delays are estimates from typical traffic for
              that kind of day.
            </p>
          ) : (
            <p className="text-sm text-muted">This plan carries no traffic estimate, so only the closures are listed.</p>
          )}
          {nothingBefore && (
            <p className="card font-medium" data-testid="advisory-nothing-before">
              {nothingBefore}
            </p>
          )}
          {days.length === 0 ? (
            <p className="card" data-testid="advisory-none">
              No closures are planned from today on.
            </p>
          ) : (
            <ol className="space-y-3" data-testid="advisory-days">
              {days.map((d) => (
                <li key={d.date} className="card" data-testid="advisory-day">
                  <h3 className="flex flex-wrap items-center gap-2">
                    <span>
                      {d.weekday} {formatIsoDate(d.date)}
                    </span>
                    {d.holidayWeekend && (
                      <span className="badge bg-warn-bg text-warn" data-testid="holiday-flag">
                        Holiday weekend: heavy traffic
                      </span>
                    )}
                    {hasTraffic && d.overLimit && (
                      <span className="badge bg-bad-bg text-bad" data-testid="long-delay-flag">
                        Long delays expected
                      </span>
                    )}
                  </h3>
                  {d.closures.length > 0 ? (
                    <ul className="mt-2 list-disc pl-5 text-sm">
                      {d.closures.map((c, i) => (
                        <li key={i}>
                          {c.name}: lane{c.lanes.length === 1 ? "" : "s"} {c.lanes.join(", ")} closed{" "}
                          {c.from === "00:00" && c.to === "24:00" ? "all day" : `${c.from}–${c.to}`}
                          {c.standing ? " (long-term closure behind barrier)" : ""}
                        </li>
                      ))}
                    </ul>
                  ) : (
                    <p className="mt-2 text-sm">No closure; a backup from the night before may still be clearing.</p>
                  )}
                  {hasTraffic && (
                    <p className="mt-2 text-sm" data-testid="advisory-backup">
                      {d.longestBackupMiles >= 0.1 ? (
                        <>
                          Expected longest backup: <strong>{d.longestBackupMiles.toLocaleString("en-US")} mile{d.longestBackupMiles === 1 ? "" : "s"}</strong>
                          {d.longestDelayMinutes >= 1 ? <>, up to about <strong>{d.longestDelayMinutes.toLocaleString("en-US")} minute{d.longestDelayMinutes === 1 ? "" : "s"}</strong> of delay</> : ""}.{" "}
                          {d.avoid.length > 0 ? <>Hours to avoid: <strong>{d.avoid.join(", ")}</strong>.</> : "No hour is expected to back up past a quarter mile."}
                        </>
                      ) : (
                        "No significant backup expected."
                      )}
                    </p>
                  )}
                </li>
              ))}
            </ol>
          )}
          {days.length > 0 && <p className="text-sm text-muted">The list shows the next 45 days with a closure or a backup. Every closure is in the calendar below.</p>}
        </section>

        <p className="text-sm">
          <a className="text-brand-700 underline" href={`/api/shared/${token}/closures.ics`}>
            Add every closure to your calendar (iCalendar feed)
          </a>
        </p>
      </main>
    </div>
  );
}
