/**
 * The cached, short-cut gate evaluation (day bounds, rain bit masks, evaporation memo) must agree slot by
 * slot with the plain rule of MODEL.md evaluated directly from the weather helpers.
 */
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { evaporationLbFt2h } from "../../sim/evaporation";
import { GateCache, type GateProfile } from "../../sim/gates";
import { createRng } from "../../sim/random";
import { parseScenario } from "../../sim/validate";
import { createWeatherSeries, hourlyTempF, isRainHour } from "../../sim/weather";
import { loadScenario } from "./engine-fixtures";

const parsed = parseScenario(loadScenario("kestrel-two-season.json"));
if (!parsed.ok) throw new Error("demo scenario invalid");
const weather = parsed.scenario.weather;

// MODEL.md "Weather", written out again here: Magnus e_s (Alduchov & Eskridge 1996), RH from the day's dew
// point, wind with a 30 % diurnal swing peaking at 15:00.
const es = (f: number) => {
  const c = ((f - 32) * 5) / 9;
  return 6.1094 * Math.exp((17.625 * c) / (c + 243.04));
};

function plain(p: GateProfile, series: ReturnType<typeof createWeatherSeries>, k: number): boolean {
  const d = Math.floor(k / 24);
  series.ensure(d + 2);
  const t0 = hourlyTempF(series, k);
  const t1 = hourlyTempF(series, k + 1);
  const wind = series.windMph[d] * (1 + 0.3 * Math.cos((2 * Math.PI * ((k % 24) - 15)) / 24));
  if (p.risingEverySlot && t1 < t0) return false;
  if (wind > p.maxWindMph) return false;
  if (p.noRain && isRainHour(series, k)) return false;
  if (t0 < p.minTempF || t1 < p.minTempF || t0 > p.maxTempF || t1 > p.maxTempF) return false;
  const rh = Math.min(100, (series.rhPct[d] * es((series.tmaxF[d] + series.tminF[d]) / 2)) / es(t0));
  if (p.maxEvaporation !== Infinity && evaporationLbFt2h(t0 + p.concreteDeltaF, t0, rh, wind) > p.maxEvaporation) return false;
  return true;
}

const profileArb = fc.record({
  minTempF: fc.constantFrom(-Infinity, 40, 45, 55, 70),
  maxTempF: fc.constantFrom(Infinity, 75, 85, 95),
  noRain: fc.boolean(),
  maxWindMph: fc.constantFrom(Infinity, 8, 12, 20),
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
            expect(cache.rising(k)).toBe(hourlyTempF(reference, k + 1) >= hourlyTempF(reference, k));
            for (const c of [32, 45, 60]) {
              const warm = hourlyTempF(reference, k) >= c && hourlyTempF(reference, k + 1) >= c;
              expect(cache.warmSlot(c, k), `warm ${c} slot ${k}`).toBe(warm);
            }
          }
        }
      }),
      { numRuns: 40, seed: 11 },
    );
  });
});
