/** Where a new field-log entry starts (src/app/(app)/scenarios/[scenarioId]/progress/entry-defaults.ts). */
import { describe, expect, it } from "vitest";
import { continuationOf, lastRecorded } from "../../src/app/(app)/scenarios/[scenarioId]/progress/entry-defaults";

const deck = { from: 1200, to: 9600 };
const startHour = (s: string) => ({ day: 7, night: 20, mid: 9.5 })[s] ?? 0;

describe("a new field-log entry", () => {
  it("continues an operation on its own shift from where its last shift stopped", () => {
    const hydro = { id: "hydro", name: "Hydrodemolition", shifts: ["night"], lastToFt: 4366 };
    expect(continuationOf(hydro, deck, ["day", "night"])).toEqual({ shift: "night", fromStationFt: 4366, toStationFt: 4466 });
    // The current shift stays when the operation works it.
    expect(continuationOf({ ...hydro, shifts: ["day", "night"] }, deck, ["day", "night"], "night").shift).toBe("night");
    // A shift the operation does not work is replaced by its first.
    expect(continuationOf(hydro, deck, ["day", "night"], "day").shift).toBe("night");
  });

  it("starts at the deck's beginning with nothing recorded or at the deck's end, and never runs past the end", () => {
    const op = { id: "mill", name: "Milling", shifts: ["night"], lastToFt: null };
    expect(continuationOf(op, deck, ["day"])).toEqual({ shift: "night", fromStationFt: 1200, toStationFt: 1300 });
    expect(continuationOf({ ...op, lastToFt: 9600 }, deck, ["day"]).fromStationFt).toBe(1200);
    expect(continuationOf({ ...op, lastToFt: 9550 }, deck, ["day"])).toMatchObject({ fromStationFt: 9550, toStationFt: 9600 });
    expect(continuationOf({ ...op, shifts: [] }, deck, ["day"]).shift).toBe("day");
  });

  it("reads the latest shift by date, then by the shift's start hour (not its name)", () => {
    const r = lastRecorded(
      [
        { operationId: "hydro", workDate: "2026-10-27", shift: "night", toStationFt: 4357 },
        { operationId: "hydro", workDate: "2026-10-28", shift: "night", toStationFt: 4366 },
        { operationId: "placement", workDate: "2026-10-28", shift: "mid", toStationFt: 4300 },
        { operationId: "placement", workDate: "2026-10-28", shift: "day", toStationFt: 4200 },
        { operationId: "placement", workDate: "2026-10-20", shift: "day", toStationFt: 4500 },
      ],
      startHour,
    );
    expect(r.lastToFt.get("hydro")).toBe(4366);
    // 09:30 starts after 07:00 (a text sort would put "9.5" after "20").
    expect(r.lastToFt.get("placement")).toBe(4300);
    expect(r.lastOperationId).toBe("hydro");
    expect(lastRecorded([], startHour)).toEqual({ lastToFt: new Map(), lastOperationId: null });
  });
});
