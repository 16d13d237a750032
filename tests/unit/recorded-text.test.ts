import { describe, expect, it } from "vitest";
import { recordedText } from "@/app/(app)/scenarios/[scenarioId]/progress/recorded-text";

const facts = { shifts: [{ id: "day", name: "Day shift" }], operations: [{ id: "milling", name: "Mechanical milling" }] };

describe("the field log's confirmation of a recorded shift", () => {
  it("names the operation, the shift, the day in words and the stations", () => {
    expect(recordedText({ workDate: "2026-12-03", shift: "day", operationId: "milling", fromStationFt: 1200, toStationFt: 1350 }, facts)).toBe(
      "Recorded Mechanical milling, Day shift of Thu 3 Dec 2026, STA 12+00 to STA 13+50.",
    );
  });

  it("reads stations still held as typed text, and falls back to ids the plan no longer names", () => {
    expect(recordedText({ workDate: "2026-12-03", shift: "night", operationId: "gone", fromStationFt: "0", toStationFt: "500" }, facts)).toBe(
      "Recorded gone, night of Thu 3 Dec 2026, STA 0+00 to STA 5+00.",
    );
  });
});
