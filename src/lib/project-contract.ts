/**
 * What a project's settings routes answer, for the forms that change them and the handlers:
 * - `POST /api/projects` (a new project, 201) and `PUT /api/projects/:id` (its details) → `ProjectSavedAnswer`, the
 *   project to open next;
 * - `PUT /api/projects/:id/location` → `ProjectLocation` and `PUT /api/projects/:id/forecast-alerts` →
 *   `ForecastAlertsAnswer`: the setting as stored, which is the request's own contract once parsed.
 */
import type { z } from "zod";
import type { forecastAlertsSchema } from "./schemas";

export type { ProjectLocation } from "./look-ahead-schemas";

export interface ProjectSavedAnswer {
  id: string;
}

export type ForecastAlertsAnswer = z.output<typeof forecastAlertsSchema>;
