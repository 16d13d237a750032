/**
 * CSV exports never hand a spreadsheet a live formula: text starting with =, +, -, @, tab or carriage return
 * gets a leading apostrophe (the OWASP "CSV injection" advice), numbers stay numbers. Read back with papaparse.
 */
import { describe, expect, it } from "vitest";
import { readFileSync } from "node:fs";
import Papa from "papaparse";
import { parseScenario, runScenario } from "../../sim/index";
import { toCsv } from "../../src/lib/exports/csv";
import { percentilesCsv } from "../../src/lib/exports/results-csv";

const cells = (csv: string) => Papa.parse<string[]>(csv, { skipEmptyLines: true }).data;

describe("toCsv", () => {
  it.each(["=HYPERLINK(\"http://evil.example\",\"x\")", "+1+2", "-2+3", "@SUM(A1:A2)", "\tcmd", "\rcmd", "=1+1\nsecond line"])("neutralises %j", (text) => {
    const [, row] = cells(toCsv([{ name: text }]));
    expect(row[0]).toBe(`'${text}`);
  });

  it("leaves ordinary text, numbers and negative numbers as they are", () => {
    const csv = toCsv([{ name: "Mechanical milling", count: 3, delta: -4.5, note: "a=b", empty: "" }]);
    expect(csv.split("\r\n")[1]).toBe("Mechanical milling,3,-4.5,a=b,");
  });
});

describe("results CSV with formula-like names", () => {
  const raw = JSON.parse(readFileSync(new URL("../../scenarios/small-deterministic.json", import.meta.url), "utf8"));
  raw.operations[0].name = '=HYPERLINK("http://evil.example","open")';
  const parsed = parseScenario(raw);
  if (!parsed.ok) throw new Error(JSON.stringify(parsed.problems));
  const summary = runScenario(parsed.scenario, { iterations: 1, seed: "csv" });

  it("percentiles: the operation name arrives as text", () => {
    const rows = Papa.parse<Record<string, string>>(percentilesCsv(summary), { header: true }).data;
    const milling = rows.find((r) => r.item === "milling")!;
    expect(milling.name).toBe(`'${raw.operations[0].name}`);
    expect(rows.every((r) => !/^[=+\-@\t\r]/.test(r.name))).toBe(true);
  });

});
