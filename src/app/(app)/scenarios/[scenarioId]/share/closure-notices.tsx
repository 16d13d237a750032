"use client";
import { useState } from "react";
import { useForm } from "react-hook-form";
import { zodResolver } from "@hookform/resolvers/zod";
import type { z } from "zod";
import { useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import { ConfirmDialog } from "@/components/confirm-dialog";
import { api } from "@/lib/api-client";
import { applyServerErrors } from "@/lib/form-errors";
import { formatDateTime } from "@/lib/format";
import { closureSubscriberSchema } from "@/lib/schemas";
import { publishLabel } from "./publish-label";
import { ClosureWeeklyForm } from "./closure-weekly-form";
import type { ClosurePreviewAnswer, ClosurePublicationsAnswer, ClosurePublishedAnswer, ClosureSubscribersAnswer } from "@/lib/closure-notice-contract";

/**
 * Who hears about closures, and the one action that tells them: publish this scenario's planned closures —
 * after a confirmation that shows the notice exactly as it will be sent, and to whom.
 */
export function ClosureNotices({ projectId, scenarioId, archived = false }: { projectId: string; scenarioId: string; archived?: boolean }) {
  const qc = useQueryClient();
  const subsKey = ["projects", projectId, "closure-subscribers"];
  const pubsKey = ["scenarios", scenarioId, "closure-publications"];
  const subs = useQuery({ queryKey: subsKey, queryFn: () => api<ClosureSubscribersAnswer>(`/api/projects/${projectId}/closure-subscribers`).then((r) => r.subscribers) });
  const pubs = useQuery({ queryKey: pubsKey, queryFn: () => api<ClosurePublicationsAnswer>(`/api/scenarios/${scenarioId}/closure-publications`) });
  const form = useForm<z.input<typeof closureSubscriberSchema>, unknown, z.output<typeof closureSubscriberSchema>>({
    resolver: zodResolver(closureSubscriberSchema),
    defaultValues: { email: "", label: "" },
  });
  const [addError, setAddError] = useState<string | null>(null);
  const add = useMutation({
    mutationFn: (body: z.output<typeof closureSubscriberSchema>) => api(`/api/projects/${projectId}/closure-subscribers`, { method: "POST", body }),
    onSuccess: () => (form.reset(), qc.invalidateQueries({ queryKey: subsKey })),
    onError: (e) => setAddError(applyServerErrors(e, form.setError, (p) => (p === "email" || p === "label" ? p : null))),
  });
  const [confirming, setConfirming] = useState(false);
  const preview = useQuery({
    queryKey: [...pubsKey, "preview"],
    queryFn: () => api<ClosurePreviewAnswer>(`/api/scenarios/${scenarioId}/closure-publications?preview=1`).then((r) => r.preview),
    enabled: confirming,
    staleTime: 0,
    gcTime: 0,
  });
  const remove = useMutation({ mutationFn: (id: string) => api(`/api/projects/${projectId}/closure-subscribers/${id}`, { method: "DELETE" }), onSuccess: () => qc.invalidateQueries({ queryKey: subsKey }) });
  const publish = useMutation({
    mutationFn: (runId: string) =>
      api<ClosurePublishedAnswer>(`/api/scenarios/${scenarioId}/closure-publications`, { method: "POST", body: { runId } }),
    onSuccess: () => {
      setConfirming(false);
      return qc.invalidateQueries({ queryKey: pubsKey });
    },
    // Run again since the preview (409): show the new notice in the same dialog, with the refusal above it.
    onError: () => void preview.refetch(),
  });
  const emailProblem = form.formState.errors.email?.message;
  const labelProblem = form.formState.errors.label?.message;

  return (
    <section className="card" aria-labelledby="notices-heading" data-testid="closure-notices">
      <h2 id="notices-heading">Closure notices</h2>
      <p className="mt-1 text-sm text-muted">
        Publishing sends the planned lane closures of this scenario&apos;s forecast — its newest re-forecast from the field log once it has one, else its latest run — to
        everyone on the list, with a calendar feed they can subscribe to and a travel advisory for drivers. Every feed and advisory published before
        follows the newest publication, so subscribers never need to subscribe again. Closures come from the forecast&apos;s representative iteration:
        planning estimates that move with weather and progress. Work-zone traffic control and public notice follow the project&apos;s own requirements.
      </p>
      <div className="mt-4 grid gap-5 lg:grid-cols-2">
        <div>
          <h3>Subscribers</h3>
          {subs.isPending ? (
            <p className="mt-2 text-sm text-muted">Loading…</p>
          ) : subs.isError ? (
            <p role="alert" className="mt-2 text-sm text-bad">
              {subs.error.message}
            </p>
          ) : subs.data.length === 0 ? (
            <p className="mt-2 text-sm text-muted">Nobody yet — add the public information office or a partner agency.</p>
          ) : (
            <ul className="mt-2 divide-y divide-line text-sm">
              {subs.data.map((s) => (
                <li key={s.id} className="flex items-center justify-between gap-2 py-2">
                  <span>
                    {s.email}
                    {s.label && <span className="block text-xs text-muted">{s.label}</span>}
                  </span>
                  <button type="button" className="btn-secondary" onClick={() => remove.mutate(s.id)} aria-label={`Remove ${s.email}`}>
                    Remove
                  </button>
                </li>
              ))}
            </ul>
          )}
          {archived ? (
            <p className="mt-3 text-sm text-muted">The project is archived: nobody can be added until it is restored. Those listed can still be removed.</p>
          ) : (
            <>
              <form
                className="mt-3 grid gap-2 sm:grid-cols-[1fr_1fr_auto] sm:items-end"
                noValidate
                onSubmit={form.handleSubmit((v) => {
                  setAddError(null);
                  add.mutate(v);
                })}
              >
                <div>
                  <label htmlFor="subscriber-email" className="field-label">
                    E-mail
                  </label>
                  <input id="subscriber-email" type="email" className="field-input" aria-invalid={!!emailProblem} aria-describedby={emailProblem ? "subscriber-email-error" : undefined} {...form.register("email")} />
                </div>
                <div>
                  <label htmlFor="subscriber-label" className="field-label">
                    Who (optional)
                  </label>
                  <input id="subscriber-label" className="field-input" maxLength={120} aria-invalid={!!labelProblem} {...form.register("label")} />
                </div>
                <button type="submit" className="btn-secondary" disabled={add.isPending}>
                  Add
                </button>
              </form>
              {emailProblem && (
                <p id="subscriber-email-error" className="field-error">
                  E-mail {emailProblem}
                </p>
              )}
              {labelProblem && <p className="field-error">Who {labelProblem}</p>}
              {addError && (
                <p role="alert" className="field-error">
                  {addError}
                </p>
              )}
            </>
          )}
          <ClosureWeeklyForm projectId={projectId} archived={archived} />
        </div>
        <div>
          <h3>Publish</h3>
          {archived ? (
            <p className="mt-2 text-sm text-muted">The project is archived: its closures cannot be published until an administrator restores it.</p>
          ) : (
            <>
              <button type="button" className="btn-primary mt-2" disabled={publish.isPending} onClick={() => (publish.reset(), setConfirming(true))} data-testid="publish-closures">
                {publishLabel(subs.data?.length ?? 0)}
              </button>
              {confirming && (
                <ConfirmDialog
                  title="Publish the planned closures?"
                  confirmLabel={preview.data ? `Publish and send ${preview.data.to.length} notice${preview.data.to.length === 1 ? "" : "s"}` : "Publish"}
                  busyLabel="Publishing…"
                  busy={publish.isPending || preview.isFetching}
                  error={preview.isError ? preview.error.message : publish.isError ? publish.error.message : null}
                  onCancel={() => setConfirming(false)}
                  onConfirm={() => preview.data && publish.mutate(preview.data.runId)}
                  testId="publish-dialog"
                >
                  {preview.isPending ? (
                    <p className="text-muted">Preparing the notice…</p>
                  ) : preview.data ? (
                    <>
                      <p data-testid="publish-dialog-source">From the newest forecast: {preview.data.source}</p>
                      <p>
                        {preview.data.closureCount} closure period{preview.data.closureCount === 1 ? "" : "s"} go into the public calendar feed and travel advisory{pubs.data?.publications.length ? " (the links sent before show them too)" : ""}.{" "}
                        {preview.data.to.length === 0 ? "Nobody is on the list, so no e-mail is sent." : "This e-mail goes to people outside Pourline and cannot be called back:"}
                      </p>
                      {preview.data.to.length > 0 && (
                        <dl className="grid grid-cols-[auto_1fr] gap-x-3 gap-y-1">
                          <dt className="font-medium">To</dt>
                          <dd data-testid="publish-dialog-to">{preview.data.to.join(", ")}</dd>
                          <dt className="font-medium">Subject</dt>
                          <dd>{preview.data.subject}</dd>
                        </dl>
                      )}
                      <pre
                        tabIndex={0}
                        aria-label="The notice as it will be sent"
                        className="max-h-64 overflow-auto whitespace-pre-wrap rounded-md border border-line bg-paper p-3 font-sans text-xs"
                        data-testid="publish-dialog-text"
                      >
                        {preview.data.text}
                      </pre>
                    </>
                  ) : null}
                </ConfirmDialog>
              )}
            </>
          )}
          {publish.isSuccess && (
            <p role="status" className="mt-2 text-sm">
              Published {publish.data.closureCount} closures; {publish.data.notified} notice{publish.data.notified === 1 ? "" : "s"} queued. Calendar feed:{" "}
              <a className="break-all text-brand-700 underline" href={publish.data.feedUrl}>
                {publish.data.feedUrl}
              </a>
              . Travel advisory:{" "}
              <a className="break-all text-brand-700 underline" href={publish.data.advisoryUrl} data-testid="advisory-link">
                {publish.data.advisoryUrl}
              </a>
            </p>
          )}
          {pubs.data?.lag && <PublishedLag lag={pubs.data.lag} />}
          <h3 className="mt-4">Earlier publications</h3>
          {pubs.data && pubs.data.publications.length > 0 ? (
            <ul className="mt-2 space-y-1 text-sm" data-testid="closure-publications">
              {pubs.data.publications.map((p) => (
                <li key={p.id}>
                  {formatDateTime(p.publishedAt)} by {p.publishedByName}: {p.closureCount} closures, {p.notified} notified{p.withdrawn ? " — withdrawn (its link was revoked)" : ""}
                  <span className="block text-xs text-muted">{p.source}</span>
                </li>
              ))}
            </ul>
          ) : (
            <p className="mt-2 text-sm text-muted">Not published yet.</p>
          )}
        </div>
      </div>
    </section>
  );
}

/** What every feed and advisory shows came from an earlier forecast whose closures differ from the newest's (the server decides): said in words. */
function PublishedLag({ lag }: { lag: NonNullable<ClosurePublicationsAnswer["lag"]> }) {
  return (
    <div className="mt-3 rounded-md border border-warn/40 bg-warn-bg px-3 py-2 text-sm" data-testid="publication-lags">
      <p>
        <strong>The public sees an earlier forecast.</strong>{" "}
        {lag.newestStale ? "The newest forecast is of an earlier version of the plan: run the scenario again, then publish." : "Publish again to bring every calendar feed and travel advisory up to date."}
      </p>
      {lag.changes && <p className="mt-1" data-testid="publication-changes">{lag.changes}</p>}
      <dl className="mt-1 grid grid-cols-[auto_1fr] gap-x-3 text-xs">
        <dt className="font-medium">Published {formatDateTime(lag.publishedAt)}</dt>
        <dd>{lag.published}</dd>
        <dt className="font-medium">Newest forecast</dt>
        <dd>{lag.newest}</dd>
      </dl>
    </div>
  );
}
