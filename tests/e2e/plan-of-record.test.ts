/**
 * The plan of record in Debian's Chromium: the owner's executive (viewer) reads on the project list which plan each
 * project is run by, its newest forecast in words, how far the field log says the job has got and how it stands against
 * the plan run, and the plan's Outlook and owner brief say the same
 * re-forecast above the plan run's charts; an administrator of a new project chooses one of its
 * scenarios on the project page, which then marks it in the scenario table and on its page, and shows it on the list,
 * asks for an e-mail with each new forecast of it and has it re-forecast each morning; the Members page says who is
 * sent what.
 */
import { describe, expect, it } from "vitest";
import { APP_URL, call } from "../helpers/app";
import { browserPerFile, screenshot, seriousA11yViolations } from "../helpers/browser";
import { cookieHeader, signedIn } from "./pages/sign-in";
import { templateScenario } from "../../src/lib/scenario-template";

const browser = browserPerFile();

describe("the plan of record", () => {
  it("is read on the project list by the executive", async () => {
    const { context, page } = await signedIn(browser(), "viewer");
    const card = page.getByRole("link", { name: /Kestrel Bay Causeway — deck overlay/ });
    const text = (await card.textContent()) ?? "";
    expect(text).toContain("Plan of record");
    expect(text).toMatch(/Kestrel Bay Causeway — two seasons.*: P80 finish \d{1,2} \w{3} \d{4} \(P50 \d{1,2} \w{3} \d{4}\)/);
    // The seed's re-forecasts follow one another: the newest says how far the finish moved since the one before.
    expect(text).toMatch(/\), (\d+ days? (later|earlier) than|unchanged since) the previous forecast/);
    expect(text).toMatch(/chance of finishing by the \d{1,2} \w{3} \d{4} target/);
    expect(text).toMatch(/Re-forecast from the field log as of|Forecast run/);
    // How far the field log says the job has got, under the forecast (the seeded season finished part of the deck).
    expect(await card.getByTestId("plan-progress").textContent()).toMatch(/^Progress: \d+ % of the deck finished — every operation done over [\d,]+ of 8,400 ft; last shift in the field log \d{1,2} \w{3} \d{4}\.$/);
    expect(await seriousA11yViolations(page)).toEqual([]);
    await screenshot(page, "plan-of-record-list");

    // The plan's Outlook shows the plan as run before work began; it says above its charts that the field log has
    // moved the forecast on, with the same P80 finish the project list quotes.
    const p80 = /P80 finish (\d{1,2} \w{3} \d{4})/.exec(text)![1];
    const progress = await card.getByTestId("plan-progress").textContent();
    // And, reading the plan run's median iteration, how the job stands against it: is it behind, and how far.
    const against = await card.getByTestId("plan-against").textContent();
    expect(against).toMatch(/^Against the plan at \d{1,2} \w{3} \d{4}: (every operation on plan or ahead of it|\d of 6 operations behind[,;] .+: .+)\.$/);
    await card.click();
    // The project page says the same progress and the same standing under its plan of record.
    await expect.poll(() => page.getByTestId("plan-of-record").getByTestId("plan-progress").textContent()).toBe(progress);
    expect(await page.getByTestId("plan-of-record").getByTestId("plan-against").textContent()).toBe(against);
    // The scenario table says the plan's newest re-forecast beside its plan run's dates.
    const planRow = page.getByRole("row").filter({ has: page.getByText("Plan of record", { exact: true }) });
    expect(await planRow.getByTestId("reforecast-line").textContent()).toMatch(/^Re-forecast from the field log as of \d{1,2} \w{3} \d{4}: P80 finish \d{1,2} \w{3} \d{4}$/);
    await page.getByTestId("plan-of-record").getByRole("link", { name: "Kestrel Bay Causeway — two seasons" }).click();
    const notice = page.getByTestId("newer-reforecast");
    await notice.waitFor();
    expect(await notice.textContent()).toMatch(new RegExp(`The field log has moved this forecast on\\..*P80 finish ${p80}.*Below is the plan as run on`));
    // The plan run's own card says what it is.
    await page.getByRole("heading", { name: "Plan run", level: 2 }).waitFor();
    // Its holiday trade-off weighs the whole plan; the executive (who runs no plans) is told what weighs the rest.
    expect(await page.getByTestId("tradeoff-note").textContent()).toBe(
      "On a job under way this weighs the whole plan from its start date, holidays already past included. A plan search from the field log weighs it for the rest of the job.",
    );
    expect(await seriousA11yViolations(page)).toEqual([]);
    // The owner brief of the plan leads with the same re-forecast, with nothing to click.
    const planUrl = page.url();
    await page.goto(`${planUrl}/brief`);
    const printed = page.getByTestId("newer-reforecast");
    await printed.waitFor();
    expect(await printed.textContent()).toMatch(new RegExp(`P80 finish ${p80}`));
    expect(await printed.getByRole("link").count()).toBe(0);
    // Its big figures are the re-forecast's too (they were the plan run's, under a notice saying otherwise).
    const answer = page.getByTestId("brief-answer");
    expect(await answer.getByRole("heading").textContent()).toMatch(/^Finish dates re-forecast from the field log as of \d{1,2} \w{3} \d{4} \([\d,]+ iterations, run .+\)$/);
    expect(await answer.textContent()).toContain(`P80 finish${p80}`);
    expect(await page.getByTestId("brief-iterations").textContent()).toContain("Below is the plan run, which knows nothing of the work done since. ");
    await page.goto(planUrl);
    await notice.getByRole("link", { name: "Open the field log and its forecasts" }).click();
    await page.waitForURL(/\/progress$/);
    await context.close();
  });

  it("is chosen on the project page by the project's administrator", async () => {
    const { context, page } = await signedIn(browser(), "scheduler");
    const cookie = await cookieHeader(context);
    const name = `Avocet Slough Bridge ${Date.now()}`;
    const project = await call("/api/projects", { method: "POST", cookie, body: { name, structureName: "Avocet Slough Bridge", deckLengthFt: 700, startStationFt: 0, lanes: "L1, L2" } });
    expect(project.status).toBe(201);
    const ids: Record<string, string> = {};
    for (const plan of ["Nights only", "Weekend closures"]) {
      const definition = templateScenario(plan, { deckLengthFt: 700, startStationFt: 0, lanes: ["L1", "L2"] }, "2027-04-05");
      const made = await call(`/api/projects/${project.body.id}/scenarios`, { method: "POST", cookie, body: { name: plan, definition } });
      expect(made.status).toBe(201);
      ids[plan] = made.body.id;
    }
    await page.goto(`${APP_URL}/projects/${project.body.id}`);
    const section = page.getByTestId("plan-of-record");
    expect(await section.textContent()).toContain("No plan of record chosen yet.");
    await section.getByLabel("Choose a scenario").selectOption({ label: "Weekend closures" });
    await section.getByRole("button", { name: "Make it the plan of record" }).click();
    await expect.poll(() => section.textContent()).toContain("Weekend closures: not run yet.");
    await expect.poll(() => page.getByRole("row", { name: /Weekend closures/ }).textContent()).toContain("Plan of record");
    expect(await page.getByRole("row", { name: /Nights only/ }).textContent()).not.toContain("Plan of record");
    // Each member may ask for an e-mail with each new forecast of it: saved as ticked, kept on reload.
    const alerts = page.getByTestId("forecast-alerts");
    await alerts.getByLabel("E-mail me each new forecast of the plan of record").check();
    await alerts.getByText("Forecast e-mails on.").waitFor();
    // Its administrators can have it re-forecast each morning without anyone pressing a button; the words say when
    // and in whose name.
    const daily = page.getByTestId("daily-reforecast");
    expect(await daily.textContent()).toContain("Re-forecast by hand only: someone presses Re-forecast on the plan's Field log.");
    await daily.getByLabel("Re-forecast the plan of record each morning").check();
    await daily.getByLabel("After").selectOption({ label: "05:00" });
    await daily.getByRole("button", { name: "Save" }).click();
    await expect.poll(() => daily.textContent()).toContain("Re-forecast each morning after 05:00 (the plan's time zone) from the field log as of the day before");
    expect(await daily.textContent()).toContain("set up by Marco Ilves, in whose name it runs");
    expect(await seriousA11yViolations(page)).toEqual([]);
    await screenshot(page, "plan-of-record-daily-reforecast");
    await page.reload();
    expect(await page.getByLabel("E-mail me each new forecast of the plan of record").isChecked()).toBe(true);
    expect(await page.getByLabel("Re-forecast the plan of record each morning").isChecked()).toBe(true);
    expect(await page.getByLabel("After").inputValue()).toBe("5");
    // The Members page says who is sent what from the project.
    await page.goto(`${APP_URL}/projects/${project.body.id}/members`);
    const mail = page.getByTestId("project-mail");
    expect(await mail.textContent()).toContain("Each new forecast of the plan of recordTo Marco Ilves.");
    expect(await mail.textContent()).toContain("Week ahead, dailyNot set up on any scenario.");
    // The plan's Field log says so beside its Re-forecast button; another scenario's does not.
    await page.goto(`${APP_URL}/scenarios/${ids["Weekend closures"]}/progress`);
    expect(await page.getByTestId("daily-reforecast-note").textContent()).toMatch(/^This scenario is the project's plan of record, re-forecast each morning after 05:00 \(the plan's time zone\)/);
    await page.goto(`${APP_URL}/scenarios/${ids["Nights only"]}/progress`);
    await page.getByRole("heading", { name: "Re-forecast and drift" }).waitFor();
    expect(await page.getByTestId("daily-reforecast-note").count()).toBe(0);
    await page.goto(`${APP_URL}/projects/${project.body.id}`);
    // The scenario's own page says so beside its name.
    await page.getByRole("row", { name: /Weekend closures/ }).getByRole("link", { name: "Weekend closures" }).click();
    await page.getByRole("heading", { name: "Weekend closures", level: 1 }).waitFor();
    expect(await page.locator("header").getByText("Plan of record", { exact: true }).count()).toBe(1);

    await page.goto(`${APP_URL}/projects`);
    expect(await page.getByRole("link", { name: new RegExp(name) }).textContent()).toContain("Weekend closures: not run yet.");
    await context.close();
  });
});
