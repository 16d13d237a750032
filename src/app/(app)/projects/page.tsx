import type { Metadata } from "next";
import Link from "next/link";
import { listProjectsForUser } from "@db/queries/projects";
import { pageUser } from "@/lib/server/page-access";
import { planProgressAndAgainst } from "@/lib/server/plan-progress";
import { RoleBadge } from "@/components/role-badge";
import { PlanOfRecordHeadline } from "@/components/plan-of-record-headline";
import { formatDateTime, formatStation } from "@/lib/format";
import type { ProjectRole } from "@/lib/permissions";

export const metadata: Metadata = { title: "Projects" };

export default async function ProjectsPage() {
  const { user } = await pageUser();
  const projects = await listProjectsForUser({ userId: user.id });
  const progress = await planProgressAndAgainst(projects.map((p) => p.planScenarioId));
  const active = projects.filter((p) => p.archivedAt === null);
  const archived = projects.filter((p) => p.archivedAt !== null);
  return (
    <div className="space-y-6">
      <div className="flex flex-wrap items-end justify-between gap-3">
        <div>
          <h1>Your projects</h1>
          <p className="mt-1 text-sm text-muted">Structures you are a member of, with your role on each.</p>
        </div>
        <Link href="/projects/new" className="btn-secondary">
          New project
        </Link>
      </div>
      {active.length === 0 ? (
        <div className="card text-center">
          <h2>{archived.length ? "No projects in use" : "No projects yet"}</h2>
          <p className="mt-2 text-sm text-muted">Start one for your structure with New project, or ask an administrator of a project to add you as a member.</p>
        </div>
      ) : (
        <ProjectCards projects={active} progress={progress} />
      )}
      {archived.length > 0 && (
        <details className="card" data-testid="archived-projects">
          <summary className="cursor-pointer font-semibold">Archived projects ({archived.length})</summary>
          <p className="mt-1 text-sm text-muted">Kept as records: they can be read, not changed. An administrator of one can restore it from its page.</p>
          <div className="mt-4">
            <ProjectCards projects={archived} progress={progress} />
          </div>
        </details>
      )}
    </div>
  );
}

type ProjectRow = Awaited<ReturnType<typeof listProjectsForUser>>[number];

function ProjectCards({ projects, progress }: { projects: ProjectRow[]; progress: Awaited<ReturnType<typeof planProgressAndAgainst>> }) {
  return (
    <ul className="grid gap-4 md:grid-cols-2">
      {projects.map((p) => (
        <li key={p.id}>
          <Link href={`/projects/${p.id}`} className="card block h-full hover:border-brand-600">
            <div className="flex items-start justify-between gap-3">
              <h2 className="text-base">{p.name}</h2>
              <RoleBadge role={p.role as ProjectRole} />
            </div>
            <p className="mt-1 text-sm text-muted">{[p.structureName, p.region, p.archivedAt ? `archived ${formatDateTime(p.archivedAt)}` : ""].filter(Boolean).join(" · ")}</p>
            <dl className="mt-4 grid grid-cols-3 gap-2 text-sm">
              <div>
                <dt className="text-muted">Deck</dt>
                <dd className="font-medium">{p.deckLengthFt.toLocaleString("en-US")} ft</dd>
              </div>
              <div>
                <dt className="text-muted">From</dt>
                <dd className="font-medium">{formatStation(p.startStationFt)}</dd>
              </div>
              <div>
                <dt className="text-muted">Lanes</dt>
                <dd className="font-medium">{p.lanes.length}</dd>
              </div>
            </dl>
            <div className="mt-4 border-t border-line pt-3">
              <p className="text-xs font-semibold uppercase tracking-wide text-muted">Plan of record</p>
              <div className="mt-1">
                <PlanOfRecordHeadline plan={p} {...(p.planScenarioId ? progress.get(p.planScenarioId) : null)} />
              </div>
            </div>
          </Link>
        </li>
      ))}
    </ul>
  );
}
