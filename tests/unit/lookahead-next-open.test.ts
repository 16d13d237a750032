/**
 * Where a board of closed cells points: the plan's calendar's next open time after the board's week
 * (`nextOpenAfter`), worked by hand on the two-season demo (scenarios/kestrel-two-season.json):
 * start Mon 2027-04-05; work days Sunday–Friday; winter 15 Nov – 31 Mar; weather-gated operations are LMC
 * placement (day shift 07:00 + 10 h, day single-lane window 09:30–15:00 on weekdays) and restriping (night
 * shift 20:00 + 9 h, night two-lane window 21:00–05:00 on weekdays and Sundays). Dates checked against a
 * printed calendar (from memory: 5 Apr 2027 is a Monday, 31 Mar 2028 a Friday).
 */
import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { lookAhead, nextOpenAfter } from "../../sim/lookahead";
import { parseScenario } from "../../sim/validate";

function demo() {
  const r = parseScenario(JSON.parse(readFileSync(new URL("../../scenarios/kestrel-two-season.json", import.meta.url), "utf8")));
  if (!r.ok) throw new Error(JSON.stringify(r.problems));
  return r.scenario;
}

describe("the next open time after a week of closed cells", () => {
  it("in the winter before a plan starts, points to each operation's first window and names the start date", () => {
    const s = demo();
    const board = lookAhead(s, null, { today: "2026-12-02" });
    // The premise: every cell of the week is closed (winter), so the board has nothing else to say.
    expect(board.every((d) => d.shifts.every((sh) => sh.operations.every((o) => o.status === "closed")))).toBe(true);
    // Mon 5 Apr: placement opens at 09:30 under the day window; restriping not before 21:00 the same day.
    // Mon 5 Apr: placement opens at 09:30 under the day window; restriping at 21:00 under the night window.
    const placement = s.operations.find((o) => o.id === "placement")!.name;
    const restriping = s.operations.find((o) => o.id === "restriping")!.name;
    expect(nextOpenAfter(s, { today: "2026-12-02" })).toEqual({
      operations: [
        { operationId: "placement", operation: placement, start: "2027-04-05T09:30", weekday: "Monday" },
        { operationId: "restriping", operation: restriping, start: "2027-04-05T21:00", weekday: "Monday" },
      ],
      planStart: "2027-04-05",
    });
  });

  it("inside the season, the first open time after the seventh day (the board's own week is not repeated)", () => {
    // Board Mon 3 May – Sun 9 May 2027; the first instant after it is Mon 10 May 00:00, which falls inside
    // Sunday night's restriping window (Sun 9 May 21:00 – Mon 05:00): restriping may work from that instant.
    // Placement's next day window is Mon 10 May 09:30.
    const next = nextOpenAfter(demo(), { today: "2027-05-03" });
    expect(next?.planStart).toBeNull();
    expect(next?.operations.map((o) => [o.operationId, o.start, o.weekday])).toEqual([
      ["restriping", "2027-05-10T00:00", "Monday"],
      ["placement", "2027-05-10T09:30", "Monday"],
    ]);
  });

  it("across the second winter, the first instant after it (inside a night window) and the day window after it", () => {
    // Board 10–16 Nov 2027; the winter is [15 Nov 2027 00:00, 31 Mar 2028 00:00) (MODEL.md: winterEnd is the
    // first day back). Fri 31 Mar 00:00 lies inside Thursday night's restriping shift (Thu 21:00 – Fri 05:00),
    // but that shift began in the winter, so it is not worked (MODEL.md, condition 3): restriping's first
    // shift back is Friday night's; placement's day window opens at 09:30.
    const next = nextOpenAfter(demo(), { today: "2027-11-10" });
    expect(next?.operations.map((o) => [o.operationId, o.start, o.weekday])).toEqual([
      ["placement", "2028-03-31T09:30", "Friday"],
      ["restriping", "2028-03-31T21:00", "Friday"],
    ]);
  });

  it("is null when no weather-gated operation has open time left before the calendar's horizon", () => {
    expect(nextOpenAfter(demo(), { today: "2040-01-01" })).toBeNull();
  });
});
