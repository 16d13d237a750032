import type { Metadata } from "next";
import { requireScenario } from "@/lib/server/access";
import { ShareLinks } from "@/components/share-links";
import { ClosureNotices } from "./closure-notices";
import { orRefused } from "@/lib/server/page-access";

export const metadata: Metadata = { title: "Share" };

export default async function SharePage({ params }: { params: Promise<{ scenarioId: string }> }) {
  const { scenarioId } = await params;
  const { scenario, archived } = await orRefused(requireScenario(scenarioId, "shareScenario", "look"));
  return (
    <div className="space-y-5">
      <ShareLinks
        endpoint={`/api/scenarios/${scenarioId}/share-links`}
        shows="Anyone with the link sees this scenario's inputs and latest results without signing in. They cannot change anything or see other scenarios."
        listHeading="Links to this scenario and its searches"
        showOpens
        canCreate={!archived}
      />
      <ClosureNotices projectId={scenario.projectId} scenarioId={scenarioId} archived={archived} />
    </div>
  );
}
