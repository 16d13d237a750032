import "server-only";
import { and, desc, eq, gt, isNull } from "drizzle-orm";
import { getDb } from "../client";
import { shareLinks, users } from "../schema";
import type { Executor } from "./mail";

/** `tx` lets the caller write the link in its own transaction (e.g. with the e-mails that carry it). */
export async function createShareLink(input: { scenarioId: string; tokenHash: string; label: string; userId: string; expiresAt: Date; tx?: Executor }) {
  const [row] = await (input.tx ?? getDb())
    .insert(shareLinks)
    .values({ scenarioId: input.scenarioId, tokenHash: input.tokenHash, label: input.label, createdById: input.userId, expiresAt: input.expiresAt })
    .returning({ id: shareLinks.id, expiresAt: shareLinks.expiresAt, createdAt: shareLinks.createdAt });
  return row;
}

export async function listShareLinks({ scenarioId }: { scenarioId: string }) {
  return getDb()
    .select({
      id: shareLinks.id,
      label: shareLinks.label,
      expiresAt: shareLinks.expiresAt,
      revokedAt: shareLinks.revokedAt,
      createdAt: shareLinks.createdAt,
      createdByName: users.name,
    })
    .from(shareLinks)
    .innerJoin(users, eq(users.id, shareLinks.createdById))
    .where(eq(shareLinks.scenarioId, scenarioId))
    .orderBy(desc(shareLinks.createdAt));
}

export async function getShareLink({ id }: { id: string }) {
  const [row] = await getDb().select().from(shareLinks).where(eq(shareLinks.id, id));
  return row ?? null;
}

export async function revokeShareLink({ id }: { id: string }) {
  await getDb().update(shareLinks).set({ revokedAt: new Date() }).where(and(eq(shareLinks.id, id), isNull(shareLinks.revokedAt)));
}

/** A link that is revoked or expired is treated exactly like one that never existed. */
export async function findLiveShareLink({ tokenHash }: { tokenHash: string }) {
  const [row] = await getDb()
    .select()
    .from(shareLinks)
    .where(and(eq(shareLinks.tokenHash, tokenHash), isNull(shareLinks.revokedAt), gt(shareLinks.expiresAt, new Date())));
  return row ?? null;
}
