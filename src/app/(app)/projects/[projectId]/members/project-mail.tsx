/**
 * "E-mail from this project": who gets which e-mail, in one place for the administrator. Each list is kept where
 * it is set (a member's own tick, a scenario's Week ahead, the Share tab's closure-notice subscribers and their weekly e-mail); this card
 * only reads them, so an administrator who removes someone can see what still goes to them.
 */
import Link from "next/link";
import type { Project } from "@db/schema";
import { forecastAlertReaders } from "@db/queries/forecast-alerts";
import { listProjectLookAheadNotices } from "@db/queries/look-ahead-notices";
import { listClosureSubscribers } from "@db/queries/closure-notices";
import { getClosureWeekly } from "@db/queries/closure-weekly";
import { weeklyWhenText } from "@/lib/closure-weekly";
import { formatHour, formatIsoDay } from "@/lib/format";

const namesText = (names: string[]) => new Intl.ListFormat("en-US", { type: "conjunction" }).format(names);

export async function ProjectMail({ project }: { project: Pick<Project, "id" | "planScenarioId" | "archivedAt"> }) {
  const [readers, notices, subscribers, weekly] = await Promise.all([
    forecastAlertReaders({ projectId: project.id }),
    listProjectLookAheadNotices({ projectId: project.id }),
    listClosureSubscribers({ projectId: project.id }),
    getClosureWeekly({ projectId: project.id }),
  ]);
  const forecastReaders = readers.map((r) => r.name).sort((a, b) => a.localeCompare(b));
  const shareTab = project.planScenarioId ?? notices[0]?.scenarioId ?? null;
  return (
    <section className="card space-y-4" aria-labelledby="project-mail-heading" data-testid="project-mail">
      <div>
        <h2 id="project-mail-heading">E-mail from this project</h2>
        <p className="mt-1 text-sm text-muted">
          Who gets which e-mail from this project. Each list is changed where it is set, as said beside it.
          {project.archivedAt ? " The project is archived: none of these are sent until it is restored." : ""}
        </p>
      </div>
      <div>
        <h3 className="text-sm font-semibold">Each new forecast of the plan of record</h3>
        <p className="text-sm">
          {project.planScenarioId === null
            ? "None is sent: no plan of record has been chosen on the project page."
            : forecastReaders.length === 0
              ? "Nobody has asked for it yet."
              : `To ${namesText(forecastReaders)}.`}{" "}
          <span className="text-muted">Each member ticks or unticks it for themselves on the project page.</span>
        </p>
      </div>
      <div>
        <h3 className="text-sm font-semibold">Week ahead, daily</h3>
        {notices.length === 0 ? (
          <p className="text-sm">Not set up on any scenario. <span className="text-muted">A scenario&apos;s Week ahead tab sets it up.</span></p>
        ) : (
          <ul className="space-y-1 text-sm">
            {notices.map((n) => (
              <li key={n.scenarioId}>
                <Link href={`/scenarios/${n.scenarioId}/look-ahead`} className="text-brand-700 underline">
                  {n.name}
                </Link>
                {n.enabled ? ` — at ${formatHour(n.hour)} (the scenario's time zone) to ${n.recipients.join(", ")}` : " — turned off"}
                {n.lastSentOn ? <span className="text-muted">; last sent for {formatIsoDay(n.lastSentOn)}</span> : null}
              </li>
            ))}
          </ul>
        )}
      </div>
      <div>
        <h3 className="text-sm font-semibold">Closure notices, when a plan&apos;s closures are published</h3>
        <p className="text-sm" data-testid="project-mail-closures">
          {subscribers.length === 0
            ? "Nobody subscribed yet."
            : `To ${subscribers.length} ${subscribers.length === 1 ? "subscriber" : "subscribers"}: ${subscribers.map((s) => (s.label ? `${s.label} (${s.email})` : s.email)).join(", ")}.`}{" "}
          {weekly?.day != null && weekly.hour != null
            ? `The week ahead of the closures published last also goes to them weekly, ${weeklyWhenText(weekly.day, weekly.hour)} (the plan's time zone).`
            : "No weekly e-mail of the week ahead."}{" "}
          {shareTab && (
            <span className="text-muted">
              Kept on a scenario&apos;s{" "}
              <Link href={`/scenarios/${shareTab}/share`} className="text-brand-700 underline">
                Share tab
              </Link>
              .
            </span>
          )}
        </p>
      </div>
    </section>
  );
}
