/**
 * What `GET /api/progress/:id` answers: one shift of the field log as stored, and its history — who created,
 * corrected, deleted or put it back, and when, newest first — which the field log's table lists under the shift.
 * Times are ISO strings: what the JSON carries.
 */
import type { ProgressEntry } from "@sim/progress-entry";

/** A shift as stored: the field-log entry contract's fields (sim/progress-entry) and the record kept about them. */
export type ProgressEntryRecord = ProgressEntry & {
  id: string;
  projectId: string;
  scenarioId: string | null;
  version: number;
  enteredById: string;
  enteredByName: string;
  createdAt: string;
  updatedAt: string;
};

export interface ProgressHistoryRow {
  id: string;
  changedAt: string;
  changedByName: string;
  action: "create" | "edit" | "delete" | "restore";
  /**
   * The entry's fields before and after the change, as they were stored then: older rows may predate fields added to
   * the entry since, so they are read as plain records. Null before a creation or a put-back, and after a deletion.
   */
  before: Record<string, unknown> | null;
  after: Record<string, unknown> | null;
}

export interface ProgressEntryAnswer {
  entry: ProgressEntryRecord;
  history: ProgressHistoryRow[];
}

/**
 * What `POST /api/scenarios/:id/progress/import/check` answers for a file whose every row passes (one with any
 * problem answers 400 naming each line and column, as the import does): what loading it would add. Nothing is stored.
 */
export interface ProgressImportPreview {
  shifts: number;
  skippedDeleted: number;
  /** The work dates of the first and last shift in the file (yyyy-mm-dd); null when it holds none. */
  from: string | null;
  to: string | null;
  /** Each operation the file records, in the plan's order: its shifts, the feet a re-forecast counts done from them (progress to date), their dates, hours lost. */
  operations: { operationId: string; name: string; shifts: number; feet: number; first: string; last: string; lostHours: number }[];
  rainShifts: number;
  /** Discovered conditions recorded with the shifts. */
  discovered: number;
}

/**
 * What `POST /api/scenarios/:id/progress/import` answers once a file's shifts are in the log (all of them; a file
 * with any problem stores none and answers 400 naming each line and column): how many were loaded, and how many rows
 * the download with deleted shifts marked deleted and were left out.
 */
export interface ProgressImportAnswer {
  imported: number;
  skippedDeleted: number;
  /** The work dates of the first and last shift loaded (yyyy-mm-dd). */
  from: string;
  to: string;
}
