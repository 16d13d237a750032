/** The closure notice's words (src/lib/server/closure-notice-mail.ts): closures ahead of today, days in words. */
import { describe, expect, it } from "vitest";
import { closureNoticeMail } from "../../src/lib/server/closure-notice-mail";

const base = { to: "pio@county.example", structure: "Kestrel Bay Causeway", timeZone: "America/Chicago", feedUrl: "https://x.example/feed.ics", advisoryUrl: "https://x.example/advisory/t" };
const night = { start: "2027-04-06T21:00", end: "2027-04-07T05:00", name: "Night two-lane closure", lanes: ["L2", "L3"], kind: "short" as const };
const day = { start: "2027-04-07T09:30", end: "2027-04-07T15:00", name: "Day single-lane closure", lanes: ["L3"], kind: "short" as const };

describe("the closure notice", () => {
  it("writes each closure with its days in words and the end's day only when it differs", () => {
    const m = closureNoticeMail({ ...base, count: 2, ahead: 2, today: "2027-04-01", upcoming: [night, day] });
    expect(m.text).toContain("Tue 6 Apr 2027 21:00 – 7 Apr 05:00  Night two-lane closure (L2, L3 closed)");
    expect(m.text).toContain("Wed 7 Apr 2027 09:30 – 15:00  Day single-lane closure (L3 closed)");
    expect(m.text).not.toMatch(/\d{4}-\d{2}-\d{2}/);
    expect(m.text).toContain("2 closure periods in all, all of them from today (Thu 1 Apr 2027) on.");
    expect(m.text).toContain("The closures:");
  });

  it("says how many lie ahead when some are past, and heads a partial list as the next ones", () => {
    const m = closureNoticeMail({ ...base, count: 275, ahead: 140, today: "2026-12-03", upcoming: [night] });
    expect(m.text).toContain("275 closure periods in all, 140 from today (Thu 3 Dec 2026) on.");
    expect(m.text).toContain("The next closures:");
  });

  it("counts none without a today clause when the run has no closure at all", () => {
    const m = closureNoticeMail({ ...base, count: 0, ahead: 0, today: "2027-04-01", upcoming: [] });
    expect(m.text).toContain("have been published: 0 closure periods in all. Times are local");
    expect(m.text).toContain("No closure is planned from today on.");
  });

  it("says so when nothing is planned from today on, in the text and the HTML", () => {
    const m = closureNoticeMail({ ...base, count: 275, ahead: 0, today: "2028-01-10", upcoming: [] });
    expect(m.text).toContain("No closure is planned from today on.");
    expect(m.html).toContain("<p>No closure is planned from today on.</p>");
    expect(m.html).not.toContain("<ul>");
  });
});
