import type { Metadata } from "next";
import { requireScenario } from "@/lib/server/access";
import { FieldDataPanel } from "./field-data-panel";
import { orNotFound } from "@/lib/server/page-access";

export const metadata: Metadata = { title: "Field data" };

export default async function FieldDataPage({ params }: { params: Promise<{ scenarioId: string }> }) {
  const { scenarioId } = await params;
  const { scenario } = await orNotFound(requireScenario(scenarioId, "editScenario"), ["not_found", "forbidden"]);
  return <FieldDataPanel scenarioId={scenario.id} />;
}
