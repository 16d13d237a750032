/** Page objects: one saved plan search (signed in) with its link sharing, and the public page a search link opens. */
import type { Page } from "playwright-core";
import { APP_URL } from "../../helpers/app";

export class SearchPage {
  constructor(
    readonly page: Page,
    readonly scenarioId: string,
    readonly searchId: string,
  ) {}

  async open() {
    return this.page.goto(`${APP_URL}/scenarios/${this.scenarioId}/search/${this.searchId}`);
  }

  /** The plans table (drawn once the search has loaded). */
  table() {
    return this.page.getByTestId("search-table");
  }

  /** Creates a read-only link with a label through the form; returns the address shown once. */
  async createShareLink(label: string): Promise<string> {
    await this.page.getByLabel("Label (who it is for)").fill(label);
    await this.page.getByTestId("create-share-link").click();
    return this.page.getByTestId("share-link-url").inputValue();
  }

  /** Asks to revoke the link with this label and confirms in the dialog. */
  async revoke(label: string) {
    await this.page.getByRole("button", { name: `Revoke link ${label}` }).click();
    await this.page.getByTestId("revoke-dialog").waitFor();
    await this.page.getByTestId("revoke-dialog-confirm").click();
  }
}

export class SharedSearchPage {
  constructor(readonly page: Page) {}

  async open(url: string) {
    return this.page.goto(new URL(new URL(url).pathname, APP_URL).toString());
  }

  title() {
    return this.page.getByTestId("shared-search-title");
  }

  table() {
    return this.page.getByTestId("search-table");
  }

  /** Rows of the plans table (header excluded). */
  rows() {
    return this.table().locator("tbody tr");
  }

  notAvailable() {
    return this.page.getByTestId("shared-not-found");
  }
}
