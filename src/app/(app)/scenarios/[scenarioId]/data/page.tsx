import type { Metadata } from "next";
import { notFound } from "next/navigation";
import { AppError } from "@/lib/server/errors";
import { requireScenario } from "@/lib/server/access";
import { FieldDataPanel } from "./field-data-panel";

export const metadata: Metadata = { title: "Field data" };

export default async function FieldDataPage({ params }: { params: Promise<{ scenarioId: string }> }) {
  const { scenarioId } = await params;
  const { scenario } = await requireScenario(scenarioId, "editScenario").catch((e) => {
    if (e instanceof AppError && (e.code === "not_found" || e.code === "forbidden")) notFound();
    throw e;
  });
  return <FieldDataPanel scenarioId={scenario.id} />;
}
