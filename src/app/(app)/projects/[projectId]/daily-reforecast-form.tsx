"use client";
import { useState } from "react";
import { useRouter } from "next/navigation";
import { useMutation } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import { SaveOutcome } from "@/components/save-outcome";
import type { DailyReforecastState } from "@/lib/daily-reforecast";
import { HourOptions } from "@/components/hour-options";

/**
 * The daily re-forecast of the plan of record (its administrators and engineers): on at a chosen hour, or off. Saved
 * with its button; the page is drawn again so the words above follow.
 */
export function DailyReforecastForm({ projectId, initial }: { projectId: string; initial: DailyReforecastState }) {
  const router = useRouter();
  const [on, setOn] = useState(initial.hour !== null);
  const [hour, setHour] = useState(initial.hour ?? 6);
  const chosen = on ? hour : null;
  const save = useMutation({
    mutationFn: () => api(`/api/projects/${projectId}/daily-reforecast`, { method: "PUT", body: { dailyReforecastHour: chosen } }),
    onSuccess: () => router.refresh(),
  });
  return (
    <form
      className="mt-3 flex flex-wrap items-end gap-3"
      data-testid="daily-reforecast-form"
      onSubmit={(e) => {
        e.preventDefault();
        save.mutate();
      }}
    >
      <label className="flex items-center gap-2 pb-2 text-sm">
        <input type="checkbox" checked={on} onChange={(e) => (save.reset(), setOn(e.target.checked))} /> Re-forecast the plan of record each morning
      </label>
      <div>
        <label htmlFor="daily-reforecast-hour" className="field-label">
          After<span className="sr-only"> this hour each morning, the plan&apos;s time zone</span>
        </label>
        <select id="daily-reforecast-hour" className="field-input" value={hour} disabled={!on} onChange={(e) => (save.reset(), setHour(Number(e.target.value)))}>
          <HourOptions />
        </select>
      </div>
      <button type="submit" className="btn-secondary" disabled={save.isPending || chosen === initial.hour}>
        {save.isPending ? "Saving…" : "Save"}
      </button>
      <SaveOutcome saved={save.isSuccess} error={save.error} />
    </form>
  );
}
