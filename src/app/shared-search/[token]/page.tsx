import type { Metadata } from "next";
import { loadSharedSearch } from "@/lib/server/shared";
import { formatDateTime, formatIsoDate } from "@/lib/format";
import { orNotFound } from "@/lib/server/page-access";
import { SharedPageFrame } from "@/components/shared-page-frame";
import { SharedSearchView } from "@/components/search/shared-search-view";

// A share link is a bearer secret: keep it out of search engines and out of Referer headers.
export const metadata: Metadata = { title: "Shared plan search", robots: { index: false, follow: false }, referrer: "no-referrer" };
export const dynamic = "force-dynamic";

/**
 * The public, read-only page of one plan search: what it compared and which plans no other beats. The token
 * opens this search only (src/lib/server/shared.ts): not its scenario, not another search.
 */
export default async function SharedSearchPage({ params }: { params: Promise<{ token: string }> }) {
  const { token } = await params;
  const shared = await orNotFound(loadSharedSearch(token));
  const { link, project, scenario, search, variants } = shared;
  return (
    <SharedPageFrame expiresAt={link.expiresAt} project={project}>
      <div>
        <h1 data-testid="shared-search-title">Plan search on “{scenario.name}”</h1>
        <p className="mt-1 max-w-3xl text-sm">
          Which plan to choose: each plan below is the scenario with some choices changed (crews, shifts, closure hours, seasons, holidays or the start
          date), run many times on the same simulated weather. The chart puts each plan at its P80 finish — the date 80 % of the simulated outcomes
          met — against the delay it causes drivers; bigger, darker marks cost more. Plans marked “Frontier” are the ones no other plan beats on finish,
          delay and cost together.
          {scenario.targetDate ? ` The scenario's target is ${formatIsoDate(scenario.targetDate)}.` : ""}
        </p>
        <p className="mt-1 text-xs text-muted">
          Started {formatDateTime(search.createdAt)}
          {search.createdByName ? ` by ${search.createdByName}` : ""}
          {link.label ? ` · shared as “${link.label}”` : ""}
        </p>
      </div>
      <SharedSearchView token={token} initial={{ search, variants }} targetDate={scenario.targetDate} />
    </SharedPageFrame>
  );
}
