import type { Metadata } from "next";
import { notFound } from "next/navigation";
import { AppError } from "@/lib/server/errors";
import { requireScenario } from "@/lib/server/access";
import { ShareLinks } from "./share-links";
import { ClosureNotices } from "./closure-notices";

export const metadata: Metadata = { title: "Share" };

export default async function SharePage({ params }: { params: Promise<{ scenarioId: string }> }) {
  const { scenarioId } = await params;
  const { scenario } = await requireScenario(scenarioId, "shareScenario").catch((e) => {
    if (e instanceof AppError && (e.code === "not_found" || e.code === "forbidden")) notFound();
    throw e;
  });
  return (
    <div className="space-y-5">
      <ShareLinks scenarioId={scenarioId} />
      <ClosureNotices projectId={scenario.projectId} scenarioId={scenarioId} />
    </div>
  );
}
