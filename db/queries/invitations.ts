import "server-only";
/**
 * E-mailed single-use links: project invitations and password resets. Only token hashes are stored.
 * Using a link locks its row (`FOR UPDATE`) and marks it used in the same transaction as its effect, so two
 * tabs submitting the same link at once cannot both succeed.
 */
import { and, desc, eq, gt, isNull } from "drizzle-orm";
import { randomUUID } from "node:crypto";
import { getDb } from "../client";
import { invitations, passwordResets, projectMembers, projects, users, type Role } from "../schema";
import type { Executor } from "./mail";

export type LinkState = "live" | "used" | "expired";

function stateOf(row: { usedAt: Date | null; expiresAt: Date }, now = new Date()): LinkState {
  if (row.usedAt) return "used";
  return row.expiresAt.getTime() <= now.getTime() ? "expired" : "live";
}

// ---------- invitations ----------

export async function insertInvitation(input: { tx: Executor; projectId: string; email: string; role: Role; tokenHash: string; invitedById: string; expiresAt: Date }) {
  const [row] = await input.tx
    .insert(invitations)
    .values({
      projectId: input.projectId,
      email: input.email.trim().toLowerCase(),
      role: input.role,
      tokenHash: input.tokenHash,
      invitedById: input.invitedById,
      expiresAt: input.expiresAt,
    })
    .returning({ id: invitations.id, email: invitations.email, role: invitations.role, expiresAt: invitations.expiresAt, createdAt: invitations.createdAt });
  return row;
}

/** Invitations not yet used and not expired, newest first, for the members page. */
export async function listPendingInvitations({ projectId }: { projectId: string }) {
  return getDb()
    .select({ id: invitations.id, email: invitations.email, role: invitations.role, expiresAt: invitations.expiresAt, createdAt: invitations.createdAt, invitedByName: users.name })
    .from(invitations)
    .innerJoin(users, eq(users.id, invitations.invitedById))
    .where(and(eq(invitations.projectId, projectId), isNull(invitations.usedAt), gt(invitations.expiresAt, new Date())))
    .orderBy(desc(invitations.createdAt), desc(invitations.id));
}

/** What the invite page shows: the invitation, its project and whether its e-mail already has an account. */
export async function findInvitation({ tokenHash }: { tokenHash: string }) {
  const [row] = await getDb()
    .select({
      id: invitations.id,
      projectId: invitations.projectId,
      projectName: projects.name,
      projectArchivedAt: projects.archivedAt,
      email: invitations.email,
      role: invitations.role,
      expiresAt: invitations.expiresAt,
      usedAt: invitations.usedAt,
      invitedByName: users.name,
    })
    .from(invitations)
    .innerJoin(projects, eq(projects.id, invitations.projectId))
    .innerJoin(users, eq(users.id, invitations.invitedById))
    .where(eq(invitations.tokenHash, tokenHash));
  if (!row) return null;
  const [account] = await getDb().select({ id: users.id }).from(users).where(eq(users.email, row.email));
  return { ...row, state: stateOf(row), existingUserId: account?.id ?? null };
}

export type AcceptResult = { ok: true; userId: string; projectId: string } | { ok: false; reason: "unknown" | "used" | "expired" | "account_exists" | "wrong_account" };

/**
 * Uses an invitation: either creates the account (`newUser`) or adds the membership for the existing
 * account `userId`, whose e-mail must be the invited one. An existing membership keeps its role.
 */
export async function acceptInvitation(input: { tokenHash: string; newUser?: { name: string; passwordHash: string }; userId?: string }): Promise<AcceptResult> {
  return getDb().transaction(async (tx) => {
    const [inv] = await tx.select().from(invitations).where(eq(invitations.tokenHash, input.tokenHash)).for("update");
    if (!inv) return { ok: false, reason: "unknown" };
    const state = stateOf(inv);
    if (state !== "live") return { ok: false, reason: state };
    let userId: string;
    if (input.newUser) {
      const [created] = await tx
        .insert(users)
        .values({ id: randomUUID(), email: inv.email, name: input.newUser.name, passwordHash: input.newUser.passwordHash })
        .onConflictDoNothing({ target: users.email })
        .returning({ id: users.id });
      if (!created) return { ok: false, reason: "account_exists" };
      userId = created.id;
    } else {
      const [account] = await tx.select({ id: users.id, email: users.email }).from(users).where(eq(users.id, input.userId ?? ""));
      if (!account || account.email !== inv.email) return { ok: false, reason: "wrong_account" };
      userId = account.id;
    }
    await tx.insert(projectMembers).values({ projectId: inv.projectId, userId, role: inv.role }).onConflictDoNothing();
    await tx.update(invitations).set({ usedAt: new Date() }).where(eq(invitations.id, inv.id));
    return { ok: true, userId, projectId: inv.projectId };
  });
}

// ---------- password resets ----------

export async function insertPasswordReset({ tx, userId, tokenHash, expiresAt }: { tx: Executor; userId: string; tokenHash: string; expiresAt: Date }) {
  const [row] = await tx.insert(passwordResets).values({ userId, tokenHash, expiresAt }).returning({ id: passwordResets.id });
  return row;
}

export async function findPasswordReset({ tokenHash }: { tokenHash: string }) {
  const [row] = await getDb()
    .select({ id: passwordResets.id, userId: passwordResets.userId, email: users.email, expiresAt: passwordResets.expiresAt, usedAt: passwordResets.usedAt })
    .from(passwordResets)
    .innerJoin(users, eq(users.id, passwordResets.userId))
    .where(eq(passwordResets.tokenHash, tokenHash));
  return row ? { ...row, state: stateOf(row) } : null;
}

export type ResetResult = { ok: true; userId: string; email: string } | { ok: false; reason: "unknown" | "used" | "expired" };

/** Sets the new password and retires this link and every other unused reset link of the account. */
export async function consumePasswordReset({ tokenHash, passwordHash }: { tokenHash: string; passwordHash: string }): Promise<ResetResult> {
  return getDb().transaction(async (tx) => {
    const [reset] = await tx.select().from(passwordResets).where(eq(passwordResets.tokenHash, tokenHash)).for("update");
    if (!reset) return { ok: false, reason: "unknown" };
    const state = stateOf(reset);
    if (state !== "live") return { ok: false, reason: state };
    const [user] = await tx.update(users).set({ passwordHash }).where(eq(users.id, reset.userId)).returning({ id: users.id, email: users.email });
    await tx
      .update(passwordResets)
      .set({ usedAt: new Date() })
      .where(and(eq(passwordResets.userId, reset.userId), isNull(passwordResets.usedAt)));
    return { ok: true, userId: user.id, email: user.email };
  });
}
