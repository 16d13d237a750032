"use client";
/**
 * The account page's three parts, each on its request contract (src/lib/schemas.ts) with react-hook-form where
 * there is a form: problems beside their fields, the server's too.
 */
import { useState } from "react";
import { useRouter } from "next/navigation";
import { useForm } from "react-hook-form";
import { zodResolver } from "@hookform/resolvers/zod";
import type { z } from "zod";
import { useMutation } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import type { AccountDetailsAnswer, SessionsEndedAnswer } from "@/lib/account-contract";
import { applyServerErrors } from "@/lib/form-errors";
import { accountDetailsSchema, MIN_PASSWORD_LENGTH, passwordChangeSchema } from "@/lib/schemas";
import { describedBy, LabelledField as Field } from "@/components/labelled-field";
import { FormFailure, SubmitRow } from "@/components/form-footer";

type DetailsIn = z.input<typeof accountDetailsSchema>;
type DetailsOut = z.output<typeof accountDetailsSchema>;

export function AccountDetailsForm({ name, title }: { name: string; title: string }) {
  const router = useRouter();
  const { register, handleSubmit, formState, setError, reset } = useForm<DetailsIn, unknown, DetailsOut>({ resolver: zodResolver(accountDetailsSchema), defaultValues: { name, title } });
  const [failure, setFailure] = useState<string | null>(null);
  const [saved, setSaved] = useState(false);
  const save = useMutation({
    mutationFn: (v: DetailsOut) => api<AccountDetailsAnswer>("/api/account", { method: "PUT", body: v }),
    onSuccess: (v) => {
      reset(v);
      setSaved(true);
      router.refresh(); // the header shows the name and title
    },
    onError: (e) => setFailure(applyServerErrors(e, setError, (p) => (p === "name" || p === "title" ? p : null))),
  });
  const problem = (f: "name" | "title") => formState.errors[f]?.message;
  return (
    <section className="card" aria-labelledby="details-heading">
      <h2 id="details-heading">Name and title</h2>
      <p className="mt-1 text-sm text-muted">Shown to the people on your projects beside what you change, run, publish and record in the field log.</p>
      <form
        className="mt-4 space-y-4"
        noValidate
        onSubmit={handleSubmit((v) => {
          setFailure(null);
          setSaved(false);
          save.mutate(v);
        })}
      >
        <Field id="account-name" label="Name" problem={problem("name")}>
          <input id="account-name" className="field-input" autoComplete="name" maxLength={120} aria-invalid={!!problem("name")} aria-describedby={describedBy("account-name", { hint: false, problem: !!problem("name") })} {...register("name")} />
        </Field>
        <Field id="account-title" label="Title (optional)" hint="Your role at your organisation, e.g. Resident engineer." problem={problem("title")}>
          <input id="account-title" className="field-input" autoComplete="organization-title" maxLength={120} aria-invalid={!!problem("title")} aria-describedby={describedBy("account-title", { hint: true, problem: !!problem("title") })} {...register("title")} />
        </Field>
        <FormFailure text={failure} />
        <SubmitRow label="Save name and title" busyLabel="Saving…" busy={save.isPending} status={saved && !formState.isDirty ? "Saved." : ""} />
      </form>
    </section>
  );
}

type PasswordIn = z.input<typeof passwordChangeSchema>;
type PasswordOut = z.output<typeof passwordChangeSchema>;
const PASSWORD_FIELDS = ["currentPassword", "newPassword", "confirm"] as const;

export function PasswordChangeForm() {
  const router = useRouter();
  const { register, handleSubmit, formState, setError, reset } = useForm<PasswordIn, unknown, PasswordOut>({
    resolver: zodResolver(passwordChangeSchema),
    defaultValues: { currentPassword: "", newPassword: "", confirm: "" },
  });
  const [failure, setFailure] = useState<string | null>(null);
  const change = useMutation({
    mutationFn: (v: PasswordOut) => api("/api/account/password", { method: "PUT", body: v }),
    onSuccess: () => {
      reset();
      router.refresh(); // "Signed in elsewhere" below counts again: the other sessions have ended
    },
    onError: (e) => setFailure(applyServerErrors(e, setError, (p) => ((PASSWORD_FIELDS as readonly string[]).includes(p) ? (p as (typeof PASSWORD_FIELDS)[number]) : null))),
  });
  const problem = (f: (typeof PASSWORD_FIELDS)[number]) => formState.errors[f]?.message;
  const input = (f: (typeof PASSWORD_FIELDS)[number], autoComplete: string, hint = false) => (
    <input
      id={`account-${f}`}
      type="password"
      className="field-input"
      autoComplete={autoComplete}
      maxLength={200}
      aria-invalid={!!problem(f)}
      aria-describedby={describedBy(`account-${f}`, { hint, problem: !!problem(f) })}
      {...register(f)}
    />
  );
  return (
    <section className="card" aria-labelledby="password-heading">
      <h2 id="password-heading">Password</h2>
      <p className="mt-1 text-sm text-muted">Changing it signs you out everywhere else: on other computers and phones you sign in again with the new one.</p>
      <form
        className="mt-4 space-y-4"
        noValidate
        onSubmit={handleSubmit((v) => {
          setFailure(null);
          change.reset();
          change.mutate(v);
        })}
      >
        <Field id="account-currentPassword" label="Current password" problem={problem("currentPassword")}>
          {input("currentPassword", "current-password")}
        </Field>
        <Field id="account-newPassword" label="New password" hint={`At least ${MIN_PASSWORD_LENGTH} characters.`} problem={problem("newPassword")}>
          {input("newPassword", "new-password", true)}
        </Field>
        <Field id="account-confirm" label="New password again" problem={problem("confirm")}>
          {input("confirm", "new-password")}
        </Field>
        <FormFailure text={failure} />
        <SubmitRow label="Change password" busyLabel="Changing…" busy={change.isPending} status={change.isSuccess ? "Password changed. Other sessions are signed out." : ""} />
      </form>
    </section>
  );
}

export function OtherSessions({ elsewhere }: { elsewhere: number }) {
  const router = useRouter();
  const end = useMutation({
    mutationFn: () => api<SessionsEndedAnswer>("/api/account/sessions", { method: "DELETE" }),
    onSuccess: () => router.refresh(),
  });
  return (
    <section className="card" aria-labelledby="sessions-heading" data-testid="other-sessions">
      <h2 id="sessions-heading">Signed in elsewhere</h2>
      <p className="mt-1 text-sm">
        {elsewhere === 0
          ? "Only here: no other browser is signed in to your account, so there is nothing to sign out."
          : `${elsewhere} other browser${elsewhere === 1 ? " is" : "s are"} signed in to your account. If you left yourself signed in on a shared computer, or a phone was lost, sign out everywhere else.`}
      </p>
      <div className="mt-3 flex flex-wrap items-center gap-3">
        {/* No button when nobody else is signed in: it would do nothing. The live region stays for its answer. */}
        {elsewhere > 0 && (
          <button type="button" className="btn-secondary" disabled={end.isPending} onClick={() => end.mutate()}>
            {end.isPending ? "Signing out…" : "Sign out everywhere else"}
          </button>
        )}
        <p aria-live="polite" className="text-sm text-ok">
          {end.isSuccess ? `Signed out ${end.data.endedElsewhere} other session${end.data.endedElsewhere === 1 ? "" : "s"}.` : ""}
        </p>
      </div>
      {end.isError && (
        <p role="alert" className="field-error">
          {end.error.message}
        </p>
      )}
    </section>
  );
}
