import type { Metadata } from "next";
import Link from "next/link";
import { requireProject } from "@/lib/server/access";
import { MembersPanel } from "./members-panel";
import { orRefused } from "@/lib/server/page-access";

export const metadata: Metadata = { title: "Members" };

export default async function MembersPage({ params }: { params: Promise<{ projectId: string }> }) {
  const { projectId } = await params;
  const { project, user } = await orRefused(requireProject(projectId, "manageMembers"));
  return (
    <div className="space-y-5">
      <nav aria-label="Breadcrumb" className="text-sm text-muted">
        <Link href={`/projects/${project.id}`} className="hover:text-ink">
          {project.name}
        </Link>{" "}
        / <span className="text-ink">Members</span>
      </nav>
      <h1>Members</h1>
      <MembersPanel projectId={project.id} selfId={user.id} />
    </div>
  );
}
