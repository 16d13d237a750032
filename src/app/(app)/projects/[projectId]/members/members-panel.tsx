"use client";
/** Members and invitations: two react-hook-form forms on the shared contract (memberSchema / invitationSchema). */
import { useState } from "react";
import { useForm, type UseFormRegisterReturn } from "react-hook-form";
import { zodResolver } from "@hookform/resolvers/zod";
import type { z } from "zod";
import { useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import { applyServerErrors } from "@/lib/form-errors";
import { ROLE_LABELS, type ProjectRole } from "@/lib/permissions";
import { formatDateTime } from "@/lib/format";
import { invitationSchema, memberSchema } from "@/lib/schemas";
import type { InvitationCreatedAnswer, InvitationsAnswer, MembersAnswer } from "@/lib/member-contract";

type MemberForm = z.infer<typeof memberSchema>;
const memberField = (p: string) => (p === "email" || p === "role" ? p : null);

const ROLE_HELP: Record<ProjectRole, string> = {
  admin: "manages members; everything an engineer can do",
  engineer: "edits, runs and shares scenarios; records progress",
  scheduler: "edits, runs and shares scenarios",
  inspector: "reads plans; records field progress",
  viewer: "reads and compares (owner executives)",
};

/** A role picker that says what each role may do. */
function RoleSelect({ id, field }: { id: string; field: UseFormRegisterReturn }) {
  return (
    <select id={id} className="field-input" {...field}>
      {Object.entries(ROLE_LABELS).map(([r, label]) => (
        <option key={r} value={r}>
          {label} — {ROLE_HELP[r as ProjectRole]}
        </option>
      ))}
    </select>
  );
}

export function MembersPanel({ projectId, selfId }: { projectId: string; selfId: string }) {
  const qc = useQueryClient();
  const key = ["projects", projectId, "members"];
  const members = useQuery({ queryKey: key, queryFn: () => api<MembersAnswer>(`/api/projects/${projectId}/members`).then((r) => r.members) });
  const form = useForm<MemberForm>({ resolver: zodResolver(memberSchema), defaultValues: { email: "", role: "viewer" } });
  const [addError, setAddError] = useState<string | null>(null);
  const refresh = () => qc.invalidateQueries({ queryKey: key });
  const add = useMutation({
    mutationFn: (v: MemberForm) => api(`/api/projects/${projectId}/members`, { method: "POST", body: v }),
    onSuccess: (_r, v) => (v.email === form.getValues("email") && form.reset({ email: "", role: form.getValues("role") }), refresh()),
    onError: (e) => setAddError(applyServerErrors(e, form.setError, memberField)),
  });
  const remove = useMutation({ mutationFn: (userId: string) => api(`/api/projects/${projectId}/members/${userId}`, { method: "DELETE" }), onSuccess: refresh });
  const emailError = form.formState.errors.email?.message;

  return (
    <div className="grid gap-5 lg:grid-cols-[minmax(0,1.5fr)_minmax(0,1fr)]">
      <section className="card scroll-x p-0" aria-labelledby="members-heading">
        <h2 id="members-heading" className="px-5 pt-4">
          People on this project
        </h2>
        {members.isPending ? (
          <p className="px-5 py-4 text-sm text-muted">Loading…</p>
        ) : members.isError ? (
          <p role="alert" className="px-5 py-4 text-sm text-bad">
            {members.error.message}
          </p>
        ) : (
          <table className="stack-on-phone mt-3 w-full border-collapse max-md:px-5 md:min-w-[560px]">
            {/* On a phone each person is a card (globals.css stack-on-phone): the role and Remove were off the screen's edge. */}
            <thead>
              <tr>
                <th className="table-head">Person</th>
                <th className="table-head">Role</th>
                <th className="table-head">
                  <span className="sr-only">Actions</span>
                </th>
              </tr>
            </thead>
            <tbody>
              {members.data.map((m) => (
                <tr key={m.userId} className="border-b border-line">
                  <td className="px-3 py-2 text-sm">
                    <span className="font-medium">{m.name}</span>
                    <span className="block text-xs text-muted">
                      {m.email}
                      {m.title ? ` · ${m.title}` : ""}
                    </span>
                  </td>
                  <td className="px-3 py-2 text-sm">
                    <label className="sr-only" htmlFor={`role-${m.userId}`}>
                      Role of {m.name}
                    </label>
                    <select id={`role-${m.userId}`} className="field-input mt-0 w-40" value={m.role} disabled={add.isPending} onChange={(e) => add.mutate({ email: m.email, role: e.target.value as ProjectRole })}>
                      {Object.entries(ROLE_LABELS).map(([r, label]) => (
                        <option key={r} value={r}>
                          {label}
                        </option>
                      ))}
                    </select>
                  </td>
                  <td className="px-3 py-2 text-sm md:text-right" data-actions {...(m.userId === selfId ? { "data-empty": true } : {})}>
                    {m.userId !== selfId && (
                      <button type="button" className="btn-danger" onClick={() => window.confirm(`Remove ${m.name} from this project?`) && remove.mutate(m.userId)}>
                        Remove
                      </button>
                    )}
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
        )}
        {remove.isError && (
          <p role="alert" className="px-5 pb-4 text-sm text-bad">
            {remove.error.message}
          </p>
        )}
      </section>
      <div className="space-y-5">
        <section className="card" aria-labelledby="add-member-heading">
          <h2 id="add-member-heading">Add a person</h2>
          <p className="mt-1 text-sm text-muted">Add someone who already has a Pourline account.</p>
          <form
            className="mt-4 space-y-4"
            noValidate
            onSubmit={form.handleSubmit((v) => {
              setAddError(null);
              add.mutate(v);
            })}
          >
            <div>
              <label htmlFor="member-email" className="field-label">
                E-mail
              </label>
              <input id="member-email" type="email" className="field-input" aria-invalid={!!emailError} aria-describedby={emailError ? "member-email-error" : undefined} {...form.register("email")} />
              {emailError && (
                <p id="member-email-error" className="field-error">
                  E-mail {emailError}
                </p>
              )}
            </div>
            <div>
              <label htmlFor="member-role" className="field-label">
                Role
              </label>
              <RoleSelect id="member-role" field={form.register("role")} />
            </div>
            <button type="submit" className="btn-primary" disabled={add.isPending}>
              Add to project
            </button>
            {addError && (
              <p role="alert" className="field-error">
                {addError}
              </p>
            )}
          </form>
        </section>
        <InviteByEmail projectId={projectId} />
      </div>
    </div>
  );
}

/** Invites someone without an account: the server e-mails a single-use link that expires in 7 days. */
function InviteByEmail({ projectId }: { projectId: string }) {
  const qc = useQueryClient();
  const key = ["projects", projectId, "invitations"];
  const pending = useQuery({ queryKey: key, queryFn: () => api<InvitationsAnswer>(`/api/projects/${projectId}/invitations`).then((r) => r.invitations) });
  const form = useForm<MemberForm>({ resolver: zodResolver(invitationSchema), defaultValues: { email: "", role: "viewer" } });
  const [sentTo, setSentTo] = useState<string | null>(null);
  const [err, setErr] = useState<string | null>(null);
  const invite = useMutation({
    mutationFn: (v: MemberForm) => api<InvitationCreatedAnswer>(`/api/projects/${projectId}/invitations`, { method: "POST", body: v }),
    onSuccess: (r) => {
      setSentTo(r.email);
      form.reset({ email: "", role: form.getValues("role") });
      qc.invalidateQueries({ queryKey: key });
    },
    onError: (e) => setErr(applyServerErrors(e, form.setError, memberField)),
  });
  const emailError = form.formState.errors.email?.message;
  return (
    <section className="card" aria-labelledby="invite-heading">
      <h2 id="invite-heading">Invite by e-mail</h2>
      <p className="mt-1 text-sm text-muted">For someone new to Pourline (or who should join with their own account). The link works once, for 7 days.</p>
      <form
        className="mt-4 space-y-4"
        noValidate
        onSubmit={form.handleSubmit((v) => {
          setSentTo(null);
          setErr(null);
          invite.mutate(v);
        })}
      >
        <div>
          <label htmlFor="invite-email" className="field-label">
            E-mail to invite
          </label>
          <input id="invite-email" type="email" className="field-input" aria-invalid={!!emailError} aria-describedby={emailError ? "invite-email-error" : undefined} {...form.register("email")} />
          {emailError && (
            <p id="invite-email-error" className="field-error">
              E-mail {emailError}
            </p>
          )}
        </div>
        <div>
          <label htmlFor="invite-role" className="field-label">
            Their role
          </label>
          <RoleSelect id="invite-role" field={form.register("role")} />
        </div>
        <button type="submit" className="btn-primary" disabled={invite.isPending}>
          {invite.isPending ? "Sending…" : "Send invitation"}
        </button>
        {err && (
          <p role="alert" className="field-error">
            {err}
          </p>
        )}
        {sentTo && (
          <p role="status" className="text-sm text-brand-800">
            Invitation sent to {sentTo}.
          </p>
        )}
      </form>
      {pending.data && pending.data.length > 0 && (
        <div className="mt-5">
          <h3 className="text-sm font-semibold">Waiting for an answer</h3>
          <ul className="mt-2 space-y-1 text-sm" data-testid="pending-invitations">
            {pending.data.map((i) => (
              <li key={i.id}>
                {i.email} · {ROLE_LABELS[i.role]}
                <span className="block text-xs text-muted">
                  by {i.invitedByName}, expires {formatDateTime(i.expiresAt)}
                </span>
              </li>
            ))}
          </ul>
        </div>
      )}
    </section>
  );
}
