import "server-only";
import { and, desc, eq, gt, inArray, isNull } from "drizzle-orm";
import { getDb } from "../client";
import { planSearches, shareLinks, users, type ShareScope } from "../schema";
import type { Executor } from "./mail";

/**
 * `scope` is what the token will open: "scenario" (the read-only page and its JSON, and the feed),
 * "closure-feed" (the calendar feed only) or "search" (one plan search, `searchId`, of the scenario). `tx` lets
 * the caller write the link in its own transaction (e.g. with the e-mails that carry it).
 */
export async function createShareLink(
  input: { scenarioId: string; tokenHash: string; label: string; userId: string; expiresAt: Date; tx?: Executor } & ({ scope: "scenario" | "closure-feed"; searchId?: never } | { scope: "search"; searchId: string }),
) {
  const [row] = await (input.tx ?? getDb())
    .insert(shareLinks)
    .values({ scenarioId: input.scenarioId, searchId: input.searchId ?? null, tokenHash: input.tokenHash, label: input.label, createdById: input.userId, expiresAt: input.expiresAt, scope: input.scope })
    .returning({ id: shareLinks.id, scope: shareLinks.scope, expiresAt: shareLinks.expiresAt, createdAt: shareLinks.createdAt });
  return row;
}

const linkColumns = {
  id: shareLinks.id,
  label: shareLinks.label,
  scope: shareLinks.scope,
  searchId: shareLinks.searchId,
  searchName: planSearches.name,
  expiresAt: shareLinks.expiresAt,
  revokedAt: shareLinks.revokedAt,
  createdAt: shareLinks.createdAt,
  createdByName: users.name,
};

/** Every link of a scenario, whatever it opens (the scenario, its closure feed or one of its searches). */
export async function listShareLinks({ scenarioId }: { scenarioId: string }) {
  return getDb()
    .select(linkColumns)
    .from(shareLinks)
    .innerJoin(users, eq(users.id, shareLinks.createdById))
    .leftJoin(planSearches, eq(planSearches.id, shareLinks.searchId))
    .where(eq(shareLinks.scenarioId, scenarioId))
    .orderBy(desc(shareLinks.createdAt), desc(shareLinks.id));
}

/** The links that open one plan search. */
export async function listSearchShareLinks({ searchId }: { searchId: string }) {
  return getDb()
    .select(linkColumns)
    .from(shareLinks)
    .innerJoin(users, eq(users.id, shareLinks.createdById))
    .leftJoin(planSearches, eq(planSearches.id, shareLinks.searchId))
    .where(and(eq(shareLinks.searchId, searchId), eq(shareLinks.scope, "search")))
    .orderBy(desc(shareLinks.createdAt), desc(shareLinks.id));
}

export async function getShareLink({ id }: { id: string }) {
  const [row] = await getDb().select().from(shareLinks).where(eq(shareLinks.id, id));
  return row ?? null;
}

export async function revokeShareLink({ id }: { id: string }) {
  await getDb().update(shareLinks).set({ revokedAt: new Date() }).where(and(eq(shareLinks.id, id), isNull(shareLinks.revokedAt)));
}

/**
 * A live link of one of the `scopes`. A link that is revoked, expired or of another scope is treated exactly
 * like one that never existed.
 */
export async function findLiveShareLink({ tokenHash, scopes }: { tokenHash: string; scopes: readonly ShareScope[] }) {
  const [row] = await getDb()
    .select()
    .from(shareLinks)
    .where(and(eq(shareLinks.tokenHash, tokenHash), inArray(shareLinks.scope, [...scopes]), isNull(shareLinks.revokedAt), gt(shareLinks.expiresAt, new Date())));
  return row ?? null;
}
