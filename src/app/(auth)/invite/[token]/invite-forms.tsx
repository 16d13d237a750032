"use client";
import { useActionState } from "react";
import { describedBy, LabelledField } from "@/components/labelled-field";
import { acceptSignedInAction, acceptWithNewAccountAction, acceptWithSignInAction, type InviteState } from "./actions";

function Alert({ state }: { state: InviteState }) {
  return state.error ? (
    <p role="alert" className="rounded-md border border-bad/40 bg-bad-bg px-3 py-2 text-sm text-bad">
      {state.error}
    </p>
  ) : null;
}

function Field({ id, label, type = "text", autoComplete, error, hint, defaultValue }: { id: string; label: string; type?: string; autoComplete: string; error?: string; hint?: string; defaultValue?: string }) {
  return (
    <LabelledField id={id} label={label} hint={hint} problem={error}>
      <input id={id} name={id} type={type} autoComplete={autoComplete} required defaultValue={defaultValue} className="field-input" aria-invalid={!!error} aria-describedby={describedBy(id, { hint: !!hint, problem: !!error })} />
    </LabelledField>
  );
}

export function NewAccountForm({ token, email }: { token: string; email: string }) {
  const [state, action, pending] = useActionState<InviteState, FormData>(acceptWithNewAccountAction, {});
  return (
    <form action={action} className="mt-4 space-y-4" noValidate>
      <input type="hidden" name="token" value={token} />
      <Alert state={state} />
      <div>
        <p className="field-label">E-mail</p>
        <p className="mt-1 text-sm" data-testid="invite-email">
          {email}
        </p>
      </div>
      {/* React resets a form after its action; the default value brings back the name that was typed. */}
      <Field id="name" label="Your name" autoComplete="name" error={state.fields?.name} defaultValue={state.name} />
      <Field id="password" label="New password" type="password" autoComplete="new-password" error={state.fields?.password} hint="At least 10 characters." />
      <Field id="confirm" label="New password again" type="password" autoComplete="new-password" error={state.fields?.confirm} />
      <button type="submit" className="btn-primary w-full" disabled={pending}>
        {pending ? "Creating your account…" : "Create account and join"}
      </button>
    </form>
  );
}

export function SignInToAcceptForm({ token, email }: { token: string; email: string }) {
  const [state, action, pending] = useActionState<InviteState, FormData>(acceptWithSignInAction, {});
  return (
    <form action={action} className="mt-4 space-y-4" noValidate>
      <input type="hidden" name="token" value={token} />
      <Alert state={state} />
      <p className="text-sm text-muted">
        <span className="font-medium text-ink">{email}</span> already has a Pourline account. Sign in with it to join.
      </p>
      <Field id="password" label="Password" type="password" autoComplete="current-password" error={state.fields?.password} />
      <button type="submit" className="btn-primary w-full" disabled={pending}>
        {pending ? "Signing in…" : "Sign in and join"}
      </button>
      <p className="text-sm">
        <a href="/reset" className="text-brand-700 underline">
          Forgot your password?
        </a>
      </p>
    </form>
  );
}

export function JoinForm({ token, projectName }: { token: string; projectName: string }) {
  const [state, action, pending] = useActionState<InviteState, FormData>(acceptSignedInAction, {});
  return (
    <form action={action} className="mt-4 space-y-4">
      <input type="hidden" name="token" value={token} />
      <Alert state={state} />
      <button type="submit" className="btn-primary w-full" disabled={pending}>
        {pending ? "Joining…" : `Join ${projectName}`}
      </button>
    </form>
  );
}
