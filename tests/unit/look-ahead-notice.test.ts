/** The daily look-ahead e-mail's words: the board as lines, and what changed since the last notice. */
import { describe, expect, it } from "vitest";
import { boardLines, changesSince, compactBoard, hourRanges } from "../../src/lib/look-ahead-notice";
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
      "Thursday 2027-04-08",
      "  ✗ Day shift — Overlay placement: blocked (minimum temperature from 07:00)",
      "Friday 2027-04-09",
      "  ✓ Day shift — Overlay placement: may work",
      "Saturday 2027-04-10",
      "  – Day shift — Overlay placement: closed (Not a work day.)",
    ]);
  });

  it("lists only the cells whose status changed, and nothing for a first notice or a new day", () => {
    const yesterday = compactBoard([day("2027-04-07", "Wednesday", cell("go")), day("2027-04-08", "Thursday", cell("go")), day("2027-04-09", "Friday", cell("go"))]);
    expect(changesSince(yesterday, today)).toEqual(["Thu 2027-04-08, Day shift, Overlay placement: may work → blocked"]);
    expect(changesSince(null, today)).toEqual([]);
    expect(changesSince(compactBoard(today), today)).toEqual([]);
  });
});

describe("hour ranges", () => {
  it("joins consecutive slots into runs that end with their last slot, naming the date when a run crosses midnight", () => {
    expect(hourRanges(["2027-04-08T07:00", "2027-04-08T08:00", "2027-04-08T14:00"])).toBe("04-08 07:00–09:00, 04-08 14:00–15:00");
    expect(hourRanges(["2027-04-08T22:00", "2027-04-08T23:00", "2027-04-09T00:00"])).toBe("04-08 22:00–04-09 01:00");
    expect(hourRanges(["2027-04-08T23:00"])).toBe("04-08 23:00–04-09 00:00");
  });
});
