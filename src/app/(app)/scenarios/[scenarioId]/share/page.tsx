import type { Metadata } from "next";
import { requireScenario } from "@/lib/server/access";
import { ShareLinks } from "./share-links";
import { ClosureNotices } from "./closure-notices";
import { orRefused } from "@/lib/server/page-access";

export const metadata: Metadata = { title: "Share" };

export default async function SharePage({ params }: { params: Promise<{ scenarioId: string }> }) {
  const { scenarioId } = await params;
  const { scenario } = await orRefused(requireScenario(scenarioId, "shareScenario"));
  return (
    <div className="space-y-5">
      <ShareLinks scenarioId={scenarioId} />
      <ClosureNotices projectId={scenario.projectId} scenarioId={scenarioId} />
    </div>
  );
}
