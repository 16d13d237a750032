"use client";
/**
 * Read-only links to a scenario or to one of its plan searches: a react-hook-form form on the shared contract
 * (src/lib/schemas.ts) and the list, revoked only after a confirmation. `endpoint` lists and creates the links
 * (`/api/scenarios/:id/share-links` or `/api/searches/:id/share-links`); revoking is the same for every link.
 */
import { useState } from "react";
import { useForm } from "react-hook-form";
import { zodResolver } from "@hookform/resolvers/zod";
import { z } from "zod";
import { useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import { ConfirmDialog } from "@/components/confirm-dialog";
import { api } from "@/lib/api-client";
import { applyServerErrors } from "@/lib/form-errors";
import { formatDateTime } from "@/lib/format";
import { shareLinkSchema } from "@/lib/schemas";
import type { ShareLinkCreatedAnswer, ShareLinkRow, ShareLinksAnswer } from "@/lib/share-link-contract";

function statusOf(l: ShareLinkRow): { text: string; tone: string } {
  if (l.revokedAt) return { text: "Revoked", tone: "bg-bad-bg text-bad" };
  if (new Date(l.expiresAt).getTime() <= Date.now()) return { text: "Expired", tone: "bg-paper text-muted border border-line" };
  return { text: "Live", tone: "bg-brand-50 text-brand-800" };
}

/** "a@x.example, b@y.example; c@z.example" → the three addresses; blanks dropped. */
function splitAddresses(list: string): string[] {
  return list
    .split(/[\s,;]+/)
    .map((a) => a.trim())
    .filter(Boolean);
}

/** The form's own reading of the shared contract: the addresses are typed as one line of text. */
const shareLinkFormSchema = shareLinkSchema.extend({
  label: z.string().max(120, "must be at most 120 characters"),
  emailTo: z.string().max(4000).transform(splitAddresses).pipe(shareLinkSchema.shape.emailTo.unwrap()),
});
type ShareLinkForm = z.input<typeof shareLinkFormSchema>;

/** An error on the address line: on the whole list, or on one address (then its index says which). */
function addressProblem(err: unknown, typed: string): string | undefined {
  if (!err || typeof err !== "object") return undefined;
  const e = err as Record<string, unknown> & { message?: string };
  if (typeof e.message === "string") return `The list ${e.message}`;
  for (const [k, v] of Object.entries(e)) {
    const m = (v as { message?: unknown } | undefined)?.message;
    if (/^\d+$/.test(k) && typeof m === "string") return `“${splitAddresses(typed)[Number(k)] ?? ""}” ${m}`;
  }
  return undefined;
}

/** What a link opens, in words. */
function opensWhat(l: ShareLinkRow): string {
  if (l.scope === "search") return `Plan search “${l.searchName ?? ""}”`;
  if (l.scope === "closure-feed") return "Closure calendar and travel advisory";
  return "This scenario";
}

export interface ShareLinksProps {
  /** Lists (GET) and creates (POST) the links. */
  endpoint: string;
  /** What anyone with a new link sees, in one sentence. */
  shows: string;
  /** Heading of the list, e.g. "Links to this scenario". */
  listHeading: string;
  /** Show what each link opens (the scenario's list holds its search links and closure feed too). */
  showOpens?: boolean;
  /** False in an archived project: no new links, while those listed can still be revoked. */
  canCreate?: boolean;
}

export function ShareLinks({ endpoint, shows, listHeading, showOpens = false, canCreate = true }: ShareLinksProps) {
  const qc = useQueryClient();
  const key = ["share-links", endpoint];
  const links = useQuery({ queryKey: key, queryFn: () => api<ShareLinksAnswer>(endpoint).then((r) => r.links) });
  const form = useForm<ShareLinkForm, unknown, z.output<typeof shareLinkFormSchema>>({
    resolver: zodResolver(shareLinkFormSchema),
    defaultValues: { label: "", expiresInDays: 14, emailTo: "" },
  });
  const { register, handleSubmit, setError, reset, formState, watch } = form;
  const [created, setCreated] = useState<string | null>(null);
  const [emailedTo, setEmailedTo] = useState<string[]>([]);
  const [copied, setCopied] = useState(false);
  const [formError, setFormError] = useState<string | null>(null);
  const [revoking, setRevoking] = useState<ShareLinkRow | null>(null);

  const create = useMutation({
    mutationFn: (body: z.output<typeof shareLinkFormSchema>) => api<ShareLinkCreatedAnswer>(endpoint, { method: "POST", body }),
    onSuccess: (r) => {
      setCreated(`${window.location.origin}${r.path}`);
      setEmailedTo(r.emailedTo ?? []);
      setCopied(false);
      reset({ label: "", expiresInDays: formState.defaultValues?.expiresInDays ?? 14, emailTo: "" });
      qc.invalidateQueries({ queryKey: key });
    },
    onError: (e) => setFormError(applyServerErrors(e, setError, (p) => (p === "label" || p === "expiresInDays" || p === "emailTo" ? p : null))),
  });
  const revoke = useMutation({
    mutationFn: (id: string) => api(`/api/share-links/${id}`, { method: "DELETE" }),
    onSuccess: () => {
      setRevoking(null);
      // A search's link is also listed on its scenario's Share page, and the other way round.
      return qc.invalidateQueries({ queryKey: ["share-links"] });
    },
  });
  const daysError = formState.errors.expiresInDays?.message;
  const labelError = formState.errors.label?.message;
  const emailProblem = addressProblem(formState.errors.emailTo, watch("emailTo") ?? "");

  return (
    <div className="grid gap-5 lg:grid-cols-[minmax(0,1fr)_minmax(0,1.4fr)]">
      <section className="card" aria-labelledby="new-link-heading">
        <h2 id="new-link-heading">New read-only link</h2>
        <p className="mt-1 text-sm text-muted">{shows} Revoke it and it stops working at once.</p>
        {!canCreate ? (
          <p className="mt-4 text-sm" data-testid="no-new-links">
            The project is archived: no new links until an administrator restores it. The links listed here can still be revoked.
          </p>
        ) : (
          <form
            className="mt-4 space-y-4"
            noValidate
            onSubmit={handleSubmit((v) => {
              setFormError(null);
              create.mutate(v);
            })}
          >
            <div>
              <label htmlFor="share-label" className="field-label">
                Label (who it is for)
              </label>
              <input id="share-label" className="field-input" maxLength={120} placeholder="e.g. County public information office" aria-invalid={!!labelError} {...register("label")} />
              {labelError && <p className="field-error">Label {labelError}</p>}
            </div>
            <div>
              <label htmlFor="share-days" className="field-label">
                Expires after (days)
              </label>
              <input id="share-days" type="number" min={1} max={365} className="field-input w-32" aria-invalid={!!daysError} aria-describedby={daysError ? "share-days-error" : undefined} {...register("expiresInDays", { valueAsNumber: true })} />
              {daysError && (
                <p id="share-days-error" className="field-error">
                  Expiry {daysError}
                </p>
              )}
            </div>
            <div>
              <label htmlFor="share-email-to" className="field-label">
                E-mail it to (optional)
              </label>
              <input
                id="share-email-to"
                className="field-input"
                placeholder="e.g. pio@county.example, engineer@firm.example"
                aria-invalid={!!emailProblem}
                aria-describedby="share-email-to-note"
                {...register("emailTo")}
              />
              <p id="share-email-to-note" className={emailProblem ? "field-error" : "mt-1 text-xs text-muted"}>
                {emailProblem ?? "Up to 10 addresses, separated by commas. Each gets the link by e-mail."}
              </p>
            </div>
            <button type="submit" className="btn-primary" disabled={create.isPending} data-testid="create-share-link">
              {create.isPending ? "Creating…" : "Create link"}
            </button>
            {formError && (
              <p role="alert" className="field-error">
                {formError}
              </p>
            )}
          </form>
        )}
        {created && (
          <div className="mt-5 rounded-md border border-brand-100 bg-brand-50 p-3" role="status">
            <p className="text-sm font-medium">Link created — copy it now; it is not shown again.</p>
            {emailedTo.length > 0 && <p className="mt-1 text-sm">E-mailed to {emailedTo.join(", ")}.</p>}
            <div className="mt-2 flex gap-2">
              <input aria-label="New share link" readOnly value={created} className="field-input mt-0 font-mono text-xs" data-testid="share-link-url" onFocus={(e) => e.currentTarget.select()} />
              <button
                type="button"
                className="btn-secondary"
                onClick={async () => {
                  await navigator.clipboard?.writeText(created).catch(() => {});
                  setCopied(true);
                }}
              >
                {copied ? "Copied" : "Copy"}
              </button>
            </div>
          </div>
        )}
      </section>
      {revoking && (
        <ConfirmDialog
          title="Revoke this link?"
          confirmLabel="Revoke the link"
          busyLabel="Revoking…"
          danger
          busy={revoke.isPending}
          error={revoke.isError ? revoke.error.message : null}
          onCancel={() => (revoke.reset(), setRevoking(null))}
          onConfirm={() => revoke.mutate(revoking.id)}
          testId="revoke-dialog"
        >
          <p>
            <strong>{revoking.label || "(no label)"}</strong> — created {formatDateTime(revoking.createdAt)} by {revoking.createdByName}, live until{" "}
            {formatDateTime(revoking.expiresAt)}.
          </p>
          <p>
            Anyone who opens it from now on sees “This link is not available”{revoking.scope === "closure-feed" ? ", and calendars following the closure feed stop updating" : ""}.
            Nobody is e-mailed. A revoked link cannot be brought back; create a new one if needed.
          </p>
        </ConfirmDialog>
      )}
      <section className="card scroll-x p-0" aria-labelledby="links-heading">
        <h2 id="links-heading" className="px-5 pt-4">
          {listHeading}
        </h2>
        {links.isPending ? (
          <p className="px-5 py-4 text-sm text-muted">Loading links…</p>
        ) : links.isError ? (
          <p role="alert" className="px-5 py-4 text-sm text-bad">
            {links.error.message}
          </p>
        ) : links.data.length === 0 ? (
          <p className="px-5 py-4 text-sm text-muted">{canCreate ? "No links yet. Links you create appear here with their expiry." : "No links."}</p>
        ) : (
          <table className="mt-3 w-full min-w-[560px] border-collapse">
            <thead>
              <tr>
                <th className="table-head">Label</th>
                {showOpens && <th className="table-head">Opens</th>}
                <th className="table-head">Created</th>
                <th className="table-head">Expires</th>
                <th className="table-head">Status</th>
                <th className="table-head">
                  <span className="sr-only">Actions</span>
                </th>
              </tr>
            </thead>
            <tbody>
              {links.data.map((l) => {
                const st = statusOf(l);
                return (
                  <tr key={l.id}>
                    <td className="table-cell">{l.label || <span className="text-muted">(no label)</span>}</td>
                    {showOpens && <td className="table-cell">{opensWhat(l)}</td>}
                    <td className="table-cell">
                      {formatDateTime(l.createdAt)}
                      <span className="block text-xs text-muted">{l.createdByName}</span>
                    </td>
                    <td className="table-cell">{formatDateTime(l.expiresAt)}</td>
                    <td className="table-cell">
                      <span className={`badge ${st.tone}`}>{st.text}</span>
                    </td>
                    <td className="table-cell text-right">
                      {st.text === "Live" && (
                        <button type="button" className="btn-danger" disabled={revoke.isPending} onClick={() => setRevoking(l)} aria-label={`Revoke link ${l.label || "without label"}`}>
                          Revoke
                        </button>
                      )}
                    </td>
                  </tr>
                );
              })}
            </tbody>
          </table>
        )}
      </section>
    </div>
  );
}
