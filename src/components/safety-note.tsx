/** The caution every plan carries: a schedule is a planning aid, not an engineering or work-zone decision. */
export function SafetyNote({ compact = false }: { compact?: boolean }) {
  return (
    <aside aria-label="Safety note" className="rounded-md border border-warn/30 bg-warn-bg px-4 py-3 text-sm text-ink">
      <p className="font-semibold text-warn">Planning aid, not an approval</p>
      <p className="mt-1">
        Schedules here drive work zones where people get hurt. Traffic control, temperature, evaporation and cure limits are set by the
        project specifications and local codes; work-zone and materials decisions rest with the responsible licensed engineers.
        {!compact && " The limits in a scenario are planning inputs only: check them against your specification before use."}
      </p>
    </aside>
  );
}
