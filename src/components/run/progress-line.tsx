import { progressAnnouncement } from "./progress-announcement";

/**
 * The line under a progress bar: `detail` while the work goes (read on demand, not spoken), `ended` once it is over.
 * The live region stays in place from start to end: while the work goes it speaks only quarters
 * (./progress-announcement), then the end in `ended`'s words.
 */
export function ProgressLine({ detail, fraction, ended, className }: { detail: string | null; fraction: number; ended: string; className: string }) {
  return (
    <p className={className}>
      {detail}
      <span aria-live="polite">{detail !== null ? <span className="sr-only">{progressAnnouncement(fraction)}</span> : ended}</span>
    </p>
  );
}
