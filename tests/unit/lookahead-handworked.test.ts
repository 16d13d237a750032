/**
 * The look-ahead board on a forecast worked out by hand (MODEL.md "Weather" gates judged on hourly values).
 * Scenario: the small deterministic deck (start Mon 2027-04-05, work days Mon–Fri) with two shifts —
 * day 07:00 + 10 h under a weekday 07:00–17:00 window, night 20:00 + 9 h under a weekday 20:00–05:00 window —
 * night milling (gates: no rain, wind ≤ 20 mph) and day placement, continuous, 100 ft packets at a fixed
 * 50 ft/h = 2 h a pour (gates: ≥ 45 °F and rising, no rain, no rain 2 h after, wind ≤ 25 mph, evaporation
 * ≤ 0.2 lb/ft²/h, protection ≥ 35 °F for 12 h after). Board day: Wed 2027-04-07.
 */
import { describe, expect, it } from "vitest";
import { lookAhead, type HourlyForecast, type OperationCell } from "../../sim/lookahead";
import type { Scenario } from "../../sim/schema";
import { parseScenario } from "../../sim/validate";
import { small } from "./engine-fixtures";

function scenario(): Scenario {
  const input = small((s) => {
    s.calendar.shifts = [
      { id: "day", name: "Day shift", startHour: 7, lengthHours: 10 },
      { id: "night", name: "Night shift", startHour: 20, lengthHours: 9 },
    ];
    s.calendar.closures = [
      { id: "day-lane", name: "Day lane closure", lanesClosed: ["L1"] },
      { id: "night-lane", name: "Night lane closure", lanesClosed: ["L1"] },
    ];
    s.calendar.closureWindows = [
      { closure: "day-lane", dayTypes: ["weekday"], startHour: 7, endHour: 17 },
      { closure: "night-lane", dayTypes: ["weekday"], startHour: 20, endHour: 5 },
    ];
    s.operations = [
      { id: "milling", name: "Mechanical milling", kind: "crew", crews: 1, rate: { unit: "ftPerHour", dist: { type: "fixed", value: 50 } }, shifts: ["night"], closure: "night-lane", gates: { noRain: true, maxWindMph: 20 } },
      {
        id: "overlay", name: "Overlay placement", kind: "crew", crews: 1, rate: { unit: "ftPerHour", dist: { type: "fixed", value: 50 } }, shifts: ["day"], closure: "day-lane", continuous: true,
        gates: { minTempF: 45, rising: true, noRain: true, noRainHoursAfter: 2, maxWindMph: 25, maxEvaporation: 0.2, concreteDeltaF: 0 },
      },
    ];
  });
  const r = parseScenario(input);
  if (!r.ok) throw new Error(JSON.stringify(r.problems));
  // The protection gate is a MODEL.md "Weather" field the board reads from the operation's gates.
  const overlay = r.scenario.operations[1] as { gates: Record<string, unknown> };
  overlay.gates.protectAfter = { minTempF: 35, hours: 12 };
  return r.scenario;
}

// Hourly forecast from Wed 2027-04-07 00:00 for three days (72 hours); nothing after.
const WED = Array(24).fill(50);
const THU = [40, 39, 38, 37, 36, 36, 36, 40, 44, 46, 48, 50, 52, 53, 54, 54, 52, 49, 46, 43, 40, 37, 34, 32];
const FRI = Array(24).fill(30);
function forecast(): HourlyForecast {
  const tempF = [...WED, ...THU, ...FRI];
  const popPct = tempF.map(() => 10);
  popPct[22] = 55; // Wed 22:00: wet (≥ 50 %)
  popPct[24 + 14] = 60; // Thu 14:00: wet
  const windMph = tempF.map(() => 10);
  for (let h = 20; h < 24; h++) windMph[h] = 15;
  windMph[24] = 22; // Thu 00:00
  windMph[25] = 24; // Thu 01:00
  windMph[26] = 18;
  return { firstDate: "2027-04-07", tempF, popPct, rhPct: tempF.map(() => 50), windMph };
}

const board = () => lookAhead(scenario(), forecast(), { today: "2027-04-07" });
const cell = (date: string, shift: string, op: string): OperationCell => {
  const d = board().find((x) => x.date === date)!;
  return d.shifts.find((s) => s.shiftId === shift)!.operations.find((o) => o.operationId === op)!;
};

describe("look-ahead gates worked by hand", () => {
  it("a night milling shift: two gates fail in three hours, six hours can be worked", () => {
    // Wed night shift 20:00–05:00 Thu; window 20:00–05:00 → open 9 h, slots 20:00 … 04:00.
    // noRain: Wed 22:00 has PoP 55 % ≥ 50 % → wet → fails. Wind: Thu 00:00 22 mph and 01:00 24 mph > 20 → fail;
    // 02:00 18 mph and every other hour ≤ 20 pass. So 9 − 3 = 6 h workable: partial.
    const c = cell("2027-04-07", "night", "milling");
    expect(c.status).toBe("partial");
    expect(c.mayWork).toBe(true);
    expect(c.openHours).toBe(9);
    expect(c.workableHours).toBe(6);
    expect(c.closure).toMatchObject({ id: "night-lane", open: true, windows: [{ from: "2027-04-07T20:00", to: "2027-04-08T05:00" }] });
    expect(c.failing).toEqual([
      { gate: "noRain", label: "No rain", at: ["2027-04-07T22:00"] },
      { gate: "maxWind", label: "Wind", at: ["2027-04-08T00:00", "2027-04-08T01:00"] },
    ]);
    expect(c.hours.map((h) => h.ok)).toEqual([true, true, false, true, false, false, true, true, true]);
    expect(c.hours[4].problems).toEqual([{ gate: "maxWind", ok: false, detail: "22 mph against a limit of 20 mph" }]);
  });

  it("a placement shift blocked by a cold night: every start fails, the warm ones on protection", () => {
    // Thu day shift 07:00–17:00, 2 h pours → candidate starts 07:00 … 15:00 (16:00 + 2 h > 17:00).
    // minTemp 45 on the pour's slots: slot 07 (40→44) and 08 (44→46) fail → starts 07, 08 fail.
    // rising on the first slot: only 15:00 (54 → 52) falls.
    // noRain: slot 14:00 is wet → starts 13 and 14 fail. noRainAfter 2 h: slots f, f+1 → f = 13, 14 (starts 11, 12) meet 14:00.
    // Protection ≥ 35 °F for 12 h after f: slot 21:00 (37→34) is the first to fail, then every slot after;
    // start 07 (f = 09) reaches slots 09–20 and passes, every later start reaches 21:00 or beyond.
    // Start 09:00 is the best start: only the protection fails, at 21:00 and 22:00 (f = 11 → slots 11–22).
    // Wind 10 mph ≤ 25; evaporation at 54 °F, RH 50 %, 10 mph ≈ 0.05 lb/ft²/h ≤ 0.2: never fail.
    const c = cell("2027-04-08", "day", "overlay");
    expect(c.pourHours).toBe(2);
    expect(c.pourStarts.map((p) => p.start.slice(11))).toEqual(["07:00", "08:00", "09:00", "10:00", "11:00", "12:00", "13:00", "14:00", "15:00"]);
    expect(c.pourStarts.every((p) => p.ok === false)).toBe(true);
    expect(c.status).toBe("no");
    expect(c.mayWork).toBe(false);
    const at = (gate: string) => c.failing.find((f) => f.gate === gate)?.at.map((t) => t.slice(5));
    expect(at("minTemp")).toEqual(["04-08T07:00", "04-08T08:00"]);
    expect(at("rising")).toEqual(["04-08T15:00"]);
    expect(at("noRain")).toEqual(["04-08T14:00"]);
    expect(at("noRainAfter")).toEqual(["04-08T14:00"]);
    expect(at("protectAfter")).toEqual(["04-08T21:00", "04-08T22:00", "04-08T23:00", "04-09T00:00", "04-09T01:00", "04-09T02:00", "04-09T03:00", "04-09T04:00"]);
    expect(at("maxWind")).toBeUndefined();
    expect(at("maxEvaporation")).toBeUndefined();
    const nine = c.pourStarts[2];
    expect(nine.problems.map((p) => [p.gate, p.at.slice(11)])).toEqual([
      ["protectAfter", "21:00"],
      ["protectAfter", "22:00"],
    ]);
    expect(nine.problems[1].detail).toBe("32 °F against 35 °F needed for 12 h after the pour");
    // Hour by hour over the open slots 07–16 (per-slot gates, rising only for the first slot of a pour).
    expect(c.hours.map((h) => h.ok)).toEqual([false, false, true, true, true, true, true, false, true, true]);
  });

  it("a shift on a day off, and hours the forecast does not reach", () => {
    const days = board();
    expect(days.map((d) => d.date)).toEqual(["2027-04-07", "2027-04-08", "2027-04-09", "2027-04-10", "2027-04-11", "2027-04-12", "2027-04-13"]);
    // Saturday: not a work day; the closure window (weekdays only) is not open either.
    const sat = cell("2027-04-10", "day", "overlay");
    expect(sat.status).toBe("closed");
    expect(sat.closedReason).toBe("Not a work day.");
    expect(sat.closure?.open).toBe(false);
    // Friday's day shift is 30 °F all day: every pour fails the minimum temperature whatever else is missing.
    expect(cell("2027-04-09", "day", "overlay").status).toBe("no");
    // Monday is past the forecast: nothing can be judged.
    const mon = cell("2027-04-12", "day", "overlay");
    expect(mon.status).toBe("unknown");
    expect(mon.mayWork).toBeNull();
    expect(mon.pourStarts[0].problems[0].detail).toBe("no temperature forecast");
  });

  it("without any forecast every open cell is unknown, closed ones stay closed", () => {
    const days = lookAhead(scenario(), null, { today: "2027-04-07" });
    const statuses = new Set(days.flatMap((d) => d.shifts.flatMap((s) => s.operations.map((o) => o.status))));
    expect([...statuses].sort()).toEqual(["closed", "unknown"]);
  });

  it("a plan that starts later is read as if the crews were out today", () => {
    const s = scenario();
    s.startDate = "2027-05-03";
    expect(lookAhead(s, forecast(), { today: "2027-04-07" })[1].shifts.find((x) => x.shiftId === "day")!.operations[0].status).toBe("no");
  });
});

describe("the other per-slot gates on one hour, by hand", () => {
  it("maximum temperature at both ends of the slot, and the evaporation of a hot, dry, windy hour", async () => {
    const { HourlyGates } = await import("../../sim/lookahead-gates");
    // Slot [k, k+1) with T(k) = 90 °F, T(k+1) = 96 °F, RH 15 %, wind 22 mph.
    const g = new HourlyGates({ tempF: [90, 96], popPct: [0, 0], rhPct: [15, 15], windMph: [22, 22] });
    const v = g.slot({ maxTempF: 95, maxEvaporation: 0.2, concreteDeltaF: 0 }, 0, false);
    // maxTemp 95: T(k+1) = 96 > 95 fails although T(k) = 90 holds.
    expect(v[0]).toEqual({ gate: "maxTemp", ok: false, detail: "96 °F against a maximum of 95 °F" });
    // Uno (1998), concrete = air = 90 °F = 32.22 °C, r = 0.15, V = 22 mph = 35.41 km/h:
    // 5·[(50.22)^2.5 − 0.15·(50.22)^2.5]·(35.41 + 4)·10⁻⁶ = 5·0.85·17 873·39.41·10⁻⁶ ≈ 2.994 kg/m²/h ≈ 0.613 lb/ft²/h.
    expect(v[1].gate).toBe("maxEvaporation");
    expect(v[1].ok).toBe(false);
    expect(v[1].detail).toBe("0.61 lb/ft²/h against a limit of 0.2");
    expect(g.evaporation(0, 0)).toBeCloseTo(0.613, 2);
  });
});
