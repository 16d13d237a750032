import type { Metadata } from "next";
import Link from "next/link";
import { requireProject } from "@/lib/server/access";
import { RoleBadge } from "@/components/role-badge";
import { formatStation } from "@/lib/format";
import { can } from "@/lib/permissions";
import { ScenarioTable } from "./scenario-table";
import { LocationForm } from "./location-form";
import { orNotFound } from "@/lib/server/page-access";
import { Breadcrumb } from "@/components/breadcrumb";
import { ProjectDetailsForm } from "@/components/project-details-form";
import { ArchiveButton } from "@/components/archive-button";
import { ArchivedBanner } from "../../archived-banner";
import { getPlanOfRecord } from "@db/queries/projects";
import { listProjectScenarios } from "@db/queries/scenarios";
import { PlanOfRecordHeadline } from "@/components/plan-of-record-headline";
import { PlanOfRecordPicker } from "./plan-of-record-picker";
import { DailyReforecastForm } from "./daily-reforecast-form";
import { getDailyReforecast } from "@db/queries/daily-reforecast";
import { dailyReforecastText } from "@/lib/daily-reforecast";
import { planProgressAndAgainst } from "@/lib/server/plan-progress";
import { publicationLagTexts } from "@/lib/server/closure-notices";
import { ForecastAlertsToggle } from "./forecast-alerts-toggle";
import { getForecastAlerts } from "@db/queries/forecast-alerts";

export const metadata: Metadata = { title: "Project" };

export default async function ProjectPage({ params }: { params: Promise<{ projectId: string }> }) {
  const { projectId } = await params;
  const access = await orNotFound(requireProject(projectId, "read"));
  const { project, role, archived, user } = access;
  const planRead = getPlanOfRecord({ projectId: project.id });
  const [plan, alertsOn, texts, daily, lags] = await Promise.all([
    planRead,
    getForecastAlerts({ projectId: project.id, userId: user.id }),
    planProgressAndAgainst([project.planScenarioId]),
    getDailyReforecast({ projectId: project.id }),
    planRead.then((p) => publicationLagTexts([{ planScenarioId: project.planScenarioId, planRunId: p?.planRunId ?? null }])),
  ]);
  const { progress = null, against = null } = (project.planScenarioId && texts.get(project.planScenarioId)) || {};
  const publicationLag = (project.planScenarioId && lags.get(project.planScenarioId)) || null;
  return (
    <div className="space-y-6">
      <Breadcrumb here={project.name} />
      <ArchivedBanner project={project} role={role} />
      <header className="flex flex-wrap items-start justify-between gap-4">
        <div>
          <div className="flex items-center gap-3">
            <h1>{project.name}</h1>
            <RoleBadge role={role} />
          </div>
          <p className="mt-1 text-sm text-muted">
            {[project.structureName, project.region, `${project.deckLengthFt.toLocaleString("en-US")} ft from ${formatStation(project.startStationFt)}`, project.lanes.join(", ")]
              .filter(Boolean)
              .join(" · ")}
          </p>
          {project.description && <p className="mt-2 max-w-3xl whitespace-pre-line text-sm">{project.description}</p>}
        </div>
        <div className="flex gap-2">
          <Link href={`/projects/${project.id}/compare`} className="btn-secondary">
            Compare scenarios
          </Link>
          {can(role, "manageMembers") && (
            <Link href={`/projects/${project.id}/members`} className="btn-secondary">
              Members
            </Link>
          )}
          {!archived && can(role, "archiveProject") && <ArchiveButton projectId={project.id} archived={false} projectName={project.name} />}
        </div>
      </header>
      <section className="card" aria-labelledby="plan-of-record-heading" data-testid="plan-of-record">
        <h2 id="plan-of-record-heading">Plan of record</h2>
        <p className="mt-1 text-sm text-muted">The scenario the project is run by: its forecast — the newest re-forecast from the field log once there is one, else its newest run — is what the project list shows and what the owner is told.</p>
        <div className="mt-3">{plan && <PlanOfRecordHeadline plan={plan} link progress={progress} against={against} publicationLag={publicationLag} />}</div>
        {can(role, "editProject", archived) && (
          <PlanOfRecordPicker projectId={project.id} current={project.planScenarioId} scenarios={(await listProjectScenarios({ projectId: project.id })).map((s) => ({ id: s.id, name: s.name }))} />
        )}
        {project.planScenarioId && daily && (
          <div className="mt-4 border-t border-line pt-3" data-testid="daily-reforecast">
            <p className="text-sm">{dailyReforecastText(daily)}</p>
            {daily.note && <p className="mt-1 text-xs text-muted">{daily.note}</p>}
            {can(role, "editProject", archived) && <DailyReforecastForm projectId={project.id} initial={daily} />}
          </div>
        )}
        <ForecastAlertsToggle projectId={project.id} initial={alertsOn} email={user.email} archived={archived} />
      </section>
      <ScenarioTable projectId={project.id} canEdit={can(role, "editScenario", archived)} planScenarioId={project.planScenarioId} />
      <LocationForm projectId={project.id} latitude={project.latitude} longitude={project.longitude} canEdit={can(role, "editProject", archived)} />
      {can(role, "editProject", archived) && (
        <details className="card" data-testid="project-details">
          <summary className="cursor-pointer font-semibold">Edit project details</summary>
          <div className="mt-4">
            <ProjectDetailsForm
              project={{
                id: project.id,
                name: project.name,
                structureName: project.structureName,
                region: project.region,
                deckLengthFt: project.deckLengthFt,
                startStationFt: project.startStationFt,
                lanes: project.lanes,
                description: project.description,
              }}
            />
          </div>
        </details>
      )}
    </div>
  );
}
