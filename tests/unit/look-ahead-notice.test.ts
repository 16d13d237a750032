/** The daily look-ahead e-mail's words: the board as lines, and what changed since the last notice. */
import { describe, expect, it } from "vitest";
import { allClosedSentence, boardLines, changesSince, compactBoard, hourRanges } from "../../src/lib/look-ahead-notice";
import type { LookAheadDay, OperationCell } from "../../sim/lookahead";

const cell = (status: OperationCell["status"], extra: Partial<OperationCell> = {}): OperationCell => ({
  operationId: "overlay", name: "Overlay placement", status, mayWork: status === "go", closedReason: null, closure: null,
  openHours: 10, workableHours: 0, failing: [], hours: [], pourStarts: [], pourHours: 2, ...extra,
});
const day = (date: string, weekday: string, c: OperationCell): LookAheadDay => ({
  date, weekday, shifts: [{ shiftId: "day", name: "Day shift", start: `${date}T07:00`, end: `${date}T17:00`, operations: [c] }],
});

describe("look-ahead notice", () => {
  const today = [
    day("2027-04-08", "Thursday", cell("no", { failing: [{ gate: "minTemp", label: "Minimum temperature", at: ["2027-04-08T07:00", "2027-04-08T08:00"] }] })),
    day("2027-04-09", "Friday", cell("go")),
    day("2027-04-10", "Saturday", cell("closed", { closedReason: "Not a work day." })),
  ];

  it("writes each cell with its mark, its word and why", () => {
    expect(boardLines(today)).toEqual([
      "Thursday 8 Apr 2027",
      "  ✗ Day shift — Overlay placement: blocked (minimum temperature from 07:00)",
      "Friday 9 Apr 2027",
      "  ✓ Day shift — Overlay placement: may work",
      "Saturday 10 Apr 2027",
      "  – Day shift — Overlay placement: closed (Not a work day.)",
    ]);
  });

  it("lists only the cells whose status changed, and nothing for a first notice or a new day", () => {
    const yesterday = compactBoard([day("2027-04-07", "Wednesday", cell("go")), day("2027-04-08", "Thursday", cell("go")), day("2027-04-09", "Friday", cell("go"))]);
    expect(changesSince(yesterday, today)).toEqual(["Thu 8 Apr 2027, Day shift, Overlay placement: may work → blocked"]);
    expect(changesSince(null, today)).toEqual([]);
    expect(changesSince(compactBoard(today), today)).toEqual([]);
  });
});

describe("hour ranges", () => {
  it("joins consecutive slots into runs that end with their last slot, naming the date when a run crosses midnight", () => {
    expect(hourRanges(["2027-04-08T07:00", "2027-04-08T08:00", "2027-04-08T14:00"])).toBe("8 Apr 07:00–09:00, 8 Apr 14:00–15:00");
    expect(hourRanges(["2027-04-08T22:00", "2027-04-08T23:00", "2027-04-09T00:00"])).toBe("8 Apr 22:00–9 Apr 01:00");
    expect(hourRanges(["2027-04-08T23:00"])).toBe("8 Apr 23:00–9 Apr 00:00");
  });

  describe("a week with every cell closed", () => {
    const winter = [
      day("2026-12-04", "Friday", cell("closed", { closedReason: "Winter shutdown." })),
      day("2026-12-05", "Saturday", cell("closed", { closedReason: "Not a work day." })),
      day("2026-12-06", "Sunday", cell("closed", { closedReason: "Winter shutdown." })),
    ];
    const next = {
      operations: [
        { operationId: "overlay", operation: "Overlay placement", start: "2027-04-05T09:30", weekday: "Monday" },
        { operationId: "milling", operation: "Milling", start: "2027-04-05T21:00", weekday: "Monday" },
      ],
      planStart: "2027-04-05",
    };

    it("says why once per reason, when the plan starts and when its calendar next opens for each operation", () => {
      expect(allClosedSentence(winter, next)).toBe(
        "No shift on this board can work this week (winter shutdown; not a work day). The plan starts on 5 Apr 2027. " +
          "Its calendar next opens on Monday 5 Apr 2027: Overlay placement from 09:30; Milling from 21:00 — weather permitting: the board judges each day once it is within the forecast's week.",
      );
      expect(allClosedSentence(winter, { ...next, planStart: null })).not.toContain("The plan starts");
      expect(allClosedSentence(winter, null)).toBe("No shift on this board can work this week (winter shutdown; not a work day). The plan's calendar has no open time left for a weather-gated operation.");
    });

    it("names each operation's day when they differ", () => {
      const apart = { planStart: null, operations: [next.operations[0], { ...next.operations[1], start: "2027-04-06T21:00", weekday: "Tuesday" }] };
      expect(allClosedSentence(winter, apart)).toContain("next opens for Overlay placement on Monday 5 Apr 2027 at 09:30; Milling on Tuesday 6 Apr 2027 at 21:00 — weather permitting");
    });

    it("says nothing when some cell is not closed, or when the board has no cell", () => {
      expect(allClosedSentence([...winter, day("2026-12-07", "Monday", cell("no"))], next)).toBeNull();
      expect(allClosedSentence([], next)).toBeNull();
    });
  });
});
