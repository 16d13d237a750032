/**
 * A field-log fixture: the small deterministic deck (1,000 ft from STA 0+00, milling then overlay) moved so it
 * started three weeks before today, with a short winter that does not touch those weeks, created in the demo
 * project through the API. Progress entries must not be in the future, so a fixture of the seeded demo
 * (which starts in April 2027) could not take any.
 */
import { readFileSync } from "node:fs";
import { call } from "./app";

export function isoDaysFromToday(n: number, timeZone = "America/Chicago"): string {
  const d = new Date(Date.now() + n * 86_400_000);
  return new Intl.DateTimeFormat("en-CA", { timeZone, year: "numeric", month: "2-digit", day: "2-digit" }).format(d);
}

export function pastDefinition(name: string): Record<string, any> {
  const def = JSON.parse(readFileSync(new URL("../../scenarios/small-deterministic.json", import.meta.url), "utf8"));
  def.name = name;
  def.startDate = isoDaysFromToday(-21);
  delete def.targetDate;
  // A one-day "winter" (31 Dec to 1 Jan), so progress and re-forecast run at any time of year; every day a work day.
  def.calendar.season = { plan: "single", winterStart: "12-31", winterEnd: "01-01" };
  def.calendar.workDays = [0, 1, 2, 3, 4, 5, 6];
  def.calendar.closureWindows = def.calendar.closureWindows.map((w: Record<string, unknown>) => ({ ...w, dayTypes: ["weekday", "saturday", "sunday", "holiday"] }));
  return def;
}

export async function createPastScenario(cookie: string, projectId: string, name: string): Promise<{ id: string; version: number; definition: Record<string, any> }> {
  const definition = pastDefinition(name);
  const res = await call(`/api/projects/${projectId}/scenarios`, { method: "POST", cookie, body: { name, definition } });
  if (res.status !== 201) throw new Error(`fixture scenario failed: ${res.status} ${JSON.stringify(res.body)}`);
  return { ...res.body, definition };
}
