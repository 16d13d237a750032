import type { Metadata } from "next";
import { redirect } from "next/navigation";
import { requireProject } from "@/lib/server/access";
import { listProjectScenarios } from "@db/queries/scenarios";
import { NewScenarioForm } from "./new-scenario-form";
import { orRefused } from "@/lib/server/page-access";
import { Breadcrumb } from "@/components/breadcrumb";

export const metadata: Metadata = { title: "New scenario" };

export default async function NewScenarioPage({ params }: { params: Promise<{ projectId: string }> }) {
  const { projectId } = await params;
  const { project, archived } = await orRefused(requireProject(projectId, "editScenario", "look"));
  // No new scenario in an archived project: its page says why and how to restore it.
  if (archived) redirect(`/projects/${project.id}`);
  const existing = await listProjectScenarios({ projectId });
  return (
    <div className="mx-auto max-w-2xl space-y-5">
      <Breadcrumb project={{ id: project.id, name: project.name }} here={"New scenario"} />
      <h1>New scenario</h1>
      <NewScenarioForm
        projectId={project.id}
        deck={{ deckLengthFt: project.deckLengthFt, startStationFt: project.startStationFt, lanes: project.lanes }}
        existing={existing.map((s) => ({ id: s.id, name: s.name }))}
      />
    </div>
  );
}
