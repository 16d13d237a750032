"use client";
/**
 * A plan search opened by its share link: the same chart and table as the signed-in page, read-only — no
 * progress bar to cancel, no "Save as scenario". While the search still runs it reads the link's own JSON
 * again every few seconds, so plans appear as they finish.
 */
import { useQuery } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import type { SharedSearchAnswer, SharedSearchPlans } from "@/lib/search-contract";
import { SearchPlans } from "./search-plans";
import { SearchSize } from "./search-view";

const running = (status: string | null | undefined) => status === "queued" || status === "running";

export function SharedSearchView({ token, initial, targetDate }: { token: string; initial: SharedSearchPlans; targetDate: string | null }) {
  const query = useQuery<SharedSearchPlans>({
    queryKey: ["shared-search", token],
    queryFn: () => api<SharedSearchAnswer>(`/api/shared-search/${encodeURIComponent(token)}`),
    initialData: initial,
    refetchInterval: (q) => (running(q.state.data?.search.jobStatus) ? 3000 : false),
  });
  const data = query.data;
  return (
    <div className="space-y-5" data-testid="shared-search">
      <section className="card">
        <h2>{data.search.name}</h2>
        <p className="mt-1 text-sm text-muted">
          <SearchSize search={data.search} variants={data.variants} />
          {running(data.search.jobStatus) ? " Still running: plans appear here as they finish." : ""}
        </p>
        {query.isError && (
          <p role="alert" className="mt-2 text-sm text-bad">
            The latest plans could not be read: {query.error.message}
          </p>
        )}
      </section>
      <SearchPlans variants={data.variants} targetDate={targetDate} />
    </div>
  );
}
