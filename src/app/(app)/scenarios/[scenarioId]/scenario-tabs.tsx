"use client";
import Link from "next/link";
import { usePathname } from "next/navigation";

export function ScenarioTabs({ scenarioId, canShare, canEdit }: { scenarioId: string; canShare: boolean; canEdit: boolean }) {
  const path = usePathname();
  const base = `/scenarios/${scenarioId}`;
  const tabs = [
    { href: base, label: "Outlook" },
    { href: `${base}/plan`, label: "Plan" },
    { href: `${base}/progress`, label: "Field log" },
    { href: `${base}/look-ahead`, label: "Week ahead" },
    { href: `${base}/search`, label: "Plan search" },
    ...(canEdit ? [{ href: `${base}/data`, label: "Field data" }] : []),
    ...(canShare ? [{ href: `${base}/share`, label: "Share" }] : []),
  ];
  return (
    // On a phone the seven tabs wrap onto a second row rather than push the page sideways (a hidden "Share" tab
    // at the end of a sideways-scrolling row would not be found).
    <nav aria-label="Scenario sections" className="border-b border-line">
      <ul className="-mb-px flex flex-wrap gap-x-1">
        {tabs.map((t) => {
          // A tab's own pages below it (a plan search, a day's report) keep it marked; the Outlook is the base itself.
          const active = path === t.href || (t.href !== base && path.startsWith(`${t.href}/`));
          return (
            <li key={t.href}>
              <Link
                href={t.href}
                aria-current={active ? "page" : undefined}
                className={`inline-block whitespace-nowrap border-b-2 px-3 py-2 text-sm sm:px-4 font-medium ${active ? "border-brand-600 text-brand-700" : "border-transparent text-muted hover:text-ink"}`}
              >
                {t.label}
              </Link>
            </li>
          );
        })}
      </ul>
    </nav>
  );
}
