import type { Metadata } from "next";
import { PlanEditor } from "@/components/plan-editor/plan-editor";

export const metadata: Metadata = { title: "Plan" };

/** The scenario's plan: the layout above gives the header and tabs; the editor loads and saves on the client. */
export default async function PlanPage({ params }: { params: Promise<{ scenarioId: string }> }) {
  const { scenarioId } = await params;
  return <PlanEditor scenarioId={scenarioId} />;
}
