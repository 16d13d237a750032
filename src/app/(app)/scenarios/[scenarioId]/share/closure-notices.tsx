"use client";
import { useState } from "react";
import { useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import { api, ApiError } from "@/lib/api-client";
import { formatDateTime } from "@/lib/format";
import { PublishPreviewDialog, type PublicationPreview } from "./publish-preview-dialog";

interface Subscriber {
  id: string;
  email: string;
  label: string;
}
interface Publication {
  id: string;
  closureCount: number;
  notified: number;
  publishedAt: string;
  publishedByName: string;
}

/** Who hears about closures, and the one action that tells them: publish this scenario's planned closures. */
export function ClosureNotices({ projectId, scenarioId }: { projectId: string; scenarioId: string }) {
  const qc = useQueryClient();
  const subsKey = ["projects", projectId, "closure-subscribers"];
  const pubsKey = ["scenarios", scenarioId, "closure-publications"];
  const subs = useQuery({ queryKey: subsKey, queryFn: () => api<{ subscribers: Subscriber[] }>(`/api/projects/${projectId}/closure-subscribers`).then((r) => r.subscribers) });
  const pubs = useQuery({ queryKey: pubsKey, queryFn: () => api<{ publications: Publication[] }>(`/api/scenarios/${scenarioId}/closure-publications`).then((r) => r.publications) });
  const [email, setEmail] = useState("");
  const [label, setLabel] = useState("");
  const add = useMutation({
    mutationFn: () => api(`/api/projects/${projectId}/closure-subscribers`, { method: "POST", body: { email, label } }),
    onSuccess: () => (setEmail(""), setLabel(""), qc.invalidateQueries({ queryKey: subsKey })),
  });
  const remove = useMutation({ mutationFn: (id: string) => api(`/api/projects/${projectId}/closure-subscribers/${id}`, { method: "DELETE" }), onSuccess: () => qc.invalidateQueries({ queryKey: subsKey }) });
  const preview = useMutation({ mutationFn: () => api<PublicationPreview>(`/api/scenarios/${scenarioId}/closure-publications/preview`) });
  const publish = useMutation({
    mutationFn: (runId: string) => api<{ closureCount: number; notified: number; feedUrl: string; advisoryUrl: string }>(`/api/scenarios/${scenarioId}/closure-publications`, { method: "POST", body: { runId } }),
    onSuccess: () => (preview.reset(), qc.invalidateQueries({ queryKey: pubsKey })),
  });
  const emailProblem = add.error instanceof ApiError ? add.error.fields.find((f) => f.path === "email")?.message : undefined;

  return (
    <section className="card" aria-labelledby="notices-heading" data-testid="closure-notices">
      <h2 id="notices-heading">Closure notices</h2>
      <p className="mt-1 text-sm text-muted">
        Publishing sends the planned lane closures of this scenario&apos;s latest run to everyone on the list, with a calendar feed they can subscribe to.
        Closures come from the run&apos;s representative iteration: planning estimates that move with weather and progress. Work-zone traffic control
        and public notice follow the project&apos;s own requirements.
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
          <form
            className="mt-3 grid gap-2 sm:grid-cols-[1fr_1fr_auto] sm:items-end"
            onSubmit={(e) => {
              e.preventDefault();
              add.mutate();
            }}
          >
            <div>
              <label htmlFor="subscriber-email" className="field-label">
                E-mail
              </label>
              <input id="subscriber-email" type="email" className="field-input" value={email} onChange={(e) => setEmail(e.target.value)} required aria-invalid={!!emailProblem} />
            </div>
            <div>
              <label htmlFor="subscriber-label" className="field-label">
                Who (optional)
              </label>
              <input id="subscriber-label" className="field-input" value={label} onChange={(e) => setLabel(e.target.value)} maxLength={120} />
            </div>
            <button type="submit" className="btn-secondary" disabled={add.isPending}>
              Add
            </button>
          </form>
          {emailProblem && <p className="field-error">E-mail {emailProblem}</p>}
        </div>
        <div>
          <h3>Publish</h3>
          <button type="button" className="btn-primary mt-2" disabled={preview.isPending || publish.isPending} onClick={() => (publish.reset(), preview.mutate())} data-testid="publish-closures">
            {preview.isPending ? "Preparing the preview…" : `Preview the notice to ${subs.data?.length ?? 0}…`}
          </button>
          {preview.isError && (
            <p role="alert" className="field-error">
              {preview.error.message}
            </p>
          )}
          {preview.data && (
            <PublishPreviewDialog
              preview={preview.data}
              busy={publish.isPending}
              error={publish.isError ? publish.error.message : null}
              onConfirm={() => publish.mutate(preview.data!.runId)}
              onCancel={() => (preview.reset(), publish.reset())}
            />
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
          <h3 className="mt-4">Earlier publications</h3>
          {pubs.data && pubs.data.length > 0 ? (
            <ul className="mt-2 text-sm">
              {pubs.data.map((p) => (
                <li key={p.id}>
                  {formatDateTime(p.publishedAt)} by {p.publishedByName}: {p.closureCount} closures, {p.notified} notified
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
