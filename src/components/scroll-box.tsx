import type { ReactNode } from "react";

/**
 * A box whose table may scroll sideways (on a phone), for tables with nothing focusable in them: the box itself
 * takes the keyboard's focus, so it can be scrolled with the arrow keys, and is named, so a screen reader says what
 * it is (axe's scrollable-region-focusable rule). A table with buttons or links in every row needs no such box.
 */
export function ScrollBox({ label, className = "", children }: { label: string; className?: string; children: ReactNode }) {
  return (
    <div className={`scroll-x ${className}`} tabIndex={0} role="region" aria-label={label}>
      {children}
    </div>
  );
}
