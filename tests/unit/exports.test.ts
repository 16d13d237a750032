/**
 * Exports of a run: planned closures as iCalendar, read back with ical.js (a general-purpose parser, not the
 * package that wrote it), and CSV read back with papaparse.
 */
import { describe, expect, it } from "vitest";
import { readFileSync } from "node:fs";
import ICAL from "ical.js";
import Papa from "papaparse";
import { parseScenario, runScenario } from "../../sim/index";
import { localToUtc, plannedClosures, closureLocalTimes } from "../../src/lib/exports/closures";
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

describe("planned closures", () => {
  const small = load("small-deterministic.json");
  const summary = runScenario(small, { iterations: 3, seed: "x" });
  const closures = plannedClosures(summary, small);

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
    const cl = plannedClosures(s, staged);
    const standing = cl.filter((c) => c.kind === "standing");
    expect(standing.map((c) => c.closureId).sort()).toEqual(["stage:stage-1", "stage:stage-2"]);
    expect(standing.find((c) => c.closureId === "stage:stage-1")!.lanes).toEqual(["L1"]);
    // A standing closure stands through nights: one period lasts longer than any night window.
    expect(Math.max(...standing.map((c) => c.end - c.start))).toBeGreaterThan(24);
    const text = closuresToIcs({ closures: cl, startDate: staged.startDate, timeZone: staged.timeZone, structure: "Kestrel Bay Causeway", scenario: staged.name, uidSeed: "s" });
    const titles = new ICAL.Component(ICAL.parse(text)).getAllSubcomponents("vevent").map((v) => new ICAL.Event(v).summary);
    expect(titles.some((t) => t.endsWith("— L1 closed round the clock"))).toBe(true);
    expect(titles.some((t) => t.endsWith("Night closure of L2 (mixer trucks) — L2 closed"))).toBe(true);
  });

  it("a run stored before the closure timeline falls back to the crews' working time", () => {
    const old = { ...summary, representative: { ...summary.representative, closureTimeline: undefined } } as unknown as typeof summary;
    const cl = plannedClosures(old, small);
    expect(cl.length).toBeGreaterThan(0);
    expect(cl.every((c) => c.kind === "short" && c.closureId === small.calendar.closures[0].id)).toBe(true);
  });

  it("parse as iCalendar with one event per closure, with its lanes and times", () => {
    const text = closuresToIcs({ closures, startDate: small.startDate, timeZone: small.timeZone, structure: "Test Deck", scenario: small.name, uidSeed: "t" });
    const cal = new ICAL.Component(ICAL.parse(text));
    const events = cal.getAllSubcomponents("vevent").map((v) => new ICAL.Event(v));
    expect(events).toHaveLength(closures.length);
    const first = events[0];
    expect(first.summary).toContain("L1 closed");
    const expected = localToUtc(closureLocalTimes(closures[0], small.startDate).start, small.timeZone);
    expect(first.startDate.toJSDate().toISOString()).toBe(expected.toISOString());
    expect(new Set(events.map((e) => e.uid)).size).toBe(events.length);
  });

  it("the main demo exports its night and day closures", () => {
    const demo = load("kestrel-two-season.json");
    const s = runScenario(demo, { iterations: 20, seed: "ics" });
    const cl = plannedClosures(s, demo);
    const ids = new Set(cl.map((c) => c.closureId));
    expect(ids.size).toBeGreaterThanOrEqual(2);
    const text = closuresToIcs({ closures: cl, startDate: demo.startDate, timeZone: demo.timeZone, structure: "Kestrel Bay Causeway", scenario: demo.name, uidSeed: "k" });
    const events = new ICAL.Component(ICAL.parse(text)).getAllSubcomponents("vevent");
    expect(events.length).toBe(cl.length);
  });
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
