/**
 * Exports of a run: planned closures as iCalendar, read back with ical.js (a general-purpose parser, not the
 * package that wrote it), and CSV read back with papaparse.
 */
import { describe, expect, it } from "vitest";
import { readFileSync } from "node:fs";
import ICAL from "ical.js";
import Papa from "papaparse";
import { parseScenario, runScenario } from "../../sim/index";
import { closureLocalTimes, hoursSince, localToUtc, plannedClosures } from "../../src/lib/exports/closures";
import { closuresToIcs } from "../../src/lib/exports/ical";
import { percentilesCsv, traceCsv } from "../../src/lib/exports/results-csv";

const load = (f: string) => {
  const p = parseScenario(JSON.parse(readFileSync(new URL(`../../scenarios/${f}`, import.meta.url), "utf8")));
  if (!p.ok) throw new Error(JSON.stringify(p.problems));
  return p.scenario;
};

describe("localToUtc", () => {
  // Source: US daylight saving time rules (15 U.S.C. 260a): CDT = UTC−5 in summer, CST = UTC−6 in winter;
  // in 2027 DST starts 14 March at 02:00 local.
  it("applies the zone's offset on each side of a DST change", () => {
    expect(localToUtc("2027-07-01T20:00", "America/Chicago").toISOString()).toBe("2027-07-02T01:00:00.000Z");
    expect(localToUtc("2027-01-15T20:00", "America/Chicago").toISOString()).toBe("2027-01-16T02:00:00.000Z");
    expect(localToUtc("2027-03-14T12:00", "America/Chicago").toISOString()).toBe("2027-03-14T17:00:00.000Z");
  });
});

/** An event's UTC instant back to local wall-clock time in the calendar's zone, `YYYY-MM-DDTHH:mm`. */
function localOf(d: Date, timeZone: string): string {
  const parts = new Intl.DateTimeFormat("en-US", { timeZone, hourCycle: "h23", year: "numeric", month: "2-digit", day: "2-digit", hour: "2-digit", minute: "2-digit" }).formatToParts(d);
  const g = (t: string) => parts.find((p) => p.type === t)!.value;
  return `${g("year")}-${g("month")}-${g("day")}T${g("hour")}:${g("minute")}`;
}

/** The ICS parsed with ical.js: each event's closure id (second category) and local start/end. */
function parsedEvents(text: string, timeZone: string) {
  const cal = new ICAL.Component(ICAL.parse(text));
  return cal.getAllSubcomponents("vevent").map((v) => {
    const e = new ICAL.Event(v);
    const categories = v.getFirstProperty("categories")!.getValues() as string[];
    return { uid: e.uid, summary: e.summary, closure: categories[1], start: localOf(e.startDate.toJSDate(), timeZone), end: localOf(e.endDate.toJSDate(), timeZone) };
  });
}

/** Per closure id, which quarter hours (since startDate) it stands in, from [start, end) local ISO intervals. */
function quarterHours(startDate: string, periods: { closure: string; start: string; end: string }[]) {
  const out = new Map<string, Set<number>>();
  for (const p of periods) {
    const set = out.get(p.closure) ?? out.set(p.closure, new Set()).get(p.closure)!;
    for (let q = Math.round(4 * hoursSince(startDate, p.start)); q < Math.round(4 * hoursSince(startDate, p.end)); q++) set.add(q);
  }
  return out;
}

describe("planned closures come from the closure timeline", () => {
  const small = load("small-deterministic.json");
  const summary = runScenario(small, { iterations: 3, seed: "x" });
  const closures = plannedClosures(summary)!;

  it("are the representative closure timeline, period for period, in time order", () => {
    // The small deck works one 07:00–17:00 weekday window (fixed weather, no set-up time): each closure
    // lies inside a window and closures of one kind never overlap.
    const timeline = summary.representative.closureTimeline;
    expect(closures.length).toBe(timeline.length);
    expect(closures.length).toBeGreaterThan(0);
    const asText = closures.map((c) => ({ closure: c.closureId, kind: c.kind, lanes: c.lanes, ...closureLocalTimes(c, small.startDate) }));
    expect(asText).toEqual(expect.arrayContaining(timeline.map((p) => ({ closure: p.closure, kind: p.kind, lanes: p.lanes, start: p.start, end: p.end }))));
    for (const c of asText) {
      expect(c.start.slice(11) >= "07:00").toBe(true);
      expect(c.end.slice(11) <= "17:00").toBe(true);
      expect(c.start.slice(0, 10)).toBe(c.end.slice(0, 10));
    }
    for (let i = 1; i < closures.length; i++) expect(closures[i].start).toBeGreaterThanOrEqual(closures[i - 1].end);
    // Every stretch a crew under the closure works or mobilizes lies inside one of its periods.
    const closureOf = new Map(small.operations.flatMap((o) => (o.kind === "crew" && o.closure ? [[o.id, o.closure] as const] : [])));
    let checked = 0;
    for (const t of summary.representative.trace.packets) {
      const id = closureOf.get(t.op);
      if (!id) continue;
      const from = t.mobilizedFrom ?? t.start;
      const inside = closures.some((c) => c.closureId === id && c.start <= from + 1e-6 && t.finish <= c.end + 1e-6);
      const paused = summary.representative.trace.pauses.some((p) => p.op === t.op && p.packet === t.packet);
      // A packet paused overnight spans two periods; its worked pieces are checked through the pause-free ones.
      if (!paused) {
        expect(inside).toBe(true);
        checked++;
      }
    }
    expect(checked).toBeGreaterThan(0);
  });

  it("a staged plan exports each stage's round-the-clock closure beside its night closures", () => {
    const staged = load("kestrel-staged-three-lane.json");
    const s = runScenario(staged, { iterations: 5, seed: "stages" });
    const cl = plannedClosures(s)!;
    const standing = cl.filter((c) => c.kind === "standing");
    expect(standing.map((c) => c.closureId).sort()).toEqual(["stage:stage-1", "stage:stage-2"]);
    expect(standing.find((c) => c.closureId === "stage:stage-1")!.lanes).toEqual(["L1"]);
    // A standing closure stands through nights: one period lasts longer than any night window.
    expect(Math.max(...standing.map((c) => c.end - c.start))).toBeGreaterThan(24);
    const text = closuresToIcs({ closures: cl, startDate: staged.startDate, timeZone: staged.timeZone, structure: "Kestrel Bay Causeway", scenario: staged.name, uidSeed: "s" });
    const titles = new ICAL.Component(ICAL.parse(text)).getAllSubcomponents("vevent").map((v) => new ICAL.Event(v).summary);
    expect(titles.some((t) => t.endsWith(": L1 closed round the clock"))).toBe(true);
    expect(titles.some((t) => t.endsWith("Night closure of L2 (mixer trucks) (L2 closed)"))).toBe(true);
  });

  it("a run stored before the timeline existed yields null (run it again), not an empty plan", () => {
    const old = { ...summary, representative: { ...summary.representative, closureTimeline: undefined as never } };
    expect(plannedClosures(old)).toBeNull();
  });

  it("parse as iCalendar with one event per closure, with its lanes and times", () => {
    const text = closuresToIcs({ closures, startDate: small.startDate, timeZone: small.timeZone, structure: "Test Deck", scenario: small.name, uidSeed: "t" });
    const events = parsedEvents(text, small.timeZone);
    expect(events).toHaveLength(closures.length);
    expect(events[0].summary).toContain("L1 closed");
    expect(events[0].start).toBe(summary.representative.closureTimeline[0].start);
    expect(new Set(events.map((e) => e.uid)).size).toBe(events.length);
  });

  // The calendar and the delay model must agree: the delay is computed from the closure timeline, so the
  // calendar, parsed back, must stand exactly when the timeline does, every quarter hour, closure by closure.
  for (const file of ["kestrel-two-season.json", "kestrel-staged-three-lane.json"]) {
    it(`${file}: the calendar agrees with the closure timeline hour by hour, and no event outlasts its period`, () => {
      const demo = load(file);
      const s = runScenario(demo, { iterations: 12, seed: "ics" });
      const cl = plannedClosures(s)!;
      const timeline = s.representative.closureTimeline;
      expect(cl).toHaveLength(timeline.length);
      const text = closuresToIcs({ closures: cl, startDate: demo.startDate, timeZone: demo.timeZone, structure: "Kestrel Bay Causeway", scenario: demo.name, uidSeed: "k" });
      const events = parsedEvents(text, demo.timeZone);
      expect(events).toHaveLength(timeline.length);

      const fromCalendar = quarterHours(demo.startDate, events);
      const fromTimeline = quarterHours(demo.startDate, timeline);
      expect([...fromCalendar.keys()].sort()).toEqual([...fromTimeline.keys()].sort());
      for (const [id, qs] of fromTimeline) expect(fromCalendar.get(id)).toEqual(qs);

      // Each short-term event lasts no longer than its closure's longest window (a night closure is one night:
      // set-up and take-down happen inside the window), and no event is longer than its timeline period.
      const windowHours = (id: string) =>
        Math.max(...demo.calendar.closureWindows.filter((w) => w.closure === id).map((w) => (w.endHour > w.startHour ? w.endHour - w.startHour : 24 - w.startHour + w.endHour)));
      const byStart = new Map(timeline.map((p) => [`${p.closure}|${p.start}`, p]));
      for (const e of events) {
        const p = byStart.get(`${e.closure}|${e.start}`)!;
        expect(p, `event ${e.closure} at ${e.start} has a timeline period`).toBeDefined();
        expect(e.end).toBe(p.end);
        const hours = hoursSince(demo.startDate, e.end) - hoursSince(demo.startDate, e.start);
        if (p.kind === "short") expect(hours).toBeLessThanOrEqual(windowHours(e.closure));
      }
      if (file === "kestrel-staged-three-lane.json") expect(events.some((e) => e.closure.startsWith("stage:"))).toBe(true);
    });
  }
});

describe("results CSV", () => {
  const demo = load("kestrel-two-season.json");
  const s = runScenario(demo, { iterations: 20, seed: "csv" });

  it("percentiles: one row overall, one per stage and one per operation, with a stage column", () => {
    const rows = Papa.parse<Record<string, string>>(percentilesCsv(s), { header: true }).data;
    expect(rows).toHaveLength(1 + demo.stages.length + demo.operations.length);
    expect(rows[0]).toMatchObject({ kind: "overall", item: "overall", p80: s.finish.p80 });
    expect(rows.filter((r) => r.kind === "stage").map((r) => r.stage)).toEqual(demo.stages.map((st) => st.id));
    expect(rows.filter((r) => r.kind === "operation").map((r) => r.item)).toEqual(demo.operations.map((o) => o.id));
  });

  it("trace: one row per packet of each stage operation with its stage, stations and times", () => {
    const rows = Papa.parse<Record<string, string>>(traceCsv(s, demo), { header: true }).data;
    expect(rows).toHaveLength(s.representative.trace.packets.length);
    expect(Number(rows[0].station_from_ft)).toBe(demo.deck.startStationFt + Number(rows[0].packet) * demo.deck.packetFt);
    expect(rows[0].start).toMatch(/^\d{4}-\d{2}-\d{2}T\d{2}:\d{2}$/);
    expect(rows[0].stage).toBe(demo.stages[0].id);
  });

  it("staged: stage rows carry each stage's restoration; a packet worked in two stages keeps its pauses apart", () => {
    const staged = load("kestrel-staged-three-lane.json");
    const st = runScenario(staged, { iterations: 5, seed: "stages" });
    const rows = Papa.parse<Record<string, string>>(percentilesCsv(st), { header: true }).data;
    const stageRows = rows.filter((r) => r.kind === "stage");
    expect(stageRows.map((r) => [r.stage, r.p50])).toEqual(st.stages.map((x) => [x.id, x.finish.p50]));
    const trace = Papa.parse<Record<string, string>>(traceCsv(st, staged), { header: true }).data;
    expect(new Set(trace.map((r) => r.stage))).toEqual(new Set(["stage-1", "stage-2"]));
    // Paused hours per row = the pauses of that stage's packet only, so the column sums to the trace's pauses.
    const total = trace.reduce((a, r) => a + Number(r.paused_hours), 0);
    const pauses = st.representative.trace.pauses.reduce((a, p) => a + (p.end - p.start), 0);
    expect(total).toBeCloseTo(pauses, 0);
  });
});
