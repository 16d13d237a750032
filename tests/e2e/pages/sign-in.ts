/** Page object: the sign-in page, and a signed-in browser context for a demo role. Written once, used by every e2e test. */
import type { Browser, BrowserContext, Page } from "playwright-core";
import { APP_URL, DEMO_PASSWORD, demoEmail, type DemoRole } from "../../helpers/app";

export class SignInPage {
  constructor(readonly page: Page) {}

  async goto() {
    await this.page.goto(`${APP_URL}/signin`);
  }

  /** Fills the form and submits; does not wait for where it lands (a wrong password stays here). */
  async signIn(email: string, password = DEMO_PASSWORD) {
    await this.goto();
    await this.page.getByLabel("E-mail").fill(email);
    await this.page.getByLabel("Password").fill(password);
    await this.page.getByRole("button", { name: "Sign in" }).click();
  }

  /** Signs in and waits for the project list. */
  async signInAs(role: DemoRole) {
    await this.signIn(demoEmail(role));
    await this.page.waitForURL(`${APP_URL}/projects`);
  }

  error(text: string) {
    return this.page.getByRole("alert").filter({ hasText: text });
  }
}

/** A fresh browser context signed in as `role`, on the project list. */
export async function signedIn(browser: Browser, role: DemoRole, width = 1280, options: { timezoneId?: string } = {}): Promise<{ context: BrowserContext; page: Page }> {
  const context = await browser.newContext({ viewport: { width, height: 900 }, ...options });
  const page = await context.newPage();
  await new SignInPage(page).signInAs(role);
  return { context, page };
}

/** The browser context's cookies as a Cookie header, to call the API as the person signed in there. */
export async function cookieHeader(context: BrowserContext): Promise<string> {
  return (await context.cookies()).map((c) => `${c.name}=${c.value}`).join("; ");
}
