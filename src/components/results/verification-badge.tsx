/** Whether a forecast on screen is one the server stands behind. */
import type { RunVerification as Verification } from "@/lib/run-contract";

const TEXT: Record<Verification, { label: string; title: string; cls: string }> = {
  verified: { label: "Verified by the server", title: "Computed in a browser and reproduced exactly by the server", cls: "bg-brand-50 text-brand-800" },
  server: { label: "Computed by the server", title: "Computed by a server worker", cls: "bg-brand-50 text-brand-800" },
  pending: { label: "Not yet verified", title: "Computed in a browser; the server has not reproduced it yet", cls: "bg-warn-bg text-warn" },
  rejected: { label: "Rejected by the server", title: "The server's result differs: this run is not the plan's forecast", cls: "bg-bad/10 text-bad" },
};

export function VerificationBadge({ verification }: { verification: Verification | null | undefined }) {
  if (!verification) return null;
  const t = TEXT[verification];
  return (
    <span className={`badge ${t.cls}`} title={t.title} data-testid="verification" data-verification={verification}>
      {t.label}
    </span>
  );
}
