"use client";
import { useState } from "react";
import { useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import { api, ApiError } from "@/lib/api-client";
import { formatDateTime } from "@/lib/format";

interface LinkRow {
  id: string;
  label: string;
  expiresAt: string;
  revokedAt: string | null;
  createdAt: string;
  createdByName: string;
}

function statusOf(l: LinkRow): { text: string; tone: string } {
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

export function ShareLinks({ scenarioId }: { scenarioId: string }) {
  const qc = useQueryClient();
  const key = ["scenarios", scenarioId, "share-links"];
  const links = useQuery({ queryKey: key, queryFn: () => api<{ links: LinkRow[] }>(`/api/scenarios/${scenarioId}/share-links`).then((r) => r.links) });
  const [label, setLabel] = useState("");
  const [days, setDays] = useState(14);
  const [emailTo, setEmailTo] = useState("");
  const [created, setCreated] = useState<string | null>(null);
  const [emailedTo, setEmailedTo] = useState<string[]>([]);
  const [copied, setCopied] = useState(false);

  const create = useMutation({
    mutationFn: () =>
      api<{ path: string; emailedTo: string[] }>(`/api/scenarios/${scenarioId}/share-links`, {
        method: "POST",
        body: { label, expiresInDays: days, emailTo: splitAddresses(emailTo) },
      }),
    onSuccess: (r) => {
      setCreated(`${window.location.origin}${r.path}`);
      setEmailedTo(r.emailedTo ?? []);
      setEmailTo("");
      setCopied(false);
      setLabel("");
      qc.invalidateQueries({ queryKey: key });
    },
  });
  const revoke = useMutation({
    mutationFn: (id: string) => api(`/api/share-links/${id}`, { method: "DELETE" }),
    onSuccess: () => qc.invalidateQueries({ queryKey: key }),
  });
  const fieldError = (path: string) => (create.error instanceof ApiError ? create.error.fields.find((f) => f.path === path)?.message : undefined);
  const emailProblem = create.error instanceof ApiError ? create.error.fields.find((f) => f.path.startsWith("emailTo")) : undefined;
  const badAddress = emailProblem ? /\[(\d+)\]/.exec(emailProblem.path) : null;

  return (
    <div className="grid gap-5 lg:grid-cols-[minmax(0,1fr)_minmax(0,1.4fr)]">
      <section className="card" aria-labelledby="new-link-heading">
        <h2 id="new-link-heading">New read-only link</h2>
        <p className="mt-1 text-sm text-muted">
          Anyone with the link sees this scenario&apos;s inputs and latest results without signing in. They cannot change anything or see other
          scenarios. Revoke it and it stops working at once.
        </p>
        <form
          className="mt-4 space-y-4"
          onSubmit={(e) => {
            e.preventDefault();
            create.mutate();
          }}
        >
          <div>
            <label htmlFor="share-label" className="field-label">
              Label (who it is for)
            </label>
            <input id="share-label" className="field-input" value={label} maxLength={120} onChange={(e) => setLabel(e.target.value)} placeholder="e.g. County public information office" />
          </div>
          <div>
            <label htmlFor="share-days" className="field-label">
              Expires after (days)
            </label>
            <input id="share-days" type="number" min={1} max={365} className="field-input w-32" value={days} onChange={(e) => setDays(Number(e.target.value))} aria-invalid={!!fieldError("expiresInDays")} />
            {fieldError("expiresInDays") && <p className="field-error">Expiry {fieldError("expiresInDays")}</p>}
          </div>
          <div>
            <label htmlFor="share-email-to" className="field-label">
              E-mail it to (optional)
            </label>
            <input
              id="share-email-to"
              className="field-input"
              value={emailTo}
              onChange={(e) => setEmailTo(e.target.value)}
              placeholder="e.g. pio@county.example, engineer@firm.example"
              aria-invalid={!!emailProblem}
              aria-describedby="share-email-to-note"
            />
            <p id="share-email-to-note" className={emailProblem ? "field-error" : "mt-1 text-xs text-muted"}>
              {emailProblem
                ? `${badAddress ? `“${splitAddresses(emailTo)[Number(badAddress[1])] ?? ""}” ` : "The list "}${emailProblem.message}`
                : "Up to 10 addresses, separated by commas. Each gets the link by e-mail."}
            </p>
          </div>
          <button type="submit" className="btn-primary" disabled={create.isPending} data-testid="create-share-link">
            {create.isPending ? "Creating…" : "Create link"}
          </button>
          {create.isError && !fieldError("expiresInDays") && !emailProblem && (
            <p role="alert" className="field-error">
              {create.error.message}
            </p>
          )}
        </form>
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
      <section className="card overflow-x-auto p-0" aria-labelledby="links-heading">
        <h2 id="links-heading" className="px-5 pt-4">
          Links to this scenario
        </h2>
        {links.isPending ? (
          <p className="px-5 py-4 text-sm text-muted">Loading links…</p>
        ) : links.isError ? (
          <p role="alert" className="px-5 py-4 text-sm text-bad">
            {links.error.message}
          </p>
        ) : links.data.length === 0 ? (
          <p className="px-5 py-4 text-sm text-muted">No links yet. Links you create appear here with their expiry.</p>
        ) : (
          <table className="mt-3 w-full min-w-[560px] border-collapse">
            <thead>
              <tr>
                <th className="table-head">Label</th>
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
                        <button type="button" className="btn-danger" disabled={revoke.isPending} onClick={() => revoke.mutate(l.id)} aria-label={`Revoke link ${l.label || "without label"}`}>
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
