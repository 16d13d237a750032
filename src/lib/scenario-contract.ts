/**
 * What the routes of one scenario answer, for the plan editor (src/components/plan-editor), the pages that change a
 * plan from elsewhere (field data's "Apply to the plan") or make a new one, and the route handlers that build them:
 * - `GET /api/scenarios/:id` → `ScenarioAnswer`: the plan as stored, what the reader may do with it and its saved
 *   versions;
 * - `PUT /api/scenarios/:id` → `ScenarioSavedAnswer`; a save over a version someone else replaced is a 409 whose body
 *   is `ScenarioConflict` — the plan as it now stands, so the editor can show both and let the person choose;
 * - `GET /api/scenarios/:id/revisions?version=N` → `RevisionPairAnswer`: a saved version and the one before it, which
 *   the editor's history compares in words;
 * - a new scenario (`POST /api/projects/:id/scenarios`, a variant `POST /api/scenarios/:id/variants`, a search's
 *   variant `POST /api/searches/:id/scenarios`) → `ScenarioCreatedAnswer`.
 * Times are ISO strings: what the JSON carries.
 */
import type { ProjectRole } from "./permissions";

export interface ScenarioRecord {
  id: string;
  projectId: string;
  name: string;
  description: string;
  version: number;
  changeNote: string;
  createdAt: string;
  updatedAt: string;
  ownerId: string;
  ownerName: string;
  updatedById: string;
  updatedByName: string;
  /** As stored: checked against the scenario format by whoever reads it (sim/validate). */
  definition: Record<string, unknown>;
}

export interface Revision {
  version: number;
  changeNote: string;
  savedAt: string;
  savedByName: string;
}

export interface ScenarioAnswer {
  scenario: ScenarioRecord;
  role: ProjectRole;
  /** The project is archived: the plan is read-only for everyone. */
  archived: boolean;
  /** Newest first. */
  revisions: Revision[];
}

export interface ScenarioSavedAnswer {
  version: number;
}

/** The 409 body of a save over a version someone else replaced; null when the scenario was deleted meanwhile. */
export type ScenarioConflict = {
  current: ScenarioRecord | null;
};

export interface RevisionPairAnswer extends Revision {
  definition: Record<string, unknown>;
  /** Null for the first version: nothing before it to compare with. */
  previous: { version: number; definition: Record<string, unknown> } | null;
}

export interface ScenarioCreatedAnswer {
  id: string;
  version: number;
}
