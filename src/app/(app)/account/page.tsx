import type { Metadata } from "next";
import { pageUser } from "@/lib/server/page-access";
import { displayTimeZone } from "@/lib/format";
import { SESSION_ABSOLUTE_MS } from "@/lib/server/auth";
import { countLiveSessions } from "@db/queries/users";
import { AccountDetailsForm, OtherSessions, PasswordChangeForm } from "./account-forms";

export const metadata: Metadata = { title: "Your account" };

/** The signed-in person's own account: name and title, password, and the sessions signed in elsewhere. */
export default async function AccountPage() {
  const { user } = await pageUser();
  const live = await countLiveSessions({ id: user.id, signedInAfter: new Date(Date.now() - SESSION_ABSOLUTE_MS) });
  return (
    <div className="mx-auto max-w-2xl space-y-6">
      <header>
        <h1>Your account</h1>
        <p className="mt-1 text-sm text-muted">
          Signed in as {user.email}. To use another e-mail address, ask a project administrator to invite it.
        </p>
        <p className="mt-1 text-sm text-muted" data-testid="display-time-zone">
          Times of day in Pourline and its e-mails are {displayTimeZone()} time, for everyone in this installation.
        </p>
      </header>
      <AccountDetailsForm name={user.name} title={user.title} />
      <PasswordChangeForm />
      <OtherSessions elsewhere={Math.max(0, live - 1)} />
    </div>
  );
}
