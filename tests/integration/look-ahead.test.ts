/**
 * The week ahead over HTTP against the running app and the weather-service fake: a fresh forecast, one fetch
 * per project per hour shared by every reader, the last forecast with its age when the service fails, the
 * location's field messages, and the daily e-mail with what changed since the last one. Runs on the seeded
 * Tern Point project (only the admin belongs to it), so no other test's location is touched.
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import postgres from "postgres";
import { call, signInAs } from "../helpers/app";
import { isoDaysFromToday, openInFixture } from "../helpers/progress-fixture";
import { createLookAheadScenario, fakeRequestCount, FAKE_POINTS, setFakeFailure } from "../helpers/look-ahead-fixture";
import { findMail } from "../../src/lib/server/mailbox";
import { formatIsoDay } from "@/lib/format";

const appDb = postgres(process.env.DATABASE_URL!, { max: 1, onnotice: () => {} });
let admin: string;
let projectId: string;
let scenarioId: string;
const point = FAKE_POINTS.rainy;
const hourlyPath = "/gridpoints/KBY/42,60/forecast/hourly";

beforeAll(async () => {
  admin = await signInAs("admin");
  const projects = (await call("/api/projects", { cookie: admin })).body.projects as { id: string; name: string }[];
  projectId = projects.find((p) => p.name.includes("Tern"))!.id;
  scenarioId = (await createLookAheadScenario(admin, projectId, "Week ahead (integration)")).id;
});
afterAll(async () => {
  await setFakeFailure(point, "ok");
  await appDb.end();
});

/** Tomorrow's place on the board, or the day after's when tomorrow is 31 Dec (the fixture's winter): both rainy at Rainy Point. */
const wetDay = (board: { days: { date: string }[] }) => [1, 2].find((n) => openInFixture(board.days[n].date))!;

describe("the week ahead", () => {
  it("refuses a location out of range or half given, naming the field", async () => {
    const far = await call(`/api/projects/${projectId}/location`, { method: "PUT", cookie: admin, body: { latitude: 95, longitude: -88 } });
    expect(far.status).toBe(400);
    expect(far.body.fields).toEqual([{ path: "latitude", label: "Latitude", message: "Latitude must be between −90 and 90 degrees." }]);
    const half = await call(`/api/projects/${projectId}/location`, { method: "PUT", cookie: admin, body: { latitude: 30, longitude: null } });
    expect(half.status).toBe(400);
    expect(half.body.fields[0]).toEqual({ path: "longitude", label: "Longitude", message: "Give both latitude and longitude, or clear both." });
  });

  it("without a location the board still answers, and says why there is no forecast", async () => {
    expect((await call(`/api/projects/${projectId}/location`, { method: "PUT", cookie: admin, body: { latitude: null, longitude: null } })).status).toBe(200);
    const r = await call(`/api/scenarios/${scenarioId}/look-ahead`, { cookie: admin });
    expect(r.status).toBe(200);
    expect(r.body.forecast.status).toBe("noLocation");
    expect(r.body.days).toHaveLength(7);
    expect(r.body.days[wetDay(r.body)].shifts[0].operations[0].status).toBe("unknown");
  });

  it("fetches the forecast once for everyone within the hour, then serves the last one with its age when the service fails", async () => {
    expect((await call(`/api/projects/${projectId}/location`, { method: "PUT", cookie: admin, body: point })).status).toBe(200);
    const before = await fakeRequestCount(hourlyPath);
    const first = await call(`/api/scenarios/${scenarioId}/look-ahead`, { cookie: admin });
    expect(first.status).toBe(200);
    expect(first.body.forecast).toMatchObject({ status: "fresh", message: null, place: "Rainy Point, ZZ" });
    // Tomorrow is a rainy day (PoP 80 % from 06:00 to 20:00): the day-shift pour fails the no-rain gate.
    const wet = first.body.days[wetDay(first.body)].shifts.find((s: { shiftId: string }) => s.shiftId === "day").operations[0];
    expect(wet.status).toBe("no");
    expect(wet.failing.map((f: { gate: string }) => f.gate)).toContain("noRain");
    expect(await fakeRequestCount(hourlyPath)).toBe(before + 1);
    // Another reader, and a second look: the cached forecast, no new request.
    await call(`/api/scenarios/${scenarioId}/look-ahead`, { cookie: admin });
    expect(await fakeRequestCount(hourlyPath)).toBe(before + 1);

    // Three hours later the service answers HTTP 500: the board keeps the last forecast and says how old it is.
    await appDb`UPDATE project_forecasts SET fetched_at = now() - interval '3 hours', last_attempt_at = now() - interval '3 hours' WHERE project_id = ${projectId}`;
    await setFakeFailure(point, "500");
    const down = await call(`/api/scenarios/${scenarioId}/look-ahead`, { cookie: admin });
    expect(down.status).toBe(200);
    expect(down.body.forecast.status).toBe("stale");
    expect(down.body.forecast.message).toBe(
      "The National Weather Service answered with an error (HTTP 500: Unexpected Problem) (tried 3 times). Showing the last forecast, fetched 3 h ago.",
    );
    expect(down.body.days[wetDay(down.body)].shifts.find((s: { shiftId: string }) => s.shiftId === "day").operations[0].status).toBe("no");
    // Within the retry pause nobody asks again.
    const afterFailure = await fakeRequestCount(hourlyPath);
    await call(`/api/scenarios/${scenarioId}/look-ahead`, { cookie: admin });
    expect(await fakeRequestCount(hourlyPath)).toBe(afterFailure);
    await setFakeFailure(point, "ok");
  });

  it("e-mails the board daily with what changed since the last notice", async () => {
    const to = `week-ahead-${Date.now()}@marrin-dot.example`;
    const bad = await call(`/api/scenarios/${scenarioId}/look-ahead/notice`, { method: "PUT", cookie: admin, body: { enabled: true, hour: 24, recipients: ["not an address"] } });
    expect(bad.status).toBe(400);
    expect(bad.body.fields.map((f: { path: string }) => f.path).sort()).toEqual(["hour", "recipients[0]"]);
    // Hour 0: due at once today.
    const ok = await call(`/api/scenarios/${scenarioId}/look-ahead/notice`, { method: "PUT", cookie: admin, body: { enabled: true, hour: 0, recipients: [to] } });
    expect(ok.status).toBe(200);
    await expect.poll(() => findMail({ to, subject: "Week ahead: Week ahead (integration)" }), { timeout: 20_000, interval: 250 }).not.toBeNull();
    const first = findMail({ to, subject: "Week ahead" })!;
    expect(first.text).toContain("This is the first notice.");
    expect(first.text).toMatch(/✗ Day shift — Overlay placement: blocked \(no rain from 07:00/);

    // Pretend yesterday's notice saw tomorrow's pour as workable: today's says what changed.
    const [row] = await appDb`SELECT last_board FROM look_ahead_notices WHERE scenario_id = ${scenarioId}`;
    const board = row.last_board as Record<string, string>;
    const key = Object.keys(board).find((k) => k.endsWith("|day|overlay") && board[k] === "no")!;
    const yesterdays = { ...board, [key]: "go" };
    await appDb`UPDATE look_ahead_notices SET last_sent_on = ${isoDaysFromToday(-1)}, last_board = ${appDb.json(yesterdays)} WHERE scenario_id = ${scenarioId}`;
    await expect.poll(() => findMail({ to, subject: "(1 changed)" }), { timeout: 20_000, interval: 250 }).not.toBeNull();
    const second = findMail({ to, subject: "(1 changed)" })!;
    expect(second.text).toContain("Changed since the last notice:");
    expect(second.text).toContain(`${formatIsoDay(key.split("|")[0])}, Day shift, Overlay placement: may work → blocked`);
    await call(`/api/scenarios/${scenarioId}/look-ahead/notice`, { method: "PUT", cookie: admin, body: { enabled: false, hour: 0, recipients: [to] } });
  });
});
