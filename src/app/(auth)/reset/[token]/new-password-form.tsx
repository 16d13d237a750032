"use client";
import { useState } from "react";
import { useRouter } from "next/navigation";
import { useMutation } from "@tanstack/react-query";
import { api, ApiError } from "@/lib/api-client";

const MIN = 10;

export function NewPasswordForm({ token }: { token: string }) {
  const router = useRouter();
  const [password, setPassword] = useState("");
  const [confirm, setConfirm] = useState("");
  const [local, setLocal] = useState<{ password?: string; confirm?: string }>({});
  const save = useMutation({
    mutationFn: () => api("/api/auth/password-reset/confirm", { method: "POST", body: { token, password } }),
    onSuccess: () => router.replace("/projects"),
  });
  const serverField = save.error instanceof ApiError ? save.error.fields.find((f) => f.path === "password")?.message : undefined;
  const passwordError = local.password ?? serverField;
  return (
    <form
      className="mt-4 space-y-4"
      noValidate
      onSubmit={(e) => {
        e.preventDefault();
        const problems = {
          password: password.length < MIN ? `must be at least ${MIN} characters` : undefined,
          confirm: confirm !== password ? "must match the password" : undefined,
        };
        setLocal(problems);
        if (!problems.password && !problems.confirm) save.mutate();
      }}
    >
      {save.isError && !serverField && (
        <p role="alert" className="rounded-md border border-bad/40 bg-bad-bg px-3 py-2 text-sm text-bad">
          {save.error.message}
        </p>
      )}
      <div>
        <label htmlFor="new-password" className="field-label">
          New password
        </label>
        <input id="new-password" type="password" autoComplete="new-password" required className="field-input" value={password} onChange={(e) => setPassword(e.target.value)} aria-invalid={!!passwordError} aria-describedby="new-password-note" />
        <p id="new-password-note" className={passwordError ? "field-error" : "mt-1 text-xs text-muted"}>
          {passwordError ? `New password ${passwordError}` : `At least ${MIN} characters.`}
        </p>
      </div>
      <div>
        <label htmlFor="confirm-password" className="field-label">
          New password again
        </label>
        <input id="confirm-password" type="password" autoComplete="new-password" required className="field-input" value={confirm} onChange={(e) => setConfirm(e.target.value)} aria-invalid={!!local.confirm} aria-describedby={local.confirm ? "confirm-password-error" : undefined} />
        {local.confirm && (
          <p id="confirm-password-error" className="field-error">
            New password again {local.confirm}
          </p>
        )}
      </div>
      <button type="submit" className="btn-primary w-full" disabled={save.isPending || save.isSuccess}>
        {save.isPending ? "Saving…" : "Save the new password"}
      </button>
    </form>
  );
}
