/**
 * What the closure-notice routes answer, for the Share page's "Closure notices" section and the server that builds
 * the answers (src/lib/server/closure-notices.ts and the route handlers):
 * - `GET /api/projects/:id/closure-subscribers` → `ClosureSubscribersAnswer`: who is told when closures are published;
 * - `GET /api/scenarios/:id/closure-publications` → `ClosurePublicationsAnswer`: earlier publications and whether
 *   what the public sees lags the newest forecast; with `?preview=1` → `ClosurePreviewAnswer`: the notice exactly as
 *   publishing would send it, for the confirmation;
 * - `POST /api/scenarios/:id/closure-publications` → `ClosurePublishedAnswer` (201);
 * - `GET /api/projects/:id/closure-weekly` → `ClosureWeeklyAnswer`: the weekly e-mail to the same subscribers.
 * Times are ISO strings: what the JSON carries.
 */

export interface ClosureSubscriber {
  id: string;
  email: string;
  label: string;
  createdAt: string;
}

export interface ClosureSubscribersAnswer {
  subscribers: ClosureSubscriber[];
}

export interface ClosurePublication {
  id: string;
  closureCount: number;
  notified: number;
  publishedAt: string;
  publishedByName: string;
  runId: string;
  /** The forecast it came from, in words. */
  source: string;
  /** Its link was revoked: the feeds and advisories show the newest publication still standing. */
  withdrawn: boolean;
}

export interface ClosurePublicationsAnswer {
  /** Newest first, at most 10. */
  publications: ClosurePublication[];
  /** Set when what every feed and advisory shows came from an earlier forecast than the newest: both in words. */
  lag: { publishedAt: string; published: string; newest: string; newestStale: boolean; changes: string | null } | null;
}

/** What publishing the newest forecast would send; publishing names `runId`, so a newer one is refused, not sent unseen. */
export interface ClosureNoticePreview {
  runId: string;
  /** Which forecast, in words, and the field-log changes it does not know. */
  source: string;
  closureCount: number;
  to: string[];
  subject: string;
  text: string;
}

export interface ClosurePreviewAnswer {
  preview: ClosureNoticePreview;
}

export interface ClosurePublishedAnswer {
  id: string;
  publishedAt: string;
  closureCount: number;
  notified: number;
  /** The new links of this publication (the earlier ones follow it too). */
  feedUrl: string;
  advisoryUrl: string;
}

export interface ClosureWeeklyAnswer {
  /** 0 (Sunday)–6 and a local hour 0–23, both null when the weekly e-mail is off. */
  closureWeeklyDay: number | null;
  closureWeeklyHour: number | null;
  /** The last local date it was sent or skipped for, and what that day did, in words. */
  lastOn: string | null;
  note: string | null;
}
