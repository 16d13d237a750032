import { requireScenario } from "@/lib/server/access";
import { RoleBadge } from "@/components/role-badge";
import { can } from "@/lib/permissions";
import { formatDateTime } from "@/lib/format";
import { ScenarioTabs } from "./scenario-tabs";
import { orNotFound } from "@/lib/server/page-access";
import { Breadcrumb } from "@/components/breadcrumb";
import { ArchivedBanner } from "../../archived-banner";

export default async function ScenarioLayout({ children, params }: { children: React.ReactNode; params: Promise<{ scenarioId: string }> }) {
  const { scenarioId } = await params;
  const access = await orNotFound(requireScenario(scenarioId, "read"));
  const { scenario, role, project, archived } = access;
  return (
    <div className="space-y-5">
      <Breadcrumb project={{ id: scenario.projectId, name: project.name }} here={scenario.name} />
      <header className="flex flex-wrap items-start justify-between gap-3">
        <div>
          <div className="flex flex-wrap items-center gap-3">
            <h1 data-testid="scenario-name">{scenario.name}</h1>
            <RoleBadge role={role} />
            {project.planScenarioId === scenario.id && (
              <span className="badge bg-brand-50 text-brand-800" title="The scenario this project is run by (chosen on the project page)">
                Plan of record
              </span>
            )}
          </div>
          <p className="mt-1 text-sm text-muted">
            Version {scenario.version} · last saved {formatDateTime(scenario.updatedAt)} by {scenario.updatedByName}
            {scenario.changeNote ? ` — ${scenario.changeNote}` : ""}
          </p>
        </div>
      </header>
      <ArchivedBanner project={project} role={role} />
      {/* Share stays for those who may share: an archived project's links can still be revoked there. */}
      <ScenarioTabs scenarioId={scenario.id} canShare={can(role, "shareScenario")} canEdit={can(role, "editScenario", archived)} />
      {children}
    </div>
  );
}
