import type { Metadata } from "next";
import { redirect } from "next/navigation";
import { requireScenario } from "@/lib/server/access";
import { FieldDataPanel } from "./field-data-panel";
import { orRefused } from "@/lib/server/page-access";

export const metadata: Metadata = { title: "Field data" };

export default async function FieldDataPage({ params }: { params: Promise<{ scenarioId: string }> }) {
  const { scenarioId } = await params;
  const { scenario, archived } = await orRefused(requireScenario(scenarioId, "editScenario", "look"));
  // No uploads into an archived project: the scenario's page says why and how to restore it.
  if (archived) redirect(`/scenarios/${scenario.id}`);
  return <FieldDataPanel scenarioId={scenario.id} />;
}
