import type { Metadata } from "next";
import Link from "next/link";
import { findPasswordReset } from "@db/queries/invitations";
import { hashShareToken } from "@/lib/server/share-token";
import { RESET_LINK_PROBLEM } from "@/lib/server/mail/reset";
import { NewPasswordForm } from "./new-password-form";

export const metadata: Metadata = { title: "Choose a new password" };

export default async function ResetPage({ params }: { params: Promise<{ token: string }> }) {
  const { token } = await params;
  const reset = await findPasswordReset({ tokenHash: hashShareToken(token) });
  const problem = !reset ? RESET_LINK_PROBLEM.unknown : reset.state === "used" ? RESET_LINK_PROBLEM.used : reset.state === "expired" ? RESET_LINK_PROBLEM.expired : null;
  return (
    <main className="mx-auto flex min-h-screen max-w-lg flex-col justify-center px-6 py-12">
      <p className="text-sm font-semibold uppercase tracking-widest text-brand-600">Pourline</p>
      <section className="card mt-3" aria-labelledby="new-password-heading">
        <h1 id="new-password-heading" className="text-xl">
          Choose a new password
        </h1>
        {problem || !reset ? (
          <>
            <p className="mt-3 text-sm" data-testid="reset-problem">
              {problem}
            </p>
            <p className="mt-4 text-sm">
              <Link href="/reset" className="text-brand-700 underline">
                Ask for a new link
              </Link>
            </p>
          </>
        ) : (
          <>
            <p className="mt-2 text-sm text-muted">
              For <span className="font-medium text-ink">{reset.email}</span>. Every other signed-in session of this account ends when you save.
            </p>
            <NewPasswordForm token={token} />
          </>
        )}
      </section>
    </main>
  );
}
