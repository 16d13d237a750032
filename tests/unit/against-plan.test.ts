/**
 * Progress against the plan's median iteration (src/lib/against-plan.ts), on a trace worked out by hand: 250 ft in
 * packets of 100, 100 and 50 ft; the second packet paused 14:00–24:00 on the first day, so its feet grow only over
 * the 10 hours worked (the time–distance chart's reading of a trace: feet in proportion to worked time).
 */
import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { againstPlan, againstPlanSentence, againstPlanText, planReference, workingDays, type AgainstPlan } from "@/lib/against-plan";
import type { Intervals } from "@sim/calendar";
import type { Scenario } from "@sim/schema";
import { formatIsoDate } from "@/lib/format";
import type { Trace } from "@sim/engine";

const trace: Trace = {
  packets: [
    { op: "mill", packet: 0, crew: 0, start: 0, finish: 10 },
    { op: "mill", packet: 1, crew: 0, start: 10, finish: 30 },
    { op: "mill", packet: 2, crew: 0, start: 30, finish: 35 },
    { op: "cure", packet: 0, crew: -1, start: 10, finish: 40 },
  ],
  pauses: [{ op: "mill", packet: 1, crew: 0, start: 14, end: 24, reason: "closed" }],
};
const ref = { trace, startDate: "2027-04-05", lengthFt: 250, packetFt: 100 };
const on = (doneFt: number, toDate: string) => {
  const a = againstPlan([{ id: "mill", doneFt }], ref, toDate).get("mill")!;
  return { ...a, text: againstPlanText(a, toDate, doneFt, formatIsoDate) };
};

describe("against the plan", () => {
  it("reads the plan's feet at the end of the day: whole packets, and a paused one by its hours worked", () => {
    // By 24:00 of 5 Apr: packet 0 (100 ft) and 4 of packet 1's 10 worked hours (40 ft).
    expect(on(100, "2027-04-05")).toEqual({ plannedFt: 140, differenceFt: -40, planReachedOn: "2027-04-05", workDays: null, text: "40 ft behind — where the plan was on 5 Apr 2027" });
    expect(on(100, "2027-04-06")).toMatchObject({ plannedFt: 250, differenceFt: -150, text: "150 ft behind — where the plan was on 5 Apr 2027, 1 day earlier" });
  });
  it("says when the plan gets as far as a field that is ahead, and when it is on plan", () => {
    // 200 ft: packet 1 ends at hour 30, 06:00 on 6 Apr.
    expect(on(200, "2027-04-05")).toEqual({ plannedFt: 140, differenceFt: 60, planReachedOn: "2027-04-06", workDays: null, text: "60 ft ahead — where the plan gets on 6 Apr 2027, 1 day later" });
    expect(on(250, "2027-04-07").text).toBe("On plan");
  });
  it("names a field that has not started while the plan had", () => {
    expect(on(0, "2027-04-05")).toEqual({ plannedFt: 140, differenceFt: -140, planReachedOn: null, workDays: null, text: "140 ft behind — not started; the plan had begun" });
  });
  it("counts an unfinished packet (stored as null, read as Infinity) as never done", () => {
    const open = { ...ref, trace: { ...trace, packets: [...trace.packets.slice(0, 2), { op: "mill", packet: 2, crew: 0, start: 30, finish: Infinity }] } };
    const a = againstPlan([{ id: "mill", doneFt: 250 }], open, "2027-04-09").get("mill")!;
    expect(a).toEqual({ plannedFt: 200, differenceFt: 50, planReachedOn: null, workDays: null });
    expect(againstPlanText(a, "2027-04-09", 250, formatIsoDate)).toBe("50 ft ahead — further than the plan got");
  });
  it("behind means the plan got there on or before the day; ahead, after it", () => {
    const days = ["2027-04-05", "2027-04-06", "2027-04-07"];
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 250 }), fc.constantFrom(...days), (doneFt, toDate) => {
        const a = againstPlan([{ id: "mill", doneFt }], ref, toDate).get("mill")!;
        expect(a.plannedFt + a.differenceFt).toBeCloseTo(doneFt, 9);
        if (a.differenceFt <= -0.5) expect(a.planReachedOn! <= toDate).toBe(true);
        if (a.differenceFt >= 0.5) expect(a.planReachedOn! > toDate).toBe(true);
      }),
    );
  });

  it("compares only with a run of the plan as it stands, reading a stored null finish as unfinished", () => {
    const plan = { startDate: "2027-04-05", deck: { lengthFt: 250, packetFt: 100 } } as Scenario;
    const stored = { packets: [{ op: "mill", packet: 0, crew: 0, start: 0, finish: null }], pauses: [{ op: "mill", packet: 0, crew: 0, start: 5, end: null, reason: "weather" }] };
    expect(planReference({ trace: stored, stale: true }, plan)).toBeNull();
    expect(planReference({ trace: null, stale: false }, plan)).toBeNull();
    expect(planReference(null, plan)).toBeNull();
    // A trace stored in another shape (another version's) is no reference, not a thrown error.
    expect(planReference({ trace: { packets: "?" }, stale: false }, plan)).toBeNull();
    expect(planReference({ trace: [1, 2], stale: false }, plan)).toBeNull();
    const ref = planReference({ trace: stored, stale: false }, plan)!;
    expect(ref.trace.packets[0].finish).toBe(Infinity);
    expect(ref.trace.pauses[0].end).toBe(Infinity);
    expect(againstPlan([{ id: "mill", doneFt: 0 }], ref, "2027-04-09").get("mill")!.plannedFt).toBe(0);
  });

  it("counts the working days between the field and the plan: days with a shift the operation may work", () => {
    const intervals = (pairs: number[]): Intervals => {
      const n = pairs.length / 2;
      const starts = Float64Array.from(pairs.filter((_, i) => i % 2 === 0));
      const ends = Float64Array.from(pairs.filter((_, i) => i % 2 === 1));
      const dayIndex = new Int32Array(10);
      for (let d = 0, i = 0; d <= 9; d++) {
        while (i < n && ends[i] <= 24 * d) i++;
        dayIndex[d] = i;
      }
      return { starts, ends, length: n, dayIndex };
    };
    // A day shift 07:00–15:00 on days 0–6 and a night shift 20:00–05:00 on day 5; days 2 and 3 stood down (no
    // working time), and day 4's shift outside the closure window (its working time starts at 16:00, after it).
    const shifts = intervals([7, 15, 31, 39, 55, 63, 79, 87, 103, 111, 127, 135, 140, 149, 151, 159]);
    const open = intervals([7, 15, 31, 39, 112, 115, 127, 135, 140, 149, 151, 159]);
    const cal = { shifts, open };
    expect(workingDays(cal, 0, 4)).toBe(1); // day 1 only: 2 and 3 stood down, 4's shift has no working time
    expect(workingDays(cal, 1, 3)).toBe(0);
    expect(workingDays(cal, 4, 6)).toBe(2); // day 5 (its day and night shifts: one day) and day 6
    expect(workingDays(cal, -1, 0)).toBe(1);
    const a = againstPlan([{ id: "mill", doneFt: 100 }], ref, "2027-04-11", () => cal).get("mill")!;
    // The plan had 100 ft at hour 10 of day 0 (5 Apr); 11 Apr is day 6: days 1, 5 and 6 worked since.
    expect(a.workDays).toBe(3);
    expect(againstPlanText(a, "2027-04-11", 100, formatIsoDate)).toBe("150 ft behind — where the plan was on 5 Apr 2027, 3 working days earlier");
  });

  it("says the job against the plan in one sentence: how many operations are behind and the one furthest behind", () => {
    const mill = [{ id: "mill", name: "Milling", doneFt: 100 }];
    expect(againstPlanSentence(mill, againstPlan(mill, ref, "2027-04-05"), "2027-04-05", formatIsoDate)).toBe(
      "Against the plan at 5 Apr 2027: 1 of 1 operations behind, Milling: 40 ft behind, where the plan was on 5 Apr 2027.",
    );
    const done = [{ id: "mill", name: "Milling", doneFt: 250 }];
    expect(againstPlanSentence(done, againstPlan(done, ref, "2027-04-07"), "2027-04-07", formatIsoDate)).toBe("Against the plan at 7 Apr 2027: every operation on plan or ahead of it.");
    const idle = [{ id: "mill", name: "Milling", doneFt: 0 }];
    expect(againstPlanSentence(idle, againstPlan(idle, ref, "2027-04-05"), "2027-04-05", formatIsoDate)).toBe(
      "Against the plan at 5 Apr 2027: 1 of 1 operations behind, Milling: not started while the plan had 140 ft done.",
    );
    // The furthest behind is the one further back in working days, whatever the feet.
    const two = [{ id: "a", name: "Hydrodemolition", doneFt: 500 }, { id: "b", name: "Restriping", doneFt: 200 }, { id: "c", name: "Setup", doneFt: 900 }];
    const by = new Map<string, AgainstPlan>([
      ["a", { plannedFt: 800, differenceFt: -300, planReachedOn: "2027-05-10", workDays: 2 }],
      ["b", { plannedFt: 300, differenceFt: -100, planReachedOn: "2027-05-03", workDays: 7 }],
      ["c", { plannedFt: 900, differenceFt: 0, planReachedOn: "2027-05-12", workDays: 0 }],
    ]);
    expect(againstPlanSentence(two, by, "2027-05-12", formatIsoDate)).toBe(
      "Against the plan at 12 May 2027: 2 of 3 operations behind; furthest, Restriping: 100 ft behind, where the plan was on 3 May 2027 (7 working days earlier).",
    );
    expect(againstPlanSentence([], by, "2027-05-12", formatIsoDate)).toBeNull();
  });
});
