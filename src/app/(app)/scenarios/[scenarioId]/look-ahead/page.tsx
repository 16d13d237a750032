import type { Metadata } from "next";
import { requireScenario } from "@/lib/server/access";
import { orNotFound } from "@/lib/server/page-access";
import { can } from "@/lib/permissions";
import { LookAheadBoardView } from "./look-ahead-board";
import { NoticeForm } from "./notice-form";

export const metadata: Metadata = { title: "Week ahead" };

export default async function LookAheadPage({ params }: { params: Promise<{ scenarioId: string }> }) {
  const { scenarioId } = await params;
  const { role, scenario, archived } = await orNotFound(requireScenario(scenarioId, "read"));
  return (
    <div className="space-y-5">
      {/* Those who may set the project's location get a link to where it is set when it is missing. */}
      <LookAheadBoardView scenarioId={scenarioId} locationHref={can(role, "editProject", archived) ? `/projects/${scenario.projectId}#location-heading` : null} />
      {can(role, "shareScenario", archived) && <NoticeForm scenarioId={scenarioId} />}
    </div>
  );
}
