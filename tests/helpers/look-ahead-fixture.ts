/**
 * A week-ahead fixture: the field-log deck (started three weeks ago, every day a work day, windows on every
 * day type, holidays worked through, a one-day winter on New Year's Eve), so no day of the board is
 * closed by the calendar outside the last week of December; overlay placement gated at 45 °F and rising, no rain.
 */
import { call } from "./app";
import { pastDefinition } from "./progress-fixture";

export function lookAheadDefinition(name: string): Record<string, any> {
  const def = pastDefinition(name);
  // pastDefinition's winter is New Year's Eve alone (the shortest a winter can be): it touches the board only when
  // the tests run in the last week of December, and the tests step over it (`openInFixture`).
  def.timeZone = "America/Chicago";
  const overlay = def.operations.find((o: { id: string }) => o.id === "overlay");
  overlay.gates = { minTempF: 45, rising: true, noRain: true };
  return def;
}

export async function createLookAheadScenario(cookie: string, projectId: string, name: string): Promise<{ id: string }> {
  const res = await call(`/api/projects/${projectId}/scenarios`, { method: "POST", cookie, body: { name, definition: lookAheadDefinition(name) } });
  if (res.status !== 201) throw new Error(`fixture scenario failed: ${res.status} ${JSON.stringify(res.body)}`);
  return res.body;
}

/** The invented points of the weather-service fake (scripts/fake-forecast-weather.ts). */
export const FAKE_POINTS = {
  kestrelBay: { latitude: 30.25, longitude: -88.1 },
  coldSnap: { latitude: 30.3, longitude: -88.2 },
  rainy: { latitude: 30.35, longitude: -88.3 },
} as const;

export async function setFakeFailure(point: { latitude: number; longitude: number }, mode: "timeout" | "500" | "malformed" | "ok") {
  const base = process.env.FORECAST_BASE_URL;
  if (!base) throw new Error("FORECAST_BASE_URL is not set: run through `npm test`, which starts the weather-service fake.");
  const res = await fetch(`${base}/__fake/fail?point=${point.latitude},${point.longitude}&mode=${mode}`, { method: "POST" });
  if (!res.ok) throw new Error(`the fake refused the failure mode: ${res.status}`);
}

export async function fakeRequestCount(path: string): Promise<number> {
  const res = await fetch(`${process.env.FORECAST_BASE_URL}/__fake/requests`);
  return ((await res.json()) as Record<string, number>)[path] ?? 0;
}
