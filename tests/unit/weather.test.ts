import { describe, expect, it } from "vitest";
import fc from "fast-check";
import {
  createWeatherSeries,
  hourlyTempF,
  isRainHour,
  stationaryWetProbability,
  type WeatherSeries,
} from "../../sim/weather";
import { createRng, type Rng } from "../../sim/random";
import { daysFromCivil, parseIsoDate } from "../../sim/dates";
import { weatherSchema, type MonthClimate, type Weather } from "../../sim/schema";

const month = (over: Partial<MonthClimate> = {}): MonthClimate => ({
  tmaxMeanF: 85,
  tmaxSdF: 6,
  tminMeanF: 55,
  tminSdF: 5,
  pWetAfterDry: 0.2,
  pWetAfterWet: 0.6,
  windMeanMph: 8,
  rhMean: 60,
  ...over,
});
const weather = (over: Partial<Weather> & { monthly?: MonthClimate[] } = {}): Weather =>
  weatherSchema.parse({ mode: "stochastic", monthly: Array.from({ length: 12 }, () => month()), ...over });

const DAY0 = daysFromCivil(2001, 1, 1);
const YEARS = 200;
const N = daysFromCivil(2001 + YEARS, 1, 1) - DAY0; // 73,049 days

function generate(w: Weather, seed: string, days = N): WeatherSeries {
  const s = createWeatherSeries(w, DAY0, createRng(seed));
  s.ensure(days);
  return s;
}
const meanOf = (xs: number[]) => xs.reduce((a, b) => a + b, 0) / xs.length;
const sdOf = (xs: number[]) => {
  const m = meanOf(xs);
  return Math.sqrt(xs.reduce((a, b) => a + (b - m) ** 2, 0) / (xs.length - 1));
};
function spells(s: WeatherSeries, wet: 0 | 1): number[] {
  const out: number[] = [];
  let run = 0;
  for (let i = 0; i < s.length; i++) {
    if (s.wet[i] === wet) run++;
    else if (run > 0) (out.push(run), (run = 0));
  }
  return out;
}
function lag1(xs: number[]): number {
  const m = meanOf(xs);
  let num = 0;
  let den = 0;
  for (let i = 0; i < xs.length; i++) {
    den += (xs[i] - m) ** 2;
    if (i > 0) num += (xs[i] - m) * (xs[i - 1] - m);
  }
  return num / den;
}

describe("stationary wet-day probability", () => {
  it("P(W|D) 0.2, P(W|W) 0.6 → 1/3", () => {
    // Source: CLIGEN documentation (Nicks, Lane & Gander 1995): π = P(W|D)/(1 − P(W|W) + P(W|D)).
    expect(stationaryWetProbability(0.2, 0.6)).toBeCloseTo(1 / 3, 12);
    expect(stationaryWetProbability(0.3, 0.3)).toBeCloseTo(0.3, 12); // independent days: π = p
    expect(stationaryWetProbability(0, 1)).toBe(0);
  });
});

describe("stochastic generator, 200 years of one month's parameters held constant", () => {
  // 73,049 days, P(W|D) 0.2, P(W|W) 0.6, ρ 0.6, tmax 85 ± 6, tmin 55 ± 5, wet shifts −4 / +1 °F.
  // Tolerances are 4 standard errors; for serially correlated quantities the SE is inflated by the
  // AR(1) variance factor (1 + r)/(1 − r) (r = 0.4 for the wet indicator, 0.6 for temperatures).
  const w = weather({ serialCorrelation: 0.6, wetTmaxShiftF: -4, wetTminShiftF: 1, rainHoursMean: 6 });
  const s = generate(w, "constant-200y");
  const wetIdx: number[] = [];
  const dryIdx: number[] = [];
  for (let i = 0; i < s.length; i++) (s.wet[i] ? wetIdx : dryIdx).push(i);

  it("wet-day frequency is the stationary probability 1/3", () => {
    // Source: CLIGEN documentation (π formula); SOURCES.md computed π = 1/3, lag-1 autocorrelation 0.4.
    // SE = √(π(1−π)/n · 1.4/0.6) = 0.0027.
    const se = Math.sqrt(((1 / 3) * (2 / 3) * (1.4 / 0.6)) / N);
    expect(Math.abs(wetIdx.length / N - 1 / 3)).toBeLessThan(4 * se);
  });

  it("mean wet spell 1/(1 − P(W|W)) = 2.5 d, mean dry spell 1/P(W|D) = 5 d", () => {
    // Source: SOURCES.md, "Stochastic daily weather" (computed from the Markov chain). Spell lengths are
    // geometric: sd √0.6/0.4 = 1.94 d (wet), √0.8/0.2 = 4.47 d (dry); SE = sd/√(number of spells).
    const wetSpells = spells(s, 1);
    const drySpells = spells(s, 0);
    expect(Math.abs(meanOf(wetSpells) - 2.5)).toBeLessThan((4 * 1.94) / Math.sqrt(wetSpells.length));
    expect(Math.abs(meanOf(drySpells) - 5)).toBeLessThan((4 * 4.47) / Math.sqrt(drySpells.length));
    expect(wetSpells.length).toBeGreaterThan(9000); // n·π·(1 − P(W|W)) ≈ 9,740 spells
  });

  it("tmax and tmin: dry-day means, wet-day shifts and standard deviations", () => {
    // Source: the WGEN model as specified in MODEL.md (Richardson 1981). SE(mean) = sd·√(1.6/0.4)/√n;
    // SE(sd) = sd·√((1 + ρ²)/(1 − ρ²)/(2n)) for an AR(1) normal series.
    const cases: Array<[Float64Array, number, number, number]> = [
      [s.tmaxF, 85, -4, 6],
      [s.tminF, 55, 1, 5],
    ];
    for (const [arr, mean, shift, sd] of cases) {
      for (const [idx, expected] of [
        [dryIdx, mean],
        [wetIdx, mean + shift],
      ] as Array<[number[], number]>) {
        const xs = idx.map((i) => arr[i]);
        const n = xs.length;
        expect(Math.abs(meanOf(xs) - expected)).toBeLessThan(4 * sd * Math.sqrt(4 / n));
        expect(Math.abs(sdOf(xs) - sd)).toBeLessThan(4 * sd * Math.sqrt(1.36 / 0.64 / (2 * n)));
      }
    }
  });

  it("standardized residuals have lag-1 correlation ρ = 0.6", () => {
    // Source: Richardson (1981) lag-1 residual model; SE of an AR(1) lag-1 estimate ≈ √((1 − ρ²)/n) = 0.003.
    const wet = (i: number) => s.wet[i] === 1;
    const rMax = Array.from({ length: N }, (_, i) => (s.tmaxF[i] - 85 - (wet(i) ? -4 : 0)) / 6);
    const rMin = Array.from({ length: N }, (_, i) => (s.tminF[i] - 55 - (wet(i) ? 1 : 0)) / 5);
    const se = Math.sqrt((1 - 0.36) / N);
    expect(Math.abs(lag1(rMax) - 0.6)).toBeLessThan(4 * se);
    expect(Math.abs(lag1(rMin) - 0.6)).toBeLessThan(4 * se);
  });

  it("wind is gamma with mean windMeanMph; humidity rhMean, +10 on wet days", () => {
    // Gamma shape 4: sd = mean/2 = 4 mph; SE = 4/√n = 0.015.
    const wind = Array.from(s.windMph.subarray(0, N));
    expect(Math.abs(meanOf(wind) - 8)).toBeLessThan((4 * 4) / Math.sqrt(N));
    expect(Math.abs(sdOf(wind) - 4)).toBeLessThan(0.1);
    for (const i of dryIdx) expect(s.rhPct[i]).toBe(60);
    for (const i of wetIdx) expect(s.rhPct[i]).toBe(70);
  });

  it("rain: 1–24 h per wet day with mean rainHoursMean, starting at a uniform hour 0–23", () => {
    // Truncated geometric tuned to mean 6 h: sd below 6, SE < 6/√n_wet. Uniform start: mean 11.5,
    // sd √((24² − 1)/12) = 6.92; each of 24 hours has p = 1/24 (SE √(p(1−p)/n_wet)).
    const hours = wetIdx.map((i) => s.rainHours[i]);
    const startsAt = new Array(24).fill(0);
    for (const i of wetIdx) startsAt[s.rainStartHour[i]]++;
    expect(Math.min(...hours)).toBeGreaterThanOrEqual(1);
    expect(Math.max(...hours)).toBeLessThanOrEqual(24);
    expect(Math.abs(meanOf(hours) - 6)).toBeLessThan((4 * 6) / Math.sqrt(hours.length));
    const pSe = Math.sqrt(((1 / 24) * (23 / 24)) / wetIdx.length);
    for (const c of startsAt) expect(Math.abs(c / wetIdx.length - 1 / 24)).toBeLessThan(4.5 * pSe);
    for (const i of dryIdx) expect(s.rainHours[i]).toBe(0);
  });
});

describe("stochastic generator, twelve different months", () => {
  // A seasonal invented climate: wetter, cooler winters. 200 years, ≈ 6,100 days per month.
  const monthly = Array.from({ length: 12 }, (_, m) => {
    const c = Math.cos((2 * Math.PI * (m - 6.5)) / 12); // +1 in July, −1 in January
    return month({
      tmaxMeanF: 60 + 25 * c,
      tmaxSdF: 8 - 2 * c,
      tminMeanF: 38 + 22 * c,
      tminSdF: 7 - 2 * c,
      pWetAfterDry: 0.25 - 0.1 * c,
      pWetAfterWet: 0.5 - 0.1 * c,
    });
  });
  const w = weather({ monthly, serialCorrelation: 0.5 });
  const s = generate(w, "seasonal-200y");

  it("each month's wet-day frequency, dry-day tmax mean and sd follow its own parameters", () => {
    // Source: CLIGEN π formula; month m's chain enters from the previous month's state, a bias of at most
    // |Δπ|/(30(1 − r)) < 0.01 here, added to 4 SE (SE with the (1 + r)/(1 − r) inflation).
    const byMonth = Array.from({ length: 12 }, () => ({ days: 0, wet: 0, dryTmax: [] as number[] }));
    let y = 2001;
    let mo = 0;
    let d = 1;
    for (let i = 0; i < s.length; i++) {
      const b = byMonth[mo];
      b.days++;
      if (s.wet[i]) b.wet++;
      else b.dryTmax.push(s.tmaxF[i]);
      if (++d > new Date(Date.UTC(y, mo + 1, 0)).getUTCDate()) ((d = 1), ++mo === 12 && ((mo = 0), y++));
    }
    for (let m = 0; m < 12; m++) {
      const p = monthly[m];
      const pi = stationaryWetProbability(p.pWetAfterDry, p.pWetAfterWet);
      const r = p.pWetAfterWet - p.pWetAfterDry;
      const b = byMonth[m];
      const se = Math.sqrt((pi * (1 - pi) * (1 + r)) / (1 - r) / b.days);
      expect(Math.abs(b.wet / b.days - pi)).toBeLessThan(4 * se + 0.01);
      const n = b.dryTmax.length;
      expect(Math.abs(meanOf(b.dryTmax) - p.tmaxMeanF)).toBeLessThan(4 * p.tmaxSdF * Math.sqrt(3 / n));
      expect(Math.abs(sdOf(b.dryTmax) - p.tmaxSdF)).toBeLessThan(4 * p.tmaxSdF * Math.sqrt(1.25 / 0.75 / (2 * n)));
    }
  });
});

describe("generator laws (properties)", () => {
  it("tmin ≤ tmax − 1 on every day, even for a profile where the two means are close", () => {
    const w = weather({ monthly: Array.from({ length: 12 }, () => month({ tmaxMeanF: 50, tminMeanF: 48 })) });
    const s = generate(w, "close-means", 20_000);
    for (let i = 0; i < s.length; i++) expect(s.tminF[i]).toBeLessThanOrEqual(s.tmaxF[i] - 1);
  });

  it("growing in any chunks gives the same series, whatever else the caller draws", () => {
    const w = weather();
    const ref = generate(w, "chunks", 1500);
    fc.assert(
      fc.property(fc.array(fc.integer({ min: 1, max: 400 }), { minLength: 1, maxLength: 12 }), (steps) => {
        const rng = createRng("chunks");
        const s = createWeatherSeries(w, DAY0, rng);
        let n = 0;
        for (const step of steps) {
          n = Math.min(1500, n + step);
          rng.next(); // the caller's own draws must not disturb the weather
          s.ensure(n);
        }
        s.ensure(1500);
        for (let i = 0; i < 1500; i++) {
          expect(s.tmaxF[i]).toBe(ref.tmaxF[i]);
          expect(s.windMph[i]).toBe(ref.windMph[i]);
          expect(s.wet[i]).toBe(ref.wet[i]);
          expect(s.rainHours[i]).toBe(ref.rainHours[i]);
        }
      }),
      { numRuns: 30 },
    );
  });

  it("takes exactly two uniforms from the caller's stream in stochastic mode, none in fixed mode", () => {
    const counting = (): Rng & { calls: number } => {
      const base = createRng("count");
      const r = { calls: 0, next: () => (r.calls++, base.next()) };
      return r;
    };
    const a = counting();
    createWeatherSeries(weather(), DAY0, a).ensure(800);
    expect(a.calls).toBe(2);
    const b = counting();
    createWeatherSeries(weather({ mode: "fixed" }), DAY0, b).ensure(800);
    expect(b.calls).toBe(0);
  });
});

describe("fixed mode", () => {
  const monthly = Array.from({ length: 12 }, (_, m) => month({ tmaxMeanF: 40 + 3 * m, tminMeanF: 20 + 3 * m, windMeanMph: 5 + m, rhMean: 50 + m }));
  const w = weather({ mode: "fixed", monthly, fixedWetDates: ["2001-03-15"] });

  it("reproduces the monthly means exactly and rains only on fixedWetDates, all day", () => {
    const s = generate(w, "unused", 800);
    for (let i = 0; i < 800; i++) {
      const mo = new Date(Date.UTC(2001, 0, 1 + i)).getUTCMonth();
      expect(s.tmaxF[i]).toBe(40 + 3 * mo);
      expect(s.tminF[i]).toBe(20 + 3 * mo);
      expect(s.windMph[i]).toBe(5 + mo);
      expect(s.rhPct[i]).toBe(50 + mo);
    }
    const wetDay = parseIsoDate("2001-03-15") - DAY0;
    for (let i = 0; i < 800; i++) expect(s.wet[i]).toBe(i === wetDay ? 1 : 0);
    for (let k = 0; k < 800 * 24; k++) expect(isRainHour(s, k)).toBe(Math.floor(k / 24) === wetDay);
  });
});

describe("hourly temperature and rain slots", () => {
  const s = generate(weather(), "diurnal", 400);

  it("hits tmin at 06:00 and tmax at 15:00, rises between them and falls otherwise", () => {
    for (let d = 1; d < 398; d++) {
      expect(hourlyTempF(s, d * 24 + 6)).toBeCloseTo(s.tminF[d], 10);
      expect(hourlyTempF(s, d * 24 + 15)).toBeCloseTo(s.tmaxF[d], 10);
      for (let h = 6; h < 15; h += 0.5) expect(hourlyTempF(s, d * 24 + h + 0.5)).toBeGreaterThanOrEqual(hourlyTempF(s, d * 24 + h));
      for (let h = 15; h < 30; h += 0.5) expect(hourlyTempF(s, d * 24 + h + 0.5)).toBeLessThanOrEqual(hourlyTempF(s, d * 24 + h));
    }
  });

  it("is continuous at midnight and everywhere else", () => {
    for (let d = 1; d < 398; d++) {
      const t = d * 24;
      expect(Math.abs(hourlyTempF(s, t - 1e-9) - hourlyTempF(s, t))).toBeLessThan(1e-6);
      // A bounded slope: half-cosine of amplitude ≤ range over 9 h has slope ≤ π·range/18 per hour.
      for (let h = 0; h < 24; h += 0.25) {
        const range = Math.abs(s.tmaxF[d] - s.tminF[d]) + Math.abs(s.tmaxF[d - 1] - s.tminF[d]) + Math.abs(s.tmaxF[d] - s.tminF[d + 1]);
        expect(Math.abs(hourlyTempF(s, t + h + 0.01) - hourlyTempF(s, t + h))).toBeLessThan(0.01 * range + 1e-9);
      }
    }
  });

  it("rain slots cover exactly the day's rain hours, running past midnight", () => {
    let spilled = 0;
    for (let d = 0; d < 398; d++) {
      if (!s.wet[d]) continue;
      const a = d * 24 + s.rainStartHour[d];
      const b = a + s.rainHours[d];
      for (let k = a; k < b; k++) expect(isRainHour(s, k)).toBe(true);
      if (b > (d + 1) * 24) spilled++;
      // With dry neighbours, the slot before the start (same day) and the slot after the end are dry.
      if (!s.wet[d + 1] && (d === 0 || !s.wet[d - 1])) {
        if (a - 1 >= d * 24) expect(isRainHour(s, a - 1)).toBe(false);
        expect(isRainHour(s, b)).toBe(false);
      }
    }
    expect(spilled).toBeGreaterThan(0);
    let total = 0;
    let expected = 0;
    for (let k = 0; k < 398 * 24; k++) if (isRainHour(s, k)) total++;
    // Rain hours overlap only where a spill meets the next day's rain, so the count never exceeds the sum.
    for (let d = 0; d < 398; d++) expected += s.rainHours[d];
    expect(total).toBeLessThanOrEqual(expected);
    expect(total).toBeGreaterThan(0.8 * expected);
  });
});
