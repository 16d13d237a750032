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

  it("cover exactly the crews' working time, merged into one event per window", () => {
    // The small deck works one 07:00–17:00 weekday window (fixed weather, one closure): each event lies
    // inside a window and events never overlap.
    expect(closures.length).toBeGreaterThan(0);
    for (const c of closures) {
      const { start, end } = closureLocalTimes(c, small.startDate);
      expect(start.slice(11) >= "07:00").toBe(true);
      expect(end.slice(11) <= "17:00").toBe(true);
      expect(start.slice(0, 10)).toBe(end.slice(0, 10));
    }
    for (let i = 1; i < closures.length; i++) expect(closures[i].start).toBeGreaterThanOrEqual(closures[i - 1].end);
    const worked = summary.representative.trace.packets.reduce((a, t) => a + (t.finish - (t.mobilizedFrom ?? t.start)), 0);
    const paused = summary.representative.trace.pauses.reduce((a, p) => a + (p.end - p.start), 0);
    const covered = closures.reduce((a, c) => a + (c.end - c.start), 0);
    // Overlapping crews of the same closure count once, so covered ≤ worked − paused.
    expect(covered).toBeLessThanOrEqual(worked - paused + 1e-9);
    expect(covered).toBeGreaterThan(0);
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

  it("percentiles: one row overall and one per operation", () => {
    const rows = Papa.parse<Record<string, string>>(percentilesCsv(s), { header: true }).data;
    expect(rows).toHaveLength(1 + demo.operations.length);
    expect(rows[0]).toMatchObject({ item: "overall", p80: s.finish.p80 });
    expect(rows.map((r) => r.item).slice(1)).toEqual(demo.operations.map((o) => o.id));
  });

  it("trace: one row per packet of each operation with stations and times", () => {
    const rows = Papa.parse<Record<string, string>>(traceCsv(s, demo), { header: true }).data;
    expect(rows).toHaveLength(s.representative.trace.packets.length);
    expect(Number(rows[0].station_from_ft)).toBe(demo.deck.startStationFt + Number(rows[0].packet) * demo.deck.packetFt);
    expect(rows[0].start).toMatch(/^\d{4}-\d{2}-\d{2}T\d{2}:\d{2}$/);
  });
});
