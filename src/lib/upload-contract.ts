/**
 * What the field-data routes answer, for the scenario's Data page and `/api/scenarios/:id/uploads`:
 * - `GET` → `UploadsAnswer`: the newest files checked and kept for the scenario (at most 20), with who uploaded them;
 * - `POST` (a CSV) → `UploadAnswer` (201): the file passed every check and is kept, and `preview` says what applying it
 *   would change — a weather history's fitted climate beside the plan's, or a deck survey's ranges beside the plan's.
 *   Nothing changes until the page applies it as an ordinary versioned save of the plan (`scenarioVersion`: the
 *   version the preview was read against).
 * Times are ISO strings: what the JSON carries.
 */
import type { Weather, Scenario } from "@sim/schema";
import type { ClimateFit } from "@sim/weather-fit";
import type { ColumnReading } from "./csv/weather-csv";
import type { SurveyRange } from "./csv/survey-csv";

export interface UploadRow {
  id: string;
  kind: string;
  filename: string;
  sizeBytes: number;
  rowCount: number;
  uploadedAt: string;
  uploadedByName: string;
}

export interface UploadsAnswer {
  uploads: UploadRow[];
}

export interface WeatherUploadPreview {
  kind: "weather";
  fit: ClimateFit;
  current: Weather;
  /** Complete days read, from the first date to the last. */
  days: number;
  from: string;
  to: string;
  /** How each column was read (and in which unit, and why), for a person to check before applying. */
  columns: ColumnReading[];
  ignored: string[];
  skipped: number;
}

export interface SurveyUploadPreview {
  kind: "survey";
  ranges: SurveyRange[];
  current: Scenario["deck"]["survey"];
}

export type UploadPreview = WeatherUploadPreview | SurveyUploadPreview;

export interface UploadAnswer {
  upload: { id: string; uploadedAt: string; filename: string; rowCount: number };
  preview: UploadPreview;
  scenarioVersion: number;
}
