import type { Metadata } from "next";
import Link from "next/link";
import { requireScenario } from "@/lib/server/access";
import { orNotFound } from "@/lib/server/page-access";
import { can } from "@/lib/permissions";
import { formatDateTime } from "@/lib/format";
import { listSearches } from "@db/queries/searches";
import { listProgress } from "@db/queries/progress";
import { lastWorkDate } from "@/lib/progress-to-date";
import { validateDefinition } from "@/lib/server/scenario-input";
import { SearchForm } from "@/components/search/search-form";

export const metadata: Metadata = { title: "Plan search" };

/** "Which plan should we choose?": saved searches of this scenario, and a form to start one. */
export default async function SearchPage({ params }: { params: Promise<{ scenarioId: string }> }) {
  const { scenarioId } = await params;
  const { scenario, role, archived } = await orNotFound(requireScenario(scenarioId, "read"));
  const [searches, log] = await Promise.all([listSearches({ scenarioId }), listProgress({ scenarioId })]);
  const plan = validateDefinition(scenario.definition);
  // A job under way searches the rest of the work by default, from the last day its field log reaches.
  const fieldLog = log.length ? { shifts: log.length, lastWorkDate: lastWorkDate(log) } : null;
  return (
    <div className="space-y-5">
      {can(role, "runScenario", archived) ? <SearchForm scenarioId={scenario.id} plan={plan} fieldLog={fieldLog} /> : null}
      <section className="card">
        <h2>Saved searches</h2>
        {searches.length === 0 ? (
          <p className="mt-2 text-sm text-muted">No plan search yet.</p>
        ) : (
          <ul className="mt-2 divide-y divide-line text-sm" data-testid="search-list">
            {searches.map((s) => (
              <li key={s.id} className="py-2">
                <Link href={`/scenarios/${scenario.id}/search/${s.id}`} className="font-medium text-brand-700 hover:underline">
                  {s.name}
                </Link>{" "}
                <span className="text-muted">
                  — {s.variants - 1} variants ({s.method === "grid" ? "every combination" : "sampled"}), version {s.scenarioVersion}, {s.jobStatus ?? "unknown"}, {formatDateTime(s.createdAt)} by {s.createdByName}
                </span>
              </li>
            ))}
          </ul>
        )}
      </section>
    </div>
  );
}
