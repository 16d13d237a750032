"use client";
import { useEffect, useState } from "react";
import { useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import { api, ApiError } from "@/lib/api-client";
import { formatIsoDay } from "@/lib/format";
import { HourOptions } from "@/components/hour-options";
import type { LookAheadNoticeAnswer } from "@/lib/look-ahead-contract";

/** The daily e-mail of this board to the field team, at a chosen local hour, saying what changed since the last one. */
export function NoticeForm({ scenarioId }: { scenarioId: string }) {
  const qc = useQueryClient();
  const key = ["scenarios", scenarioId, "look-ahead-notice"];
  const q = useQuery({ queryKey: key, queryFn: () => api<LookAheadNoticeAnswer>(`/api/scenarios/${scenarioId}/look-ahead/notice`).then((r) => r.notice) });
  const [enabled, setEnabled] = useState(true);
  const [hour, setHour] = useState(15);
  const [recipients, setRecipients] = useState("");
  useEffect(() => {
    if (!q.data) return;
    setEnabled(q.data.enabled);
    setHour(q.data.hour);
    setRecipients(q.data.recipients.join("\n"));
  }, [q.data]);
  const save = useMutation({
    mutationFn: () =>
      api(`/api/scenarios/${scenarioId}/look-ahead/notice`, {
        method: "PUT",
        body: { enabled, hour, recipients: recipients.split(/[\s,;]+/).filter(Boolean) },
      }),
    onSuccess: () => qc.invalidateQueries({ queryKey: key }),
  });
  const problem = (path: string) => (save.error instanceof ApiError ? save.error.fields.filter((f) => f.path === path || f.path.startsWith(`${path}[`)).map((f) => f.message)[0] : undefined);
  return (
    <section className="card" aria-labelledby="notice-heading" data-testid="look-ahead-notice">
      <h2 id="notice-heading">Daily e-mail</h2>
      <p className="mt-1 text-sm text-muted">
        Sends this board every day at the chosen hour (the scenario&apos;s time zone) to the field team, with what changed since the day before.
        {q.data === null ? " Not set up yet: nothing is sent until recipients are saved here." : q.data?.enabled === false ? " Turned off: nothing is sent." : ""}
        {q.data?.lastSentOn ? ` Last sent for ${formatIsoDay(q.data.lastSentOn)}.` : ""}
      </p>
      <form
        className="mt-3 grid gap-3 sm:grid-cols-[auto_auto_1fr_auto] sm:items-start"
        onSubmit={(e) => {
          e.preventDefault();
          save.mutate();
        }}
      >
        <label className="flex items-center gap-2 pt-7 text-sm">
          <input type="checkbox" checked={enabled} onChange={(e) => setEnabled(e.target.checked)} /> {/* Ticked before anything is saved: say it starts on saving, not that it is sending now. */}
          {q.data === null ? "Send daily, once saved" : "Send daily"}
        </label>
        <div>
          <label htmlFor="notice-hour" className="field-label">
            At
          </label>
          <select id="notice-hour" className="field-input" value={hour} onChange={(e) => setHour(Number(e.target.value))}>
            <HourOptions />
          </select>
        </div>
        <div>
          <label htmlFor="notice-recipients" className="field-label">
            Recipients (one e-mail address a line)
          </label>
          <textarea
            id="notice-recipients"
            className="field-input"
            rows={3}
            value={recipients}
            onChange={(e) => setRecipients(e.target.value)}
            aria-invalid={!!problem("recipients")}
            aria-describedby={problem("recipients") ? "notice-recipients-error" : undefined}
          />
          {problem("recipients") && (
            <p id="notice-recipients-error" className="field-error">
              {problem("recipients")}
            </p>
          )}
        </div>
        <button type="submit" className="btn-primary sm:mt-6" disabled={save.isPending}>
          Save
        </button>
      </form>
      {save.isSuccess && <p role="status" className="mt-2 text-sm text-ok">Saved.</p>}
      {save.isError && !problem("recipients") && (
        <p role="alert" className="mt-2 text-sm text-bad">
          {save.error.message}
        </p>
      )}
    </section>
  );
}
