"use server";
/**
 * Accepting an invitation: with a new account (name and password), by signing in to the existing account
 * of the invited e-mail, or as that account when already signed in. Each ends signed in on the project list.
 */
import { headers } from "next/headers";
import { redirect } from "next/navigation";
import { acceptInvitation, findInvitation } from "@db/queries/invitations";
import { currentSession, startSession } from "@/lib/server/auth";
import { hashPassword } from "@/lib/server/password";
import { hashShareToken } from "@/lib/server/share-token";
import { attemptSignIn, clientAddress } from "@/lib/server/signin";
import { acceptNewAccountSchema } from "@/lib/server/mail/schemas";
import { INVITE_PROBLEM } from "./messages";

export type InviteState = { error?: string; fields?: Record<string, string>; name?: string };

const tokenOf = (form: FormData) => hashShareToken(String(form.get("token") ?? ""));

export async function acceptWithNewAccountAction(_prev: InviteState, form: FormData): Promise<InviteState> {
  const parsed = acceptNewAccountSchema.safeParse({ name: form.get("name"), password: form.get("password"), confirm: form.get("confirm") });
  if (!parsed.success) {
    const fields: Record<string, string> = {};
    for (const i of parsed.error.issues) fields[String(i.path[0])] ??= i.message;
    return { error: "Check the highlighted fields.", fields, name: String(form.get("name") ?? "") };
  }
  const result = await acceptInvitation({ tokenHash: tokenOf(form), newUser: { name: parsed.data.name, passwordHash: await hashPassword(parsed.data.password) } });
  if (!result.ok) return { error: INVITE_PROBLEM[result.reason], name: parsed.data.name };
  await startSession(result.userId);
  redirect("/projects");
}

export async function acceptWithSignInAction(_prev: InviteState, form: FormData): Promise<InviteState> {
  const tokenHash = tokenOf(form);
  const invitation = await findInvitation({ tokenHash });
  if (!invitation) return { error: INVITE_PROBLEM.unknown };
  if (invitation.state !== "live") return { error: INVITE_PROBLEM[invitation.state] };
  const password = String(form.get("password") ?? "");
  if (!password) return { error: "Check the highlighted fields.", fields: { password: "must not be empty" } };
  const signedIn = await attemptSignIn({ email: invitation.email, password, address: clientAddress(await headers()) });
  if (!signedIn.ok) return { error: signedIn.message };
  const result = await acceptInvitation({ tokenHash, userId: signedIn.userId });
  if (!result.ok) return { error: INVITE_PROBLEM[result.reason] };
  await startSession(result.userId);
  redirect("/projects");
}

export async function acceptSignedInAction(_prev: InviteState, form: FormData): Promise<InviteState> {
  const s = await currentSession();
  if (!s) return { error: "Your session has ended. Reload the page and sign in." };
  const result = await acceptInvitation({ tokenHash: tokenOf(form), userId: s.user.id });
  if (!result.ok) return { error: INVITE_PROBLEM[result.reason] };
  redirect("/projects");
}
