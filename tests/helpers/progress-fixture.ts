/**
 * A field-log fixture: the small deterministic deck (1,000 ft from STA 0+00, milling then overlay) moved so it
 * started three weeks before today, with the shortest winter there is (31 Dec alone), created in the demo
 * project through the API. Progress entries must not be in the future, so a fixture of the seeded demo
 * (which starts in April 2027) could not take any.
 */
import { readFileSync } from "node:fs";
import { addDays, format, parseISO } from "date-fns";
import { localDateHour } from "@/lib/local-clock";
import { call } from "./app";

export function isoDaysFromToday(n: number, timeZone = "America/Chicago"): string {
  const d = new Date(Date.now() + n * 86_400_000);
  return new Intl.DateTimeFormat("en-CA", { timeZone, year: "numeric", month: "2-digit", day: "2-digit" }).format(d);
}

/** The instant that reads `hour`:30 on local day `day` (`YYYY-MM-DD`) in `timeZone`: a chosen clock for a server pass. */
export function atLocal(day: string, hour: number, timeZone = "America/Chicago"): Date {
  const guess = Date.UTC(+day.slice(0, 4), +day.slice(5, 7) - 1, +day.slice(8, 10), hour, 30);
  for (let h = -14; h <= 14; h++) {
    const d = new Date(guess + h * 3_600_000);
    const local = localDateHour(d, timeZone);
    if (local.date === day && local.hour === hour) return d;
  }
  throw new Error(`no instant reads ${day} ${hour}:30 in ${timeZone}`);
}

/** Whether the fixtures' calendar works `iso` (`YYYY-MM-DD`): every day but 31 Dec, their one-day winter. */
export const openInFixture = (iso: string): boolean => !iso.endsWith("-12-31");

/** `iso` (`YYYY-MM-DD`) moved by `n` calendar days. */
export const plusDays = (iso: string, n: number): string => format(addDays(parseISO(iso), n), "yyyy-MM-dd");

export function pastDefinition(name: string): Record<string, any> {
  const def = JSON.parse(readFileSync(new URL("../../scenarios/small-deterministic.json", import.meta.url), "utf8"));
  def.name = name;
  def.startDate = isoDaysFromToday(-21);
  delete def.targetDate;
  // The shortest winter there is (31 Dec alone: a winter runs into the next year), so progress and re-forecast run at
  // any time of year; every day a work day, holidays worked through (a test run the day before Thanksgiving must not
  // find the next day stood down). Tests that look at given days step over 31 Dec (`openInFixture`).
  def.calendar.season = { plan: "single", winterStart: "12-31", winterEnd: "01-01" };
  def.calendar.workDays = [0, 1, 2, 3, 4, 5, 6];
  def.calendar.holidays = { policy: "workThrough", observeFederal: true };
  def.calendar.closureWindows = def.calendar.closureWindows.map((w: Record<string, unknown>) => ({ ...w, dayTypes: ["weekday", "saturday", "sunday", "holiday"] }));
  return def;
}

export async function createPastScenario(cookie: string, projectId: string, name: string): Promise<{ id: string; version: number; definition: Record<string, any> }> {
  const definition = pastDefinition(name);
  const res = await call(`/api/projects/${projectId}/scenarios`, { method: "POST", cookie, body: { name, definition } });
  if (res.status !== 201) throw new Error(`fixture scenario failed: ${res.status} ${JSON.stringify(res.body)}`);
  return { ...res.body, definition };
}
