import type { Metadata } from "next";
import { requireProject } from "@/lib/server/access";
import { can } from "@/lib/permissions";
import { MAX_COMPARE } from "@/lib/compare-contract";
import { CompareView } from "./compare-view";
import { orNotFound } from "@/lib/server/page-access";
import { Breadcrumb } from "@/components/breadcrumb";
import { ArchivedBanner } from "../../../archived-banner";

export const metadata: Metadata = { title: "Compare scenarios" };

export default async function ComparePage({
  params,
  searchParams,
}: {
  params: Promise<{ projectId: string }>;
  searchParams: Promise<Record<string, string | string[] | undefined>>;
}) {
  const { projectId } = await params;
  const sp = await searchParams;
  const { project, role, archived } = await orNotFound(requireProject(projectId, "read"));
  const raw = Array.isArray(sp.ids) ? sp.ids.join(",") : (sp.ids ?? "");
  const initialIds = [...new Set(raw.split(",").map((s) => s.trim()).filter(Boolean))].slice(0, MAX_COMPARE);
  return (
    <div className="space-y-6">
      <Breadcrumb project={{ id: project.id, name: project.name }} here={"Compare"} />
      <ArchivedBanner project={project} role={role} />
      <header>
        <h1>Compare scenarios</h1>
        <p className="mt-1 text-sm text-muted">
          {project.structureName} · the latest plan run of each scenario, side by side. Differences are from the first scenario chosen.
        </p>
      </header>
      <CompareView projectId={project.id} canEdit={can(role, "editScenario", archived)} initialIds={initialIds} />
    </div>
  );
}
