import "server-only";
/**
 * The share-link answers (src/lib/share-link-contract.ts) from the data layer's rows, for the scenario's and the
 * search's share-link routes alike: the rows hold times as Dates, the answers as the ISO strings JSON carries.
 */
import type { createShareLink, listShareLinks } from "@db/queries/shares";
import type { ShareLinkCreatedAnswer, ShareLinksAnswer } from "@/lib/share-link-contract";

type ListedLink = Awaited<ReturnType<typeof listShareLinks>>[number];
type CreatedLink = Awaited<ReturnType<typeof createShareLink>>;

export function shareLinksAnswer(rows: readonly ListedLink[]): ShareLinksAnswer {
  return { links: rows.map((l) => ({ ...l, expiresAt: l.expiresAt.toISOString(), revokedAt: l.revokedAt?.toISOString() ?? null, createdAt: l.createdAt.toISOString() })) };
}

export function shareLinkCreatedAnswer(row: CreatedLink, sent: { token: string; path: string; emailedTo: string[] }): ShareLinkCreatedAnswer {
  return { ...row, expiresAt: row.expiresAt.toISOString(), createdAt: row.createdAt.toISOString(), ...sent };
}
