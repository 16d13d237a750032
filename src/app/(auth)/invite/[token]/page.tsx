import type { Metadata } from "next";
import Link from "next/link";
import { findInvitation } from "@db/queries/invitations";
import { currentSession } from "@/lib/server/auth";
import { hashShareToken } from "@/lib/server/share-token";
import { RoleBadge } from "@/components/role-badge";
import type { ProjectRole } from "@/lib/permissions";
import { INVITE_PROBLEM } from "./messages";
import { JoinForm, NewAccountForm, SignInToAcceptForm } from "./invite-forms";

export const metadata: Metadata = { title: "Invitation" };

function Shell({ children }: { children: React.ReactNode }) {
  return (
    <main className="mx-auto flex min-h-screen max-w-lg flex-col justify-center px-6 py-12">
      <p className="text-sm font-semibold uppercase tracking-widest text-brand-600">Pourline</p>
      <section className="card mt-3" aria-labelledby="invite-heading">
        {children}
      </section>
    </main>
  );
}

export default async function InvitePage({ params }: { params: Promise<{ token: string }> }) {
  const { token } = await params;
  const invitation = await findInvitation({ tokenHash: hashShareToken(token) });
  if (!invitation || invitation.state !== "live") {
    const reason = !invitation ? "unknown" : invitation.state === "used" ? "used" : "expired";
    return (
      <Shell>
        <h1 id="invite-heading" className="text-xl">
          {reason === "used" ? "Invitation already used" : reason === "expired" ? "Invitation expired" : "Invitation not found"}
        </h1>
        <p className="mt-3 text-sm" data-testid="invite-problem">
          {INVITE_PROBLEM[reason]}
        </p>
        <p className="mt-4 text-sm">
          <Link href="/signin" className="text-brand-700 underline">
            Go to sign in
          </Link>
        </p>
      </Shell>
    );
  }
  const s = await currentSession();
  const signedInAsInvitee = !!s && s.user.id === invitation.existingUserId;
  return (
    <Shell>
      <h1 id="invite-heading" className="text-xl">
        Join {invitation.projectName}
      </h1>
      <p className="mt-2 flex flex-wrap items-center gap-2 text-sm text-muted">
        {invitation.invitedByName} invited you as <RoleBadge role={invitation.role as ProjectRole} />
      </p>
      {invitation.projectArchivedAt && (
        <p className="mt-3 rounded-md border border-line bg-paper px-3 py-2 text-sm" data-testid="invite-archived">
          This project was archived: once you join you can read and export everything in it, but nothing can be changed
          until an administrator restores it.
        </p>
      )}
      {s && !signedInAsInvitee && (
        <p className="mt-3 rounded-md border border-line bg-paper px-3 py-2 text-sm">
          You are signed in as {s.user.email}. This invitation is for {invitation.email}; accepting it signs you in as that account.
        </p>
      )}
      {signedInAsInvitee ? (
        <JoinForm token={token} projectName={invitation.projectName} />
      ) : invitation.existingUserId ? (
        <SignInToAcceptForm token={token} email={invitation.email} />
      ) : (
        <NewAccountForm token={token} email={invitation.email} />
      )}
    </Shell>
  );
}
