/**
 * The frame of a page opened by a share link (a scenario's or a plan search's): the read-only banner with the
 * link's expiry, the project line, the page's own content and the safety note. One frame so the two public
 * pages say the same things in the same places.
 */
import type { ReactNode } from "react";
import { formatDateTime } from "@/lib/format";
import { SafetyNote } from "@/components/safety-note";

export function SharedPageFrame({ expiresAt, project, children }: { expiresAt: Date | string; project: { name: string; structureName: string; region: string } | null; children: ReactNode }) {
  return (
    <div className="min-h-screen">
      <header className="border-b border-line bg-white">
        <div className="mx-auto flex max-w-7xl flex-wrap items-center justify-between gap-3 px-5 py-3">
          <p className="text-lg font-bold tracking-tight text-brand-700">Pourline</p>
          <p className="badge border border-line text-muted" data-testid="shared-expiry">
            Read-only link, expires {formatDateTime(expiresAt)}
          </p>
        </div>
      </header>
      <main id="main" className="mx-auto max-w-7xl space-y-5 px-5 py-6">
        {project && (
          // mb-1 replaces the stack's gap below this line (space-y sets the margin after each child; a negative one
          // pulled the heading up over this line), so the project line sits just above the title it belongs to.
          <p className="mb-1 text-sm text-muted" data-testid="shared-project">
            {[project.name, project.structureName, project.region].filter(Boolean).join(" · ")}
          </p>
        )}
        {children}
        <SafetyNote />
      </main>
    </div>
  );
}
