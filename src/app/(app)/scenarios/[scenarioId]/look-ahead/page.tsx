import type { Metadata } from "next";
import { requireScenario } from "@/lib/server/access";
import { orNotFound } from "@/lib/server/page-access";
import { can } from "@/lib/permissions";
import { LookAheadBoardView } from "./look-ahead-board";
import { NoticeForm } from "./notice-form";

export const metadata: Metadata = { title: "Week ahead" };

export default async function LookAheadPage({ params }: { params: Promise<{ scenarioId: string }> }) {
  const { scenarioId } = await params;
  const { role } = await orNotFound(requireScenario(scenarioId, "read"));
  return (
    <div className="space-y-5">
      <LookAheadBoardView scenarioId={scenarioId} />
      {can(role, "shareScenario") && <NoticeForm scenarioId={scenarioId} />}
    </div>
  );
}
