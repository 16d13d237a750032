import type { Metadata } from "next";
import { requireProject } from "@/lib/server/access";
import { MembersPanel } from "./members-panel";
import { orRefused } from "@/lib/server/page-access";
import { Breadcrumb } from "@/components/breadcrumb";
import { ArchivedBanner } from "../../../archived-banner";
import { ProjectMail } from "./project-mail";

export const metadata: Metadata = { title: "Members" };

export default async function MembersPage({ params }: { params: Promise<{ projectId: string }> }) {
  const { projectId } = await params;
  const { project, user, role } = await orRefused(requireProject(projectId, "manageMembers"));
  return (
    <div className="space-y-5">
      <Breadcrumb project={{ id: project.id, name: project.name }} here={"Members"} />
      <ArchivedBanner project={project} role={role} />
      <h1>Members</h1>
      <MembersPanel projectId={project.id} selfId={user.id} />
      <ProjectMail project={project} />
    </div>
  );
}
