"use client";
import { useState } from "react";
import { useMutation } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import type { ForecastAlertsAnswer } from "@/lib/project-contract";

/**
 * A member's own forecast e-mails on this project: one checkbox, saved as it is ticked. On an archived project
 * (which sends nothing) it is offered only to turn the e-mails off.
 */
export function ForecastAlertsToggle({ projectId, initial, email, archived }: { projectId: string; initial: boolean; email: string; archived: boolean }) {
  const [on, setOn] = useState(initial);
  const save = useMutation({
    mutationFn: (next: boolean) => api<ForecastAlertsAnswer>(`/api/projects/${projectId}/forecast-alerts`, { method: "PUT", body: { forecastAlerts: next } }),
    onMutate: (next) => setOn(next),
    // Not saved: the box shows what is stored again.
    onError: (_e, next) => setOn(!next),
  });
  // Decided on what was stored when the page was drawn, so turning them off keeps the box and its answer in view.
  if (archived && !initial) return null;
  return (
    <div className="mt-4 border-t border-line pt-3" data-testid="forecast-alerts">
      <div className="flex items-start gap-2 text-sm">
        <input
          id="forecast-alerts"
          type="checkbox"
          className="mt-0.5"
          checked={on}
          disabled={save.isPending}
          aria-describedby="forecast-alerts-hint"
          onChange={(e) => save.mutate(e.target.checked)}
        />
        <div>
          <label htmlFor="forecast-alerts">E-mail me each new forecast of the plan of record</label>
          <p id="forecast-alerts-hint" className="text-xs text-muted">
            {archived
              ? "The project is archived, so none are sent."
              : `To ${email}, each time its forecast moves on (a new run of the plan until the field log has re-forecast it, then each new re-forecast) or another plan is chosen: its P80 and P50 finish, how far it moved, the chance of meeting the target, how far the job has got and how it stands against the plan.`}
          </p>
        </div>
      </div>
      <p aria-live="polite" className="mt-1 text-sm text-ok">
        {save.isSuccess ? (save.data.forecastAlerts ? "Forecast e-mails on." : "Forecast e-mails off.") : ""}
      </p>
      {save.isError && (
        <p role="alert" className="field-error">
          {save.error.message}
        </p>
      )}
    </div>
  );
}
