"use client";
import { useEffect, useState } from "react";
import { useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import { HourOptions } from "@/components/hour-options";
import { SaveOutcome } from "@/components/save-outcome";
import { WEEKDAY_NAMES, weeklySettingText } from "@/lib/closure-weekly";
import type { ClosureWeeklyAnswer } from "@/lib/closure-notice-contract";

/**
 * The weekly e-mail of the week ahead to the closure-notice subscribers: on for a weekday after a local hour, or off;
 * with what its last day did. It sends only the closures published last (src/lib/server/closure-weekly.ts).
 */
export function ClosureWeeklyForm({ projectId, archived }: { projectId: string; archived: boolean }) {
  const qc = useQueryClient();
  const key = ["projects", projectId, "closure-weekly"];
  const current = useQuery({ queryKey: key, queryFn: () => api<ClosureWeeklyAnswer>(`/api/projects/${projectId}/closure-weekly`) });
  const [on, setOn] = useState(false);
  const [day, setDay] = useState(4);
  const [hour, setHour] = useState(7);
  useEffect(() => {
    if (!current.data) return;
    setOn(current.data.closureWeeklyDay !== null);
    if (current.data.closureWeeklyDay !== null) setDay(current.data.closureWeeklyDay);
    if (current.data.closureWeeklyHour !== null) setHour(current.data.closureWeeklyHour);
  }, [current.data]);
  const body = { closureWeeklyDay: on ? day : null, closureWeeklyHour: on ? hour : null };
  const unchanged = current.data && body.closureWeeklyDay === current.data.closureWeeklyDay && body.closureWeeklyHour === current.data.closureWeeklyHour;
  const save = useMutation({
    mutationFn: () => api(`/api/projects/${projectId}/closure-weekly`, { method: "PUT", body }),
    onSuccess: () => qc.invalidateQueries({ queryKey: key }),
  });
  const d = current.data;
  return (
    <div className="mt-4 border-t border-line pt-3" data-testid="closure-weekly">
      <h3>Weekly e-mail</h3>
      <p className="mt-1 text-sm text-muted">
        Once a week, the closures published last for the seven days ahead — day by day, with the expected backups — to everyone on the list. Weeks with
        no closure send nothing; times are the plan&apos;s time zone.
      </p>
      {d && (
        <p className="mt-2 text-sm" data-testid="closure-weekly-state">
          {d.closureWeeklyDay !== null && d.closureWeeklyHour !== null ? `${weeklySettingText(d.closureWeeklyDay, d.closureWeeklyHour)}.` : "Off."}
          {d.note && <span className="block text-xs text-muted">{d.note}</span>}
        </p>
      )}
      {!archived && (
        <form
          className="mt-2 flex flex-wrap items-end gap-3"
          data-testid="closure-weekly-form"
          onSubmit={(e) => {
            e.preventDefault();
            save.mutate();
          }}
        >
          <label className="flex items-center gap-2 pb-2 text-sm">
            <input type="checkbox" checked={on} onChange={(e) => (save.reset(), setOn(e.target.checked))} /> Send it weekly
          </label>
          <div>
            <label htmlFor="closure-weekly-day" className="field-label">
              On
            </label>
            <select id="closure-weekly-day" className="field-input" value={day} disabled={!on} onChange={(e) => (save.reset(), setDay(Number(e.target.value)))}>
              {WEEKDAY_NAMES.map((name, i) => (
                <option key={name} value={i}>
                  {name}
                </option>
              ))}
            </select>
          </div>
          <div>
            <label htmlFor="closure-weekly-hour" className="field-label">
              After
            </label>
            <select id="closure-weekly-hour" className="field-input" value={hour} disabled={!on} onChange={(e) => (save.reset(), setHour(Number(e.target.value)))}>
              <HourOptions />
            </select>
          </div>
          <button type="submit" className="btn-secondary" disabled={save.isPending || !d || !!unchanged}>
            {save.isPending ? "Saving…" : "Save"}
          </button>
          <SaveOutcome saved={save.isSuccess} error={save.error} />
        </form>
      )}
    </div>
  );
}
