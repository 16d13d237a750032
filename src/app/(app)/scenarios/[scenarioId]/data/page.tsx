import type { Metadata } from "next";
import { requireScenario } from "@/lib/server/access";
import { FieldDataPanel } from "./field-data-panel";
import { orRefused } from "@/lib/server/page-access";

export const metadata: Metadata = { title: "Field data" };

export default async function FieldDataPage({ params }: { params: Promise<{ scenarioId: string }> }) {
  const { scenarioId } = await params;
  const { scenario } = await orRefused(requireScenario(scenarioId, "editScenario"));
  return <FieldDataPanel scenarioId={scenario.id} />;
}
