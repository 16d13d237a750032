"use client";
import { useRouter } from "next/navigation";
import { useState } from "react";
import { api, ApiError } from "@/lib/api-client";

/** Puts a deleted shift back in the log; says why not when the log has moved on (its stretch recorded again since). */
export function RestoreButton({ entryId, what }: { entryId: string; what: string }) {
  const router = useRouter();
  const [busy, setBusy] = useState(false);
  const [problem, setProblem] = useState<string | null>(null);
  async function restore() {
    setBusy(true);
    setProblem(null);
    try {
      await api(`/api/progress/${entryId}/restore`, { method: "POST" });
      router.refresh();
    } catch (err) {
      setProblem(err instanceof ApiError && err.fields.length ? `Not put back: ${err.fields.map((f) => f.message).join(". ")}.` : (err as Error).message);
      setBusy(false);
    }
  }
  return (
    <div>
      <button type="button" className="btn-secondary" onClick={restore} disabled={busy} aria-label={`Put back ${what}`}>
        Put back
      </button>
      {problem && (
        <p role="alert" className="mt-1 max-w-xs text-xs text-bad">
          {problem}
        </p>
      )}
    </div>
  );
}
