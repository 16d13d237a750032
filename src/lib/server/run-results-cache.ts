import "server-only";
/**
 * The stored copies of run results (db/stored-results.ts) kept in this process, so that reading a run sends
 * its ~20–200 kB of compressed charts data from memory rather than fetching it from the database again on
 * every read. Safe to keep: a copy is identified by the SHA-256 of the results (`resultsEtag`), which the
 * route reads from the database on every request together with the reader's role — so access is still
 * decided per request, a run that is gone is still 404, and a copy whose run changed is never served.
 * Bounded in bytes (least recently used out first); the budget is what a few thousand typical runs take.
 */
import type { StoredResults } from "@db/stored-results";
import { fillStoredResults, getStoredResults } from "@db/queries/runs";
import { LRUCache } from "lru-cache";

export const RUN_RESULTS_CACHE_BYTES = 48 * 1024 * 1024;

// Sized by the compressed bytes held; a copy larger than the whole budget is not kept (maxEntrySize). One per
// process, kept on globalThis: the app's own build and the read routes served beside it (fast-reads.ts, a
// separate bundle in the same process) share it, so the budget is one budget.
const holder = globalThis as unknown as { __pourlineRunResults?: LRUCache<string, StoredResults> };
const cache = (holder.__pourlineRunResults ??= new LRUCache<string, StoredResults>({
  maxSize: RUN_RESULTS_CACHE_BYTES,
  maxEntrySize: RUN_RESULTS_CACHE_BYTES,
  sizeCalculation: (stored) => Math.max(1, stored.resultsDeflate.length),
}));

/** The stored copy of run `runId` whose tag is `resultsEtag` (null: the row has no copy yet — made now, once). */
export async function storedResultsFor(runId: string, resultsEtag: string | null): Promise<StoredResults | null> {
  const held = resultsEtag ? cache.get(runId) : undefined;
  if (held && held.resultsEtag === resultsEtag) return held;
  const stored = (resultsEtag ? await getStoredResults({ id: runId }) : null) ?? (await fillStoredResults({ id: runId }));
  if (stored) cache.set(runId, stored);
  return stored;
}
