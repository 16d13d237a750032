/**
 * The traffic model inside a run: a hand-worked small scenario, results unchanged without traffic, demand day
 * kinds, and the demo's holiday-weekend closure against the practitioners' plausibility range.
 */
import { describe, expect, it } from "vitest";
import { compileScenario, parseScenario, runScenario, type Scenario } from "../../sim/index";
import { parseIsoDate } from "../../sim/dates";
import { compileTraffic, newQueueDetail, queueDelay, DEMAND_KINDS } from "../../sim/traffic";
import { capacityOf } from "../../sim/traffic-capacity";
import type { ScenarioInput } from "../../sim/schema";
import { loadScenario, small } from "./engine-fixtures";

const flat = (v: number) => new Array(24).fill(v);

function parse(input: ScenarioInput): Scenario {
  const r = parseScenario(input);
  if (!r.ok) throw new Error(r.problems.map((p) => `${p.path}: ${p.message}`).join("; "));
  return r.scenario;
}

/** The small deterministic deck with 2,000 veh/h every hour in both of its lanes, no trucks. */
const withTraffic = (patch: (s: ScenarioInput) => void = () => {}) =>
  small((s) => {
    s.traffic = {
      directions: [{ id: "east", name: "Eastbound", lanes: ["L1", "L2"], heavyVehicleShare: 0, demand: { weekday: flat(2000), friday: flat(2000), saturday: flat(2000), sunday: flat(2000), holidayPeak: flat(2000) } }],
      closures: [{ closure: "one-lane", workIntensityPcPerHourPerLane: 0 }],
    };
    patch(s);
  });

describe("traffic in a run", () => {
  it("hand-worked: the small deck's closures (Mon 7–17, Tue 7–17, Wed 7–9) against 2,000 veh/h", () => {
    // Closure time is worked out in engine-handworked.test.ts (22 h: Mon and Tue 07:00–17:00, Wed 07:00–09:00).
    // Capacity (Krammes & Lopez, I = 0, no trucks): 1,600 veh/h in the one open lane; open road 2 × 2,000.
    // Mon: +400 veh/h for 10 h → 4,000 veh at 17:00, drains at 4,000 − 2,000 = 2,000 veh/h → clears 19:00;
    //      delay ½·4,000·10 + ½·4,000·2 = 24,000 veh-h. Tue the same. Wed: 800 veh at 09:00, clears 0.4 h later,
    //      ½·800·2.4 = 960 veh-h. Total 48,960 veh-h. Longest queue 4,000 veh / (190 pc/mi/ln · 2 lanes) = 10.53 mi.
    const s = runScenario(parse(withTraffic()), { iterations: 3, seed: "t" });
    expect(s.delay!.vehicleHours.p50).toBe(48960);
    expect(s.delay!.vehicleHours.p80).toBe(48960);
    const days = s.traffic!.days;
    expect(days.map((d) => [d.date, d.delayVehHours, d.peakQueueVeh, d.clearsAt])).toEqual([
      ["2027-04-05", 24000, 4000, "2027-04-05T19:00"],
      ["2027-04-06", 24000, 4000, "2027-04-06T19:00"],
      ["2027-04-07", 960, 800, "2027-04-07T09:24"],
    ]);
    expect(days[0].laneClosedHours).toEqual({ "one-lane": 10 }); // one lane × 10 h
    expect(s.traffic!.maxQueue).toEqual({ miles: 10.53, vehicles: 4000, date: "2027-04-05" });
    // Road-user cost with the default value of time (cars only): 48,960 veh-h × $21.15 = $1,035,504.
    expect(s.cost!.roadUser!.p50).toBe(1035504);
    expect(s.cost!.contract).toBeNull();
  });

  it("HCM 6th ed. method: the one open lane of two serves at the queue discharge rate", () => {
    // QDR for 2 → 1 lanes, day, cones, urban, 6 ft: 2,093 − 154·2 − 194 + 54 = 1,645 pc/h/ln (Eq. 10-8 with
    // LCSI = 2, SOURCES.md). Mon: +355 veh/h for 10 h → 3,550 veh, drains at 2,000 veh/h in 1.775 h:
    // ½·3,550·11.775 = 20,900.6 veh-h; Tue the same; Wed: 710 veh, ½·710·(2 + 0.355) = 836.0 veh-h.
    const s = runScenario(parse(withTraffic((x) => (x.traffic!.method = "hcm6"))), { iterations: 1, seed: "t" });
    const mon = 0.5 * 3550 * (10 + 3550 / 2000);
    const wed = 0.5 * 710 * (2 + 710 / 2000);
    expect(s.delay!.vehicleHours.p50).toBeCloseTo(2 * mon + wed, 1);
  });

  it("a capacity override replaces the method (e.g. a crossover)", () => {
    // 1,000 veh/h: Mon +1,000 veh/h for 10 h → 10,000 veh, drains at 2,000 veh/h → 5 h; ½·10,000·15 = 75,000.
    const s = runScenario(parse(withTraffic((x) => (x.traffic!.closures![0].capacityVehPerHour = 1000))), { iterations: 1, seed: "t" });
    const wed = 0.5 * 2000 * (2 + 1);
    expect(s.delay!.vehicleHours.p50).toBeCloseTo(2 * 75000 + wed, 6);
  });

  it("no traffic section: the summary is the same object as before, with no delay, cost or traffic keys", () => {
    const plain = runScenario(parse(small()), { iterations: 5, seed: "t" });
    expect("delay" in plain || "cost" in plain || "traffic" in plain).toBe(false);
    const traffic = runScenario(parse(withTraffic()), { iterations: 5, seed: "t" });
    const { delay, cost, traffic: detail, ...rest } = traffic;
    expect(delay && cost && detail).toBeTruthy();
    expect({ ...rest, scenarioName: plain.scenarioName }).toEqual(plain);
  });

  it("a closure that narrows no lane of a direction causes no delay", () => {
    const s = runScenario(parse(withTraffic((x) => (x.traffic!.directions[0].lanes = ["L2"]))), { iterations: 1, seed: "t" });
    expect(s.delay!.vehicleHours.p50).toBe(0);
    expect(s.traffic!.maxQueue).toBeNull();
  });

  it("rejects a closure that shuts every lane of a direction without an override, and unknown references", () => {
    const r = parseScenario(withTraffic((x) => {
      x.traffic!.directions[0].lanes = ["L1"];
      x.traffic!.closures!.push({ closure: "nope" });
    }));
    expect(r.ok).toBe(false);
    if (!r.ok) {
      expect(r.problems.map((p) => p.path)).toEqual(expect.arrayContaining(["traffic.directions[0].lanes", "traffic.closures[1].closure"]));
    }
  });

  it("demand day kinds: Fridays, weekends and the holiday-peak days around Memorial Day 2027", () => {
    const sc = parse(loadScenario("kestrel-two-season.json"));
    const c = compileScenario(sc);
    const t = compileTraffic(sc, c.calendar.startDay, c.calendar.days)!;
    const kind = (iso: string) => DEMAND_KINDS[t.dayKind[parseIsoDate(iso) - c.calendar.startDay]];
    expect(kind("2027-04-07")).toBe("weekday"); // Wednesday
    expect(kind("2027-04-09")).toBe("friday");
    expect(kind("2027-04-10")).toBe("saturday");
    expect(kind("2027-04-11")).toBe("sunday");
    // Memorial Day Mon 2027-05-31: block Sat 29 – Mon 31, plus the getaway day Fri 28; Tue 1 June is a weekday.
    expect(["2027-05-27", "2027-05-28", "2027-05-29", "2027-05-30", "2027-05-31", "2027-06-01"].map(kind)).toEqual(["weekday", "holidayPeak", "holidayPeak", "holidayPeak", "holidayPeak", "weekday"]);
  });

  it("the demo's day single-lane closure held all through a holiday-peak day backs traffic up five to ten miles", () => {
    // Common practice, no published source (SOURCES.md): for a long lane closure on a busy crossing over a
    // holiday weekend, practitioners warn of backups of five to ten miles. A sanity range, not a tuned value.
    const sc = parse(loadScenario("kestrel-holiday-work.json"));
    const c = compileScenario(sc);
    const t = compileTraffic(sc, c.calendar.startDay, c.calendar.days)!;
    const dir = t.directions[0];
    const d = parseIsoDate("2027-05-31") - c.calendar.startDay;
    const ci = c.closures.indexOf("day-1l");
    // The whole day window, 09:00–15:30, as the closure's only period.
    const pieces = { starts: Float64Array.of(24 * d + 9), ends: Float64Array.of(24 * d + 15.5), caps: Float64Array.of(capacityOf(t, dir, 1 << ci)), n: 1 };
    const detail = newQueueDetail(t.days);
    queueDelay(t, dir, pieces, detail);
    const miles = (detail.peakQueue[d] * dir.pcPerVeh) / (t.jamDensity * dir.storageLanes);
    expect(miles).toBeGreaterThanOrEqual(5);
    expect(miles).toBeLessThanOrEqual(10);
  });
});
