/** Page object: one scenario, its tabs (Outlook, Plan, Field log, Week ahead, Plan search, Field data, Share) and the plan editor's sections. */
import type { Page } from "playwright-core";
import { APP_URL } from "../../helpers/app";

export type ScenarioTab = "outlook" | "plan" | "lookAhead" | "progress" | "search" | "data" | "share" | "brief";
const TAB_PATH: Record<ScenarioTab, string> = { outlook: "", plan: "/plan", lookAhead: "/look-ahead", progress: "/progress", search: "/search", data: "/data", share: "/share", brief: "/brief" };
const TAB_LABEL: Partial<Record<ScenarioTab, string>> = { outlook: "Outlook", plan: "Plan", lookAhead: "Week ahead", progress: "Field log", search: "Plan search", data: "Field data", share: "Share" };
export type PlanSection = "sequence" | "stages" | "crews" | "calendar" | "weather" | "traffic";

export class ScenarioPage {
  constructor(
    readonly page: Page,
    readonly scenarioId: string,
  ) {}

  url(tab: ScenarioTab = "outlook") {
    return `${APP_URL}/scenarios/${this.scenarioId}${TAB_PATH[tab]}`;
  }

  /** Opens a tab by its address; returns the HTTP answer (403 for a role the page is not for). */
  async open(tab: ScenarioTab = "outlook") {
    return this.page.goto(this.url(tab));
  }

  /** The tab's link in the scenario's tab bar (absent for a role that may not open it). */
  tab(tab: ScenarioTab) {
    return this.page.getByRole("navigation", { name: "Scenario sections" }).getByRole("link", { name: TAB_LABEL[tab] ?? tab, exact: true });
  }

  // ---- Plan tab ----
  async openPlanSection(section: PlanSection) {
    await this.page.getByTestId(`section-${section}`).click();
  }

  /** A plan field by its form path, e.g. `operations.4.rate.dist.mode`. */
  field(path: string) {
    return this.page.locator(`[id="${path}"]`);
  }

  async save() {
    await this.page.getByTestId("save-scenario").click();
  }

  problems() {
    return this.page.getByTestId("plan-problems");
  }
}
