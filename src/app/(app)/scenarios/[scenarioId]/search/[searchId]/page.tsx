import type { Metadata } from "next";
import { notFound } from "next/navigation";
import { requireScenario } from "@/lib/server/access";
import { orNotFound } from "@/lib/server/page-access";
import { can } from "@/lib/permissions";
import { getSearch } from "@db/queries/searches";
import { SearchView } from "@/components/search/search-view";
import { ShareLinks } from "@/components/share-links";

export const metadata: Metadata = { title: "Plan search" };

/**
 * One saved search; its address is the link to share with project members. Those who may share the scenario
 * may also make read-only links to the search for people outside the project.
 */
export default async function SearchResultPage({ params }: { params: Promise<{ scenarioId: string; searchId: string }> }) {
  const { scenarioId, searchId } = await params;
  const { scenario, role, archived } = await orNotFound(requireScenario(scenarioId, "read"));
  const search = /^[0-9a-f-]{36}$/i.test(searchId) ? await getSearch({ id: searchId }) : null;
  if (!search || search.scenarioId !== scenario.id) notFound();
  const target = (scenario.definition as { targetDate?: unknown }).targetDate;
  return (
    <div className="space-y-5">
      <SearchView searchId={search.id} targetDate={typeof target === "string" ? target : null} canRun={can(role, "runScenario", archived)} canEdit={can(role, "editScenario", archived)} />
      {can(role, "shareScenario") && (
        <ShareLinks
          endpoint={`/api/searches/${search.id}/share-links`}
          shows="Anyone with the link sees this search's plans — the chart and the table — without signing in. They cannot save a plan as a scenario, stop the search or see anything else of the project."
          listHeading="Links to this search"
          canCreate={!archived}
        />
      )}
    </div>
  );
}
