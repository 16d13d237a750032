/**
 * What the plan-search routes answer, for the search pages (src/components/search) and the server that builds the
 * answers (`searchView`, `publicSearchView` in src/lib/server/searches.ts, `loadSharedSearch` in
 * src/lib/server/shared.ts):
 * - `GET /api/searches/:id` → `SearchAnswer`: the search and every variant so far (a running search is read again
 *   every few seconds), each marked on the frontier or not and whether using it would change the plan;
 * - `GET /api/shared-search/:token` → `SharedSearchAnswer`: the same plans behind a share link, without the ids
 *   that lead anywhere (job, scenario, project, the variants' choices) — a link is read-only;
 * - `POST /api/scenarios/:id/searches` → `SearchStartedAnswer` (202), `POST /api/searches/:id/adopt` →
 *   `SearchAdoptedAnswer`; saving a variant as a scenario answers `ScenarioCreatedAnswer` (./scenario-contract).
 * Times are ISO strings: what the JSON carries.
 */
import type { PlanOutcome } from "@sim/frontier";
import type { SearchSpec } from "@sim/search";
import type { JobStatus, JobView } from "./job-contract";

/** One plan of a search as its table and chart draw it, on the signed-in page and behind a link alike. */
export interface VariantRow {
  idx: number;
  label: string;
  status: "pending" | "done" | "infeasible" | "failed";
  outcome: PlanOutcome | null;
  problem: string | null;
  /** The plan as saved, run beside the variants as the reference point. */
  current: boolean;
  onFrontier: boolean;
  /** Using it in the plan would change something (false for a variant that chooses what the plan has; absent on a shared search). */
  changesPlan?: boolean;
}

/** A plan as the signed-in page gets it: with the choice that makes it (null for the plan as saved), to adopt or save it. */
export type SearchVariant = VariantRow & { choice: number[] | null; changesPlan: boolean };

export interface SearchRecord {
  id: string;
  projectId: string;
  scenarioId: string;
  /** The version the search varied; `stale` once the plan was saved again since (then it can no longer be adopted). */
  scenarioVersion: number;
  stale: boolean;
  /** Its plans are computed under an earlier revision of the model rules (the data layer's `olderRules`). */
  olderRules: boolean;
  scenarioName: string;
  name: string;
  spec: SearchSpec;
  method: "grid" | "sample";
  gridSize: number;
  /** Variants besides the plan as saved. */
  variantCount: number;
  /** A search of the rest of the job: the field log's data date, and how many shifts it held when the search began. */
  fromFieldLog: NonNullable<SearchSpec["fromFieldLog"]> | null;
  fieldLogShifts: number | null;
  createdAt: string;
  createdByName: string;
  jobId: string | null;
  jobStatus: JobStatus | null;
}

export interface SearchAnswer {
  search: SearchRecord;
  variants: SearchVariant[];
}

export type SharedSearchRecord = Pick<SearchRecord, "name" | "method" | "gridSize" | "variantCount" | "scenarioVersion" | "stale" | "olderRules" | "createdAt" | "createdByName" | "jobStatus" | "fromFieldLog" | "fieldLogShifts">;

/** The search itself as a link shows it; the shared page receives this part first from the server, then reads the whole answer again. */
export interface SharedSearchPlans {
  search: SharedSearchRecord;
  variants: VariantRow[];
}

export interface SharedSearchAnswer extends SharedSearchPlans {
  link: { label: string; expiresAt: string };
  project: { name: string; structureName: string; region: string } | null;
  scenario: { name: string; targetDate: string | null };
}

export interface SearchStartedAnswer {
  search: { id: string; method: "grid" | "sample"; gridSize: number };
  job: JobView;
}

/** The variant became the next version of the searched scenario. */
export interface SearchAdoptedAnswer {
  scenarioId: string;
  version: number;
}
