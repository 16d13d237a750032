/**
 * What the share-link routes answer, for the Share pages' list (src/components/share-links.tsx) and the handlers
 * that build it: `GET /api/scenarios/:id/share-links` (every link of the scenario, whatever it opens) and
 * `GET /api/searches/:id/share-links` (one search's) → `ShareLinksAnswer`; `POST` to either → `ShareLinkCreatedAnswer`
 * (201), the only answer that carries the token — only its hash is stored, so the link is shown once.
 * Times are ISO strings: what the JSON carries.
 */

/** The data layer's `ShareScope` (db/schema.ts): what a link opens. */
export type ShareLinkScope = "scenario" | "closure-feed" | "search";

export interface ShareLinkRow {
  id: string;
  label: string;
  scope: ShareLinkScope;
  /** Set on a search link only. */
  searchId: string | null;
  searchName: string | null;
  expiresAt: string;
  revokedAt: string | null;
  createdAt: string;
  createdByName: string;
}

export interface ShareLinksAnswer {
  links: ShareLinkRow[];
}

export interface ShareLinkCreatedAnswer {
  id: string;
  scope: ShareLinkScope;
  expiresAt: string;
  createdAt: string;
  token: string;
  /** Where the link opens, without the origin (the browser adds its own). */
  path: string;
  /** The addresses it was e-mailed to, lower-cased and without repeats. */
  emailedTo: string[];
}
