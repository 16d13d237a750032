/**
 * The cached, short-cut gate evaluation (day bounds, rain bit masks, evaporation memo) must agree slot by
 * slot with the plain rule of MODEL.md evaluated directly from the weather helpers.
 */
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { evaporationLbFt2h } from "../../sim/evaporation";
import { GateCache, isRisingSlot, type GateProfile } from "../../sim/gates";
import { createRng } from "../../sim/random";
import { parseScenario } from "../../sim/validate";
import { createWeatherSeries, hourlyTempF, isRainHour } from "../../sim/weather";
import { loadScenario } from "./engine-fixtures";

const parsed = parseScenario(loadScenario("kestrel-two-season.json"));
if (!parsed.ok) throw new Error("demo scenario invalid");
const weather = parsed.scenario.weather;

function plain(p: GateProfile, series: ReturnType<typeof createWeatherSeries>, k: number): boolean {
  const d = Math.floor(k / 24);
  series.ensure(d + 2);
  if (p.risingEverySlot && !isRisingSlot(k)) return false;
  if (series.windMph[d] > p.maxWindMph) return false;
  if (p.noRain && isRainHour(series, k)) return false;
  if (hourlyTempF(series, k) < p.minTempF || hourlyTempF(series, k + 1) < p.minTempF) return false;
  const air = hourlyTempF(series, k);
  if (p.maxEvaporation !== Infinity && evaporationLbFt2h(air + p.concreteDeltaF, air, series.rhPct[d], series.windMph[d]) > p.maxEvaporation) return false;
  return true;
}

const profileArb = fc.record({
  minTempF: fc.constantFrom(-Infinity, 40, 45, 55, 70),
  noRain: fc.boolean(),
  maxWindMph: fc.constantFrom(Infinity, 12, 20),
  maxEvaporation: fc.constantFrom(Infinity, 0.05, 0.1, 0.2),
  concreteDeltaF: fc.constantFrom(0, 3, 10, -5),
  risingEverySlot: fc.boolean(),
});

describe("GateCache", () => {
  it("agrees with the plain per-slot rule in any order of asking", () => {
    fc.assert(
      fc.property(fc.array(profileArb, { minLength: 1, maxLength: 3 }), fc.integer({ min: 0, max: 99 }), fc.array(fc.integer({ min: 0, max: 24 * 400 - 1 }), { minLength: 50, maxLength: 400 }), (profiles, seed, slots) => {
        const cache = new GateCache(profiles, 400);
        for (let round = 0; round < 2; round++) {
          const series = createWeatherSeries(weather, 20_000, createRng(`g${seed}:${round}`));
          const reference = createWeatherSeries(weather, 20_000, createRng(`g${seed}:${round}`));
          cache.reset(series);
          for (const k of slots) {
            profiles.forEach((p, i) => expect(cache.slotOk(i, k), `profile ${i} slot ${k}`).toBe(plain(p, reference, k)));
            expect(cache.rainAt(k)).toBe(isRainHour(reference, k));
          }
        }
      }),
      { numRuns: 40, seed: 11 },
    );
  });
});
