/** Reading weather-history and deck-survey CSVs: units, row-level problems, and what applying changes. */
import { describe, expect, it } from "vitest";
import { parseWeatherCsv, cToF, mmToIn, kmhToMph, msToMph, readDate } from "../../src/lib/csv/weather-csv";
import { readHeader } from "../../src/lib/csv/weather-columns";
import { parseSurveyCsv, parseStation, RATING_TO_PROBABILITY } from "../../src/lib/csv/survey-csv";
import { looksLikeText } from "../../src/lib/csv/common";
import { applyClimateFit, applySurvey } from "../../src/lib/csv/apply";
import { fitClimateProfile } from "../../sim/weather-fit";

describe("unit conversions", () => {
  // Source: exact definitions — °F = °C·9/5 + 32 (water freezes at 0 °C = 32 °F, boils at 100 °C = 212 °F);
  // 1 in = 25.4 mm (international inch, 1959); 1 mi = 1.609344 km.
  it("converts Celsius, millimetres and km/h exactly", () => {
    expect(cToF(0)).toBe(32);
    expect(cToF(100)).toBe(212);
    expect(cToF(-40)).toBe(-40);
    expect(mmToIn(25.4)).toBeCloseTo(1, 12);
    expect(kmhToMph(1.609344)).toBeCloseTo(1, 12);
    // 1 m/s = 3.6 km/h exactly.
    expect(msToMph(1)).toBeCloseTo(3.6 / 1.609344, 12);
  });
});

describe("weather CSV", () => {
  const units = { temperature: "F", precipitation: "in", wind: "mph" } as const;

  it("reads good rows in the stated units", () => {
    const csv = "Date,TMAX,TMIN,Precip,Wind\n2024-04-01,20,5,2.54,16.09344\n2024-04-02,25,10,0,\n";
    const r = parseWeatherCsv(csv, { temperature: "C", precipitation: "mm", wind: "kmh" });
    expect(r.problems).toEqual([]);
    expect(r.observations).toHaveLength(2);
    expect(r.observations[0].tmaxF).toBeCloseTo(68, 10);
    expect(r.observations[0].tminF).toBeCloseTo(41, 10);
    expect(r.observations[0].precipIn).toBeCloseTo(0.1, 10);
    expect(r.observations[0].windMph).toBeCloseTo(10, 10);
    expect(r.observations[1].windMph).toBeUndefined();
  });

  it("names every bad row by its line in the file", () => {
    const csv = ["date,tmax,tmin,precip", "2024-04-01,60,40,0", "2024-04-31,60,40,0", "2024-04-03,abc,40,0", "2024-04-04,50,55,0", "2024-04-05,60,40,-1", "2024-04-01,61,41,0"].join("\n");
    const r = parseWeatherCsv(csv, units);
    const at = (row: number) => r.problems.filter((p) => p.row === row).map((p) => p.field);
    expect(at(3)).toEqual(["date"]);
    expect(at(4)).toEqual(["daily maximum temperature"]);
    expect(at(5)).toEqual(["daily minimum temperature"]);
    expect(at(6)).toEqual(["daily precipitation"]);
    expect(at(7)).toEqual(["date"]);
    expect(r.problems.find((p) => p.row === 7)!.message).toContain("row 2");
    expect(at(2)).toEqual([]);
  });

  it("a missing column is a header problem", () => {
    const r = parseWeatherCsv("date,tmax,precip\n2024-01-01,3,0\n", units);
    expect(r.problems).toEqual([expect.objectContaining({ row: 1, field: "daily minimum temperature", message: expect.stringContaining("TMIN, tmin, temp_min") })]);
  });

  it("reads a station export as downloaded: common names, extra columns, missing days, units from the values", () => {
    // The layout of a U.S. daily station export in standard units (°F, inches, mph); invented values.
    const csv = [
      '"STATION","NAME","DATE","AWND","PRCP","SNOW","TMAX","TMIN","WT01"',
      '"US0001","KESTREL BAY, US","2024-07-01","8.5","0.12","0.0","88","70","1"',
      '"US0001","KESTREL BAY, US","2024-07-02","","0.00","0.0","91","72",""',
      '"US0001","KESTREL BAY, US","2024-07-03","7.2","","0.0","90","71",""',
      '"US0001","KESTREL BAY, US","2024-07-04","6.9","T","0.0","87","69",""',
    ].join("\n");
    const r = parseWeatherCsv(csv, { temperature: "auto", precipitation: "auto", wind: "auto" });
    expect(r.problems).toEqual([]);
    expect(r.skipped).toBe(1); // 3 July has no precipitation
    expect(r.observations.map((o) => o.date)).toEqual(["2024-07-01", "2024-07-02", "2024-07-04"]);
    expect(r.observations[0]).toMatchObject({ tmaxF: 88, tminF: 70, precipIn: 0.12, windMph: 8.5 });
    expect(r.observations[2].precipIn).toBe(0); // "T": a trace
    expect(r.observations[1].windMph).toBeUndefined();
    expect(r.columns.map((c) => [c.header, c.readAs, c.unit, c.unitFrom])).toEqual([
      ["DATE", "date", null, null],
      ["TMAX", "daily maximum temperature", "°F", "guessed"],
      ["TMIN", "daily minimum temperature", "°F", "guessed"],
      ["PRCP", "daily precipitation", "inches", "guessed"],
      ["AWND", "daily mean wind speed", "mph", "guessed"],
    ]);
    expect(r.ignored).toEqual(["STATION", "NAME", "SNOW", "WT01"]);
  });

  it("takes units from the headers, including m/s", () => {
    const csv = "time,temperature_2m_max (°C),temperature_2m_min (°C),precipitation_sum (mm),wind_speed_10m_mean (m/s)\n2024-07-01,30,20,25.4,10\n";
    const r = parseWeatherCsv(csv, { temperature: "auto", precipitation: "auto", wind: "auto" });
    expect(r.problems).toEqual([]);
    expect(r.observations[0].tmaxF).toBeCloseTo(86, 10);
    expect(r.observations[0].precipIn).toBeCloseTo(1, 10);
    expect(r.observations[0].windMph).toBeCloseTo(36 / 1.609344, 10);
    expect(r.columns.every((c) => c.unitFrom === null || c.unitFrom === "header")).toBe(true);
  });

  it("refuses Celsius read as Fahrenheit before anything is fitted, and says which unit was meant", () => {
    const rows = Array.from({ length: 20 }, (_, i) => `2024-07-${String(i + 1).padStart(2, "0")},${28 + (i % 4)},${18 + (i % 3)},0`);
    const r = parseWeatherCsv(`date,temp_max,temp_min,precipitation\n${rows.join("\n")}`, { temperature: "F", precipitation: "in", wind: "mph" });
    expect(r.observations).toEqual([]);
    expect(r.problems).toEqual([expect.objectContaining({ field: "temperature unit", message: expect.stringMatching(/July's maximum temperatures average 30 °F.*Did you mean °C\? \(30 °C would be 86 °F/) })]);
    // Left on "as the file says", the same values are read as °C and accepted.
    const auto = parseWeatherCsv(`date,temp_max,temp_min,precipitation\n${rows.join("\n")}`, { temperature: "auto", precipitation: "auto", wind: "auto" });
    expect(auto.problems).toEqual([]);
    expect(auto.columns[1]).toMatchObject({ unit: "°C", unitFrom: "guessed" });
  });

  it("recognises the common header spellings and their units", () => {
    expect(readHeader("Max Temp (°F)")).toEqual({ field: "tmax", unit: "F" });
    expect(readHeader("tmax_c")).toEqual({ field: "tmax", unit: "C" });
    expect(readHeader("TMIN")).toEqual({ field: "tmin", unit: null });
    expect(readHeader("Precip (in)")).toEqual({ field: "precip", unit: "in" });
    expect(readHeader("wind speed [km/h]")).toEqual({ field: "wind", unit: "kmh" });
    expect(readHeader("STATION")).toEqual({ field: null, unit: null });
    expect(readDate("7/4/2024")).toBe("2024-07-04");
    expect(readDate("20240704")).toBe("2024-07-04");
    expect(readDate("2024-02-30")).toBeNull();
  });

  it("a fitted profile replaces only the months the history covers and keeps humidity", () => {
    // Hand-made: ten dry April days with tmax 60…69 (mean 64.5) and tmin 40…49 (mean 44.5).
    const rows = Array.from({ length: 10 }, (_, i) => `2024-04-${String(i + 1).padStart(2, "0")},${60 + i},${40 + i},0`);
    const { observations } = parseWeatherCsv(`date,tmax,tmin,precip\n${rows.join("\n")}`, units);
    const fit = fitClimateProfile(observations);
    const monthly = Array.from({ length: 12 }, () => ({ tmaxMeanF: 1, tmaxSdF: 1, tminMeanF: 0, tminSdF: 1, pWetAfterDry: 0.5, pWetAfterWet: 0.5, windMeanMph: 9, rhMean: 55 }));
    const out = applyClimateFit({ weather: { mode: "stochastic", monthly } }, fit);
    expect(out.weather.monthly[3].tmaxMeanF).toBe(64.5);
    expect(out.weather.monthly[3].tminMeanF).toBe(44.5);
    expect(out.weather.monthly[3].rhMean).toBe(55);
    expect(out.weather.monthly[3].pWetAfterDry).toBe(0);
    expect(out.weather.monthly[4]).toEqual(monthly[4]);
  });
});

describe("deck survey CSV", () => {
  const deck = { startStationFt: 1200, lengthFt: 8400 };

  it("reads stations in feet or station notation", () => {
    expect(parseStation("12+50")).toBe(1250);
    expect(parseStation("STA 96+00")).toBe(9600);
    expect(parseStation("1300.5")).toBe(1300.5);
    expect(parseStation("12-50")).toBeNull();
  });

  it("takes a repair share or maps a condition rating", () => {
    const r = parseSurveyCsv("from_station,to_station,repair_share,condition_rating\n12+00,20+00,0.2,\n20+00,30+00,,4\n", deck);
    expect(r.problems).toEqual([]);
    expect(r.ranges).toEqual([
      { fromStationFt: 1200, toStationFt: 2000, probability: 0.2 },
      { fromStationFt: 2000, toStationFt: 3000, probability: RATING_TO_PROBABILITY[4] },
    ]);
    const applied = applySurvey({ deck: { survey: [] } }, r.ranges);
    expect(applied.deck.survey).toHaveLength(2);
  });

  it("refuses stations off the deck and reversed ranges, naming the row", () => {
    const r = parseSurveyCsv("from_station,to_station,repair_share\n5+00,20+00,0.1\n30+00,25+00,0.1\n20+00,30+00,1.5\n", deck);
    expect(r.problems.map((p) => [p.row, p.field])).toEqual([
      [2, "from_station"],
      [3, "to_station"],
      [4, "repair_share"],
    ]);
  });
});

describe("file type sniffing", () => {
  it("tells a spreadsheet, a PDF or binary data from text", () => {
    expect(looksLikeText(new TextEncoder().encode("date,tmax\n"))).toBe(true);
    expect(looksLikeText(new Uint8Array([0x50, 0x4b, 0x03, 0x04, 1, 2]))).toBe(false);
    expect(looksLikeText(new TextEncoder().encode("%PDF-1.7"))).toBe(false);
    expect(looksLikeText(new Uint8Array([65, 0, 66]))).toBe(false);
  });
});
