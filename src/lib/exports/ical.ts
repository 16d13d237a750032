/**
 * The planned closures as an iCalendar file (RFC 5545), written by the `ics` package: one event per period of
 * the closure timeline (./closures), from its start to its end exactly — set-up and take-down included, since
 * the lanes are closed then too.
 */
import { createEvents, type EventAttributes } from "ics";
import { closureLabel, closureLocalTimes, localToUtc, type PlannedClosure } from "./closures";

/**
 * `advisoryUrl` (a published plan's feed) links each event to the public travel advisory; `note(c)` adds a line
 * to an event's description (the expected longest backup while it stands).
 */
export function closuresToIcs(opts: { closures: PlannedClosure[]; startDate: string; timeZone: string; structure: string; scenario: string; uidSeed: string; advisoryUrl?: string; note?: (c: PlannedClosure) => string }): string {
  const events: EventAttributes[] = opts.closures.map((c, i) => {
    const local = closureLocalTimes(c, opts.startDate);
    const s = localToUtc(local.start, opts.timeZone);
    const e = localToUtc(local.end, opts.timeZone);
    const what =
      c.kind === "standing"
        ? `${c.name} — lanes ${c.lanes.join(", ")} closed round the clock (a long-term stage closure behind barrier) for deck overlay work.`
        : `${c.name} — lanes ${c.lanes.join(", ")} closed for deck overlay work, set-up and take-down included.`;
    return {
      uid: `${opts.uidSeed}-${c.closureId}-${i}@pourline`,
      start: [s.getUTCFullYear(), s.getUTCMonth() + 1, s.getUTCDate(), s.getUTCHours(), s.getUTCMinutes()],
      startInputType: "utc",
      startOutputType: "utc",
      end: [e.getUTCFullYear(), e.getUTCMonth() + 1, e.getUTCDate(), e.getUTCHours(), e.getUTCMinutes()],
      endInputType: "utc",
      endOutputType: "utc",
      title: `${opts.structure}: ${closureLabel(c)}`,
      description: `${what} Planned from scenario “${opts.scenario}”; times are planning estimates (local ${local.start} to ${local.end}, ${opts.timeZone}) and may change with weather and progress.${opts.note ? ` ${opts.note(c)}` : ""}${opts.advisoryUrl ? ` Travel advisory: ${opts.advisoryUrl}` : ""}`,
      ...(opts.advisoryUrl ? { url: opts.advisoryUrl } : {}),
      location: opts.structure,
      categories: [c.kind === "standing" ? "Long-term lane closure" : "Lane closure", c.closureId],
      status: "TENTATIVE",
      busyStatus: "BUSY",
      productId: "pourline/closures",
      calName: `${opts.structure} — planned lane closures`,
    };
  });
  if (events.length === 0) {
    // A calendar with no events is still a valid file to subscribe to.
    return "BEGIN:VCALENDAR\r\nVERSION:2.0\r\nPRODID:pourline/closures\r\nCALSCALE:GREGORIAN\r\nEND:VCALENDAR\r\n";
  }
  const { error, value } = createEvents(events);
  if (error || !value) throw new Error(`could not write the calendar: ${error?.message ?? "no output"}`);
  return value;
}
