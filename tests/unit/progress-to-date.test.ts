/**
 * Progress to date from the field log, against hand-worked feet: overlapping shifts count once, a partial packet
 * counts by the feet covered, a second pass over the deck belongs to the next stage, an operation that works one
 * stage only is measured against that stage's length; shifts, hours lost and first and last dates per operation.
 */
import { describe, expect, it } from "vitest";
import { progressSentence, progressToDate, shareText, type FieldLogRecord } from "../../src/lib/progress-to-date";
import type { Scenario } from "../../sim/schema";
import { parseScenario } from "../../sim/validate";
import { loadScenario, small } from "./engine-fixtures";

function parsed(input: ReturnType<typeof small>): Scenario {
  const r = parseScenario(input);
  if (!r.ok) throw new Error(JSON.stringify(r.problems));
  return r.scenario;
}
const shift = (op: string, date: string, from: number, to: number, over: Partial<FieldLogRecord> = {}): FieldLogRecord => ({
  workDate: date, shift: "day", operationId: op, fromStationFt: from, toStationFt: to, lostHours: 0, ...over,
});

describe("progressToDate", () => {
  // Deck STA 0+00 to STA 10+00 in 100 ft packets, one stage, milling then overlay (scenarios/small-deterministic.json).
  const s = parsed(small());

  it("counts overlapping shifts once and a partial packet by its feet", () => {
    const rows = progressToDate(s, [
      shift("milling", "2027-04-05", 0, 300),
      shift("milling", "2027-04-06", 250, 450, { lostHours: 2.5 }),
      shift("overlay", "2027-04-07", 0, 200),
    ]);
    expect(rows.map((r) => r.id)).toEqual(["milling", "overlay"]);
    // Milling: 0–300 ∪ 250–450 = 0–450 → packets 0–3 whole (400 ft) and half of packet 4 (50 ft).
    expect(rows[0]).toMatchObject({ doneFt: 450, totalFt: 1000, shifts: 2, lostHours: 2.5, firstDate: "2027-04-05", lastDate: "2027-04-06" });
    expect(rows[0].stages).toHaveLength(1);
    expect(rows[1]).toMatchObject({ doneFt: 200, totalFt: 1000, shifts: 1, lostHours: 0, firstDate: "2027-04-07", lastDate: "2027-04-07" });
  });

  it("reads an empty log as nothing done", () => {
    const rows = progressToDate(s, []);
    expect(rows.map((r) => [r.doneFt, r.totalFt, r.shifts, r.firstDate])).toEqual([[0, 1000, 0, null], [0, 1000, 0, null]]);
  });

  it("puts a second pass over the deck in the next stage, and measures a one-stage operation against its stage", () => {
    // STA 5+00 to STA 35+00 (3,000 ft), two stages over the whole deck; each stage has its own placement.
    const staged = parsed(loadScenario("kestrel-staged-three-lane.json"));
    const rows = progressToDate(staged, [
      shift("milling", "2027-05-03", 500, 3500),
      shift("milling", "2027-08-02", 500, 1500),
      shift("placement-l1", "2027-05-20", 500, 2000),
    ]);
    const milling = rows.find((r) => r.id === "milling")!;
    expect(milling.stages.map((p) => [p.stageId, p.doneFt, p.totalFt])).toEqual([["stage-1", 3000, 3000], ["stage-2", 1000, 3000]]);
    expect(milling).toMatchObject({ doneFt: 4000, totalFt: 6000, shifts: 2 });
    const placement = rows.find((r) => r.id === "placement-l1")!;
    expect(placement).toMatchObject({ doneFt: 1500, totalFt: 3000 });
    expect(placement.stages.map((p) => p.stageId)).toEqual(["stage-1"]);
    expect(rows.some((r) => r.id === "cure")).toBe(false); // a wait operation has no shifts
  });
});

describe("shareText", () => {
  it("rounds to whole percent but never rounds a sliver to 0 % or an unfinished job to 100 %", () => {
    expect([shareText(0, 1000), shareText(1, 1000), shareText(450, 1000), shareText(996, 1000), shareText(1000, 1000), shareText(0, 0)]).toEqual(["0 %", "1 %", "45 %", "99 %", "100 %", "0 %"]);
  });
});

describe("progressSentence", () => {
  const s = parsed(small());
  const iso = (d: string) => d; // dates as written, so the sentence is checked word for word
  it("says how much is finished: as far as the operation furthest behind has gone", () => {
    expect(progressSentence(s, [shift("milling", "2027-04-05", 0, 600), shift("overlay", "2027-04-06", 0, 250)], iso)).toBe(
      "Progress: 25 % of the deck finished — every operation done over 250 of 1,000 ft; last shift in the field log 2027-04-06.",
    );
  });
  it("says nothing is finished while an operation has not started, naming the one furthest ahead", () => {
    expect(progressSentence(s, [shift("milling", "2027-04-05", 0, 300)], iso)).toBe(
      "Progress: under way, nothing finished yet (Mechanical milling furthest ahead, 30 % done); last shift in the field log 2027-04-05.",
    );
  });
  it("says when every operation is done, and nothing for an empty log", () => {
    expect(progressSentence(s, [shift("milling", "2027-04-05", 0, 1000), shift("overlay", "2027-04-07", 0, 1000)], iso)).toBe(
      "Progress: every operation done over the deck; last shift in the field log 2027-04-07.",
    );
    expect(progressSentence(s, [], iso)).toBeNull();
  });
  it("counts a staged job's finished feet stage by stage", () => {
    // STA 5+00 to 35+00, two stages of 3,000 ft. Stage 1's six crew operations all done STA 5+00 to 20+00:
    // 1,500 ft finished there; stage 2 not started (its placement has no shift), so 1,500 of 6,000 ft: 25 %.
    const staged = parsed(loadScenario("kestrel-staged-three-lane.json"));
    const entries = ["setup", "milling", "hydrodemolition", "cleanup", "placement-l1", "restriping"].map((op, k) => shift(op, `2027-05-0${k + 1}`, 500, 2000));
    expect(progressSentence(staged, entries, iso)).toBe("Progress: 25 % of the work of its 2 stages finished — every operation done over 1,500 of 6,000 ft; last shift in the field log 2027-05-06.");
  });
});
