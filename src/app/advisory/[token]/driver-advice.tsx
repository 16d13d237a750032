/** The usual advice to drivers near a work zone, in plain words. */
export function DriverAdvice() {
  return (
    <aside aria-labelledby="driver-advice-heading" className="rounded-md border border-warn/30 bg-warn-bg px-4 py-3 text-sm text-ink">
      <h2 id="driver-advice-heading" className="text-base">
        Before you drive
      </h2>
      <ul className="mt-2 list-disc space-y-1 pl-5">
        <li>Plan ahead: travel outside the hours to avoid, allow extra time or take another route.</li>
        <li>Slow down in the work zone and obey the posted speed limit; fines may be higher there.</li>
        <li>Merge early when a lane ends, keep a safe distance and watch for workers and trucks entering the road.</li>
        <li>Keep your eyes on the road: do not use your phone or photograph the work zone.</li>
      </ul>
    </aside>
  );
}
