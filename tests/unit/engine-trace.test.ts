/** The representative trace: every pause lies inside the packet it interrupts (a wait before a pour begins is not a pause). */
import { describe, expect, it } from "vitest";
import { readFileSync } from "node:fs";
import { parseScenario, runScenario } from "../../sim/index";

describe("trace pauses", () => {
  it.each(["kestrel-two-season.json", "kestrel-single-season.json", "kestrel-two-placement-crews.json"])("%s: every pause is inside its packet's start–finish", (file) => {
    const parsed = parseScenario(JSON.parse(readFileSync(new URL(`../../scenarios/${file}`, import.meta.url), "utf8")));
    if (!parsed.ok) throw new Error(JSON.stringify(parsed.problems));
    for (const seed of ["a", "b", "c"]) {
      const { trace } = runScenario(parsed.scenario, { iterations: 8, seed }).representative;
      const packets = new Map(trace.packets.map((t) => [`${t.op}|${t.packet}|${t.crew}`, t]));
      expect(trace.pauses.length).toBeGreaterThan(0);
      for (const p of trace.pauses) {
        const t = packets.get(`${p.op}|${p.packet}|${p.crew}`);
        expect(t, `pause of ${p.op} packet ${p.packet}`).toBeDefined();
        expect(p.start).toBeGreaterThanOrEqual(t!.start - 1e-9);
        expect(p.end).toBeLessThanOrEqual(t!.finish + 1e-9);
        expect(p.end).toBeGreaterThan(p.start);
      }
    }
  });
});
