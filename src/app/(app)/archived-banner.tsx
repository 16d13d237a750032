import { archivedByName } from "@db/queries/projects";
import { ArchivedNotice } from "@/components/archived-notice";
import { can, type ProjectRole } from "@/lib/permissions";

/** The archived notice of a project's pages (nothing when it is in use): every page says so, since a link may land anywhere. */
export async function ArchivedBanner({ project, role }: { project: { id: string; archivedAt: Date | null }; role: ProjectRole }) {
  if (!project.archivedAt) return null;
  return <ArchivedNotice projectId={project.id} archivedAt={project.archivedAt} byName={await archivedByName({ projectId: project.id })} canRestore={can(role, "archiveProject", true)} />;
}
