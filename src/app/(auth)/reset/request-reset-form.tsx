"use client";
import { useState } from "react";
import { useMutation } from "@tanstack/react-query";
import { api, ApiError } from "@/lib/api-client";
import type { PasswordResetRequestedAnswer } from "@/lib/account-contract";

export function RequestResetForm() {
  const [email, setEmail] = useState("");
  const request = useMutation({ mutationFn: () => api<PasswordResetRequestedAnswer>("/api/auth/password-reset", { method: "POST", body: { email } }) });
  const emailError = request.error instanceof ApiError ? request.error.fields.find((f) => f.path === "email")?.message : undefined;
  if (request.isSuccess) {
    return (
      <p role="status" className="mt-4 rounded-md border border-brand-100 bg-brand-50 px-3 py-2 text-sm">
        {request.data.message}
      </p>
    );
  }
  return (
    <form
      className="mt-4 space-y-4"
      noValidate
      onSubmit={(e) => {
        e.preventDefault();
        request.mutate();
      }}
    >
      {request.isError && !emailError && (
        <p role="alert" className="rounded-md border border-bad/40 bg-bad-bg px-3 py-2 text-sm text-bad">
          {request.error.message}
        </p>
      )}
      <div>
        <label htmlFor="reset-email" className="field-label">
          E-mail
        </label>
        <input id="reset-email" type="email" autoComplete="username" required className="field-input" value={email} onChange={(e) => setEmail(e.target.value)} aria-invalid={!!emailError} aria-describedby={emailError ? "reset-email-error" : undefined} />
        {emailError && (
          <p id="reset-email-error" className="field-error">
            E-mail {emailError}
          </p>
        )}
      </div>
      <button type="submit" className="btn-primary w-full" disabled={request.isPending}>
        {request.isPending ? "Sending…" : "Send the reset link"}
      </button>
    </form>
  );
}
