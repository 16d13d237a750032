/**
 * How far the plan of record's P80 finish moved between two forecasts, in words: calendar days, checked against
 * plain day counting from the Unix epoch (a reference of our own, independent of date-fns) for any two dates
 * 1990–2100; a time of day after the date does not count. And the sentence the project list and the forecast
 * e-mail build from a plan of record's newest forecast.
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import fc from "fast-check";
import { p80MoveText, planForecastText, publicationLagText, runMadeText } from "../../src/lib/plan-of-record-text";
import { forecastAlertMail } from "../../src/lib/server/mail/forecast-alert-mail";

const dayNumber = (iso: string) => Date.UTC(Number(iso.slice(0, 4)), Number(iso.slice(5, 7)) - 1, Number(iso.slice(8, 10))) / 86_400_000;
const isoOf = (n: number) => new Date(n * 86_400_000).toISOString().slice(0, 10);

describe("p80MoveText", () => {
  it("says later, earlier or unchanged by the calendar days between the dates", () => {
    const days = fc.integer({ min: dayNumber("1990-01-01"), max: dayNumber("2100-12-31") });
    fc.assert(
      fc.property(days, days, (a, b) => {
        const text = p80MoveText(isoOf(a), isoOf(b));
        const n = Math.abs(a - b);
        const unit = n === 1 ? "day" : "days";
        if (a === b) expect(text).toBe("unchanged since the previous forecast");
        else expect(text).toBe(`${n.toLocaleString("en-US")} ${unit} ${a > b ? "later" : "earlier"} than the previous forecast`);
      }),
    );
  });

  it("counts whole days and ignores a time of day", () => {
    expect(p80MoveText("2027-03-15", "2027-03-13")).toBe("2 days later than the previous forecast");
    expect(p80MoveText("2027-11-06T07:00", "2027-11-08T17:00")).toBe("2 days earlier than the previous forecast");
    expect(p80MoveText("2027-08-24", "2027-08-23")).toBe("1 day later than the previous forecast");
  });

  it("says nothing without both dates", () => {
    expect(p80MoveText(undefined, "2027-08-23")).toBeNull();
    expect(p80MoveText("2027-08-23", undefined)).toBeNull();
    expect(p80MoveText("not a date", "2027-08-23")).toBeNull();
  });
});

describe("the plan of record's forecast in words (the project list's and the forecast e-mail's)", () => {
  // Moments are shown in the installation's zone (src/lib/format.ts `displayTimeZone`): pinned here, as `npm test` does.
  const zoneBefore = process.env.POURLINE_TIME_ZONE;
  beforeAll(() => void (process.env.POURLINE_TIME_ZONE = "America/Chicago"));
  afterAll(() => (zoneBefore === undefined ? delete process.env.POURLINE_TIME_ZONE : void (process.env.POURLINE_TIME_ZONE = zoneBefore)));
  const headline = { iterations: 2000, finish: { p10: "2027-08-01", p50: "2027-08-15", p80: "2027-08-23", p90: "2027-08-30" }, targetDate: "2027-07-02", targetProbability: 0, closureHoursTotal: 1, weatherLostShiftsP50: 1 };
  const plan = {
    planScenarioId: "p",
    planName: "Two seasons",
    planRunSummary: headline,
    // 12:00 in Chicago: daylight saving time ended there at 02:00 that morning, so UTC−6 (IANA time zone database).
    planRunAt: "2026-11-01T18:00:00Z",
    planRunDataDate: "2026-10-31",
    planRunStale: false,
    planRunShiftsNotIn: 0,
    previousRunSummary: { ...headline, finish: { ...headline.finish, p80: "2027-08-13" } },
  };

  it("says the P80 and P50, the move, the target chance and which forecast", () => {
    expect(planForecastText(plan)).toEqual({
      p80: "23 Aug 2027",
      rest: " (P50 15 Aug 2027), 10 days later than the previous forecast; 0\u00a0% chance of finishing by the 2 Jul 2027 target.",
      when: "Re-forecast from the field log as of 31 Oct 2026, run 1 Nov 2026, 12:00.",
    });
  });

  it("says when the plan changed after it and how many field-log changes it does not know; nothing when not run", () => {
    expect(planForecastText({ ...plan, planRunStale: true, planRunShiftsNotIn: 3, planRunDataDate: null, previousRunSummary: null })?.when).toBe(
      "Forecast run 1 Nov 2026, 12:00; the plan has changed since, so this forecast is stale. 3 changes in the field log are not in this forecast.",
    );
    expect(planForecastText({ ...plan, planRunSummary: null, planRunAt: null })).toBeNull();
  });

  it("says when the forecast was computed under earlier model rules", () => {
    expect(planForecastText({ ...plan, planRunOlderRules: true })?.when).toBe(
      "Re-forecast from the field log as of 31 Oct 2026, run 1 Nov 2026, 12:00. It was computed under earlier model rules.",
    );
  });

  it("the e-mail says the same sentence, links the plan, and escapes what people typed in its HTML", () => {
    const mail = forecastAlertMail({ to: "a@b.example", projectName: "Deck <b>overlay</b>", plan: { ...plan, planName: "Plan & co" }, planChanged: false, planLink: "http://x/scenarios/p", projectLink: "http://x/projects/q" })!;
    expect(mail.subject).toBe("Forecast for Deck <b>overlay</b>: P80 finish 23 Aug 2027");
    expect(mail.text).toContain("Plan & co: P80 finish 23 Aug 2027 (P50 15 Aug 2027), 10 days later than the previous forecast;");
    expect(mail.text).toContain("http://x/scenarios/p");
    expect(mail.html).toContain("Deck &lt;b&gt;overlay&lt;/b&gt;");
    expect(mail.html).not.toContain("<b>overlay");
    expect(mail.text.startsWith('A new forecast of the plan of record of "Deck <b>overlay</b>":')).toBe(true);
    expect(mail.text).not.toContain("Progress:"); // no field log, no progress sentence
    // With a field log, the project list's progress sentence follows the forecast's.
    const progress = "Progress: 36 % of the deck finished — every operation done over 3,000 of 8,400 ft; last shift in the field log 4 Dec 2026.";
    const withLog = forecastAlertMail({ to: "a@b.example", projectName: "Deck", plan, planChanged: false, planLink: "", projectLink: "", progress })!;
    expect(withLog.text).toContain(`${planForecastText(plan)!.when}\n\n${progress}\n\nP80: 8 in 10`);
    expect(withLog.html).toContain(`<p>${progress}</p>`);
    // The closures the public sees came from an earlier forecast: said after the progress, before the P80 note.
    const lag = publicationLagText(new Date("2026-12-02T19:00:00Z"));
    expect(lag).toMatch(/^The lane closures the public sees \(published 2 Dec 2026, \d\d:00\) come from an earlier forecast, until someone publishes again from the plan's Share tab\.$/);
    const lagging = forecastAlertMail({ to: "a@b.example", projectName: "Deck", plan, planChanged: false, planLink: "", projectLink: "", progress, publicationLag: lag })!;
    expect(lagging.text).toContain(`${progress}\n\n${lag}\n\nP80: 8 in 10`);
    expect(withLog.text).not.toContain("the public sees");
    // Another plan chosen since the last e-mail: said first.
    const chosen = forecastAlertMail({ to: "a@b.example", projectName: "Deck", plan, planChanged: true, planLink: "", projectLink: "" })!;
    expect(chosen.text.startsWith('"Deck" is now run by another plan of record, "Two seasons". Its forecast:')).toBe(true);
    expect(forecastAlertMail({ to: "a@b.example", projectName: "x", plan: { ...plan, planRunSummary: null }, planChanged: false, planLink: "", projectLink: "" })).toBeNull();
  });
});

describe("runMadeText", () => {
  const at = new Date("2026-12-05T12:00:00Z"); // 06:00 in the tests' display zone, America/Chicago
  it("names the person who ran it, or the daily re-forecast and in whose name it ran", () => {
    expect(runMadeText({ at, byName: "Dana Whitcomb", automatic: false })).toBe("run 5 Dec 2026, 06:00 by Dana Whitcomb");
    expect(runMadeText({ at, byName: "Dana Whitcomb", automatic: true })).toBe("run 5 Dec 2026, 06:00 by the daily re-forecast, in Dana Whitcomb's name");
    expect(runMadeText({ at, byName: null, automatic: true })).toBe("run 5 Dec 2026, 06:00 by the daily re-forecast");
    expect(runMadeText({ at, byName: null, automatic: false })).toBe("run 5 Dec 2026, 06:00");
  });
});
