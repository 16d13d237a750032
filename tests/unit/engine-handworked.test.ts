/**
 * Hand-worked scenarios: each expected time is derived in the comment above it, from MODEL.md alone.
 * Base: scenarios/small-deterministic.json — 1,000 ft in ten 100 ft packets, start Mon 2027-04-05,
 * one day shift 07:00 + 10 h on weekdays, closure window weekdays 07:00–17:00, fixed weather.
 */
import { describe, expect, it } from "vitest";
import { formatHours } from "../../sim/dates";
import { compileScenario, simulate } from "../../sim/engine";
import { drawSamples } from "../../sim/samples";
import type { CrewOperation, Scenario, ScenarioInput } from "../../sim/schema";
import { parseScenario } from "../../sim/validate";
import { small } from "./engine-fixtures";

function run(input: ScenarioInput) {
  const r = parseScenario(input);
  if (!r.ok) throw new Error(JSON.stringify(r.problems));
  const c = compileScenario(r.scenario as Scenario);
  const res = simulate(c, drawSamples(r.scenario, "hand", 0), { trace: true });
  const at = (h: number) => formatHours(c.calendar.startDay, h);
  const packet = (op: string, i: number) => res.trace!.packets.find((p) => p.op === op && p.packet === i)!;
  return { res, at, packet };
}

describe("hand-worked schedules", () => {
  it("milling then a continuous overlay, one crew each", () => {
    // Milling 50 ft/h → 2 h a packet: Mon 07–17 packets 0–4, Tue 07–17 packets 5–9 (finish Tue 17:00).
    // Overlay 500 ft/shift over the 10 h shift = 50 ft/h → 2 h; packet i is ready when milling finishes i.
    // Packet 4 is ready Mon 17:00 (closed) → Tue 07:00–09:00; packets 5–8 follow milling 09–17 Tue;
    // packet 9 is ready Tue 17:00 → Wed 07:00–09:00. Overall finish Wed 2027-04-07T09:00.
    const { res, at, packet } = run(small());
    expect(at(packet("overlay", 4).start)).toBe("2027-04-06T07:00");
    expect(at(packet("milling", 9).finish)).toBe("2027-04-06T17:00");
    expect(at(res.finish)).toBe("2027-04-07T09:00");
    expect(res.finish).toBe(2 * 24 + 9);
    expect(res.unfinished).toBe(false);
    expect(res.weatherLostShifts).toBe(0);
  });

  it("two milling crews, then a 24 h cure 2 h after each packet", () => {
    // Milling 25 ft/h → 4 h a packet, two crews (ties to the lower crew): Mon 07–11 p0 (crew 0), p1 (crew 1);
    // 11–15 p2, p3; 15–17 + Tue 07–09 p4, p5; Tue 09–13 p6, p7; 13–17 p8, p9.
    // Cure ready = max(finish_i + 2 h, finish of every packet ≤ i) → p9: Tue 19:00, cure done Wed 19:00.
    const { res, at, packet } = run(
      small((s) => {
        const m = s.operations[0] as CrewOperation;
        m.crews = 2;
        m.rate.dist = { type: "fixed", value: 25 };
        s.operations[1] = { id: "cure", name: "Cure", kind: "wait", durationHours: { type: "fixed", value: 24 } };
        s.links = [{ from: "milling", to: "cure", lagHours: 2 }];
      }),
    );
    expect(packet("milling", 1).crew).toBe(1);
    expect(at(packet("milling", 5).finish)).toBe("2027-04-06T09:00");
    expect(at(packet("cure", 9).start)).toBe("2027-04-06T19:00");
    expect(at(res.finish)).toBe("2027-04-07T19:00");
  });

  it("a cold-morning temperature gate, mobilization and a distance lag", () => {
    // Fixed April weather: tmin 50 °F at 06:00, tmax 70 °F at 15:00, half-cosine between.
    // T(h) = 50 + 10(1 − cos(π(h−6)/9)) ≥ 60 ⇔ h ≥ 10.5; falling: 50 + 10(1 + cos(π(h−15)/15)) ≥ 60 ⇔ h ≤ 22.5.
    // A slot passes when both ends pass: within the 07–17 shift, slots 11–17 → 6 h of production a day.
    // Milling (50 ft/h, 20 h in all) mobilizes 3 h Mon 07–10 (not gated), loses slot 10–11, then
    // Mon 11–17 (6 h), Tue 6 h, Wed 6 h, Thu 11–13 → finish Thu 2027-04-08T13:00.
    // Sweep (100 ft/h, no gate) stays 250 ft behind: packet 0 (end 100 ft) needs milling packets starting
    // before 350 ft, i.e. 0–3; milling p3 runs Tue 11–13 → sweep p0 Tue 13:00–14:00. Sweep packets 6–9
    // (ends 700–1,000 ft) all need milling p9 (Thu 13:00) and run one hour each, 13–17 → finish Thu 17:00.
    const { res, at, packet } = run(
      small((s) => {
        const m = s.operations[0] as CrewOperation;
        m.mobilizationHours = 3;
        m.gates = { minTempF: 60 };
        s.operations[1] = {
          id: "sweep", name: "Sweep", kind: "crew", crews: 1, shifts: ["day"], closure: "one-lane",
          rate: { unit: "ftPerHour", dist: { type: "fixed", value: 100 } },
        };
        s.links = [{ from: "milling", to: "sweep", lagFt: 250 }];
      }),
    );
    expect(packet("milling", 0).mobilizedFrom).toBe(7);
    expect(at(packet("milling", 0).start)).toBe("2027-04-05T11:00");
    expect(at(packet("milling", 9).finish)).toBe("2027-04-08T13:00");
    expect(at(packet("sweep", 0).start)).toBe("2027-04-06T13:00");
    expect(at(packet("sweep", 6).start)).toBe("2027-04-08T13:00");
    expect(at(res.finish)).toBe("2027-04-08T17:00");
    // Three packets fit each day's six passing hours, so no packet is paused mid-way by the gate.
    expect(res.trace!.pauses.filter((p) => p.op === "milling" && p.reason === "weather")).toEqual([]);
    expect(at(packet("milling", 3).start)).toBe("2027-04-06T11:00");
  });

  it("a wet day stops a continuous pour and the no-rain-after gate; weather-lost shifts are counted", () => {
    // Overlay as in the first case, plus noRain and 3 h no rain after; Tue 2027-04-06 rains all day.
    // Milling as before (finish Tue 17:00, not gated). Overlay: p0–p3 Mon 09–17. Tuesday is lost to rain
    // (a candidate fits the 07–17 interval but fails the gate: one weather-lost shift). Monday's 15:00
    // pour of p3 finishes 17:00 and needs no rain 17:00–20:00 (dry Monday) → allowed.
    // Wed: p4–p8 07–17; Thu: p9 07–09 → finish Thu 2027-04-08T09:00.
    const { res, at } = run(
      small((s) => {
        (s.operations[1] as CrewOperation).gates = { minTempF: 45, noRain: true, noRainHoursAfter: 3 };
        s.weather.fixedWetDates = ["2027-04-06"];
      }),
    );
    expect(at(res.finish)).toBe("2027-04-08T09:00");
    expect(res.weatherLostShifts).toBe(1);
  });

  it("reports unfinished instead of looping when a gate never passes", () => {
    const { res } = run(
      small((s) => {
        (s.operations[0] as CrewOperation).gates = { minTempF: 110 };
      }),
    );
    expect(res.unfinished).toBe(true);
    expect(res.finish).toBe(Infinity);
  });
});
