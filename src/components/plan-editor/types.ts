/** Shapes of `GET /api/scenarios/<id>` as the plan editor reads them (dates arrive as ISO strings). */
import type { ProjectRole } from "@/lib/permissions";

export interface ScenarioRecord {
  id: string;
  projectId: string;
  name: string;
  description: string;
  version: number;
  changeNote: string;
  updatedAt: string;
  updatedByName: string;
  ownerName: string;
  definition: unknown;
}

export interface Revision {
  version: number;
  changeNote: string;
  savedAt: string;
  savedByName: string;
}

export interface ScenarioResponse {
  scenario: ScenarioRecord;
  role: ProjectRole;
  /** The project is archived: the plan is read-only for everyone. */
  archived: boolean;
  revisions: Revision[];
}
