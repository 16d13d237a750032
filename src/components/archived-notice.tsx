import { formatDateTime } from "@/lib/format";
import { ArchiveButton } from "./archive-button";

/**
 * Above every page of an archived project: when and by whom, what that means, and — for its administrators —
 * the way back. Said on each page because a link into the project may land anywhere in it.
 */
export function ArchivedNotice({ projectId, archivedAt, byName, canRestore }: { projectId: string; archivedAt: Date; byName: string | null; canRestore: boolean }) {
  return (
    <section className="flex flex-wrap items-center justify-between gap-3 rounded-md border border-warn/50 bg-warn-bg px-4 py-3" aria-labelledby="archived-heading" data-testid="archived-notice">
      <div className="text-sm">
        <h2 id="archived-heading" className="text-base">
          Archived project
        </h2>
        <p className="mt-1">
          Archived {formatDateTime(archivedAt)}
          {byName ? ` by ${byName}` : ""}. You can still read and export everything in it and revoke its share links. Nothing can be changed, run or
          published, and its daily e-mails have stopped, until an administrator restores it.
        </p>
      </div>
      {canRestore && <ArchiveButton projectId={projectId} archived />}
    </section>
  );
}
