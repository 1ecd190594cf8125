import { expect, type Browser, type Page } from "@playwright/test";
import { SignInPage, type demoPerson } from "./session";

/**
 * The demo's outbox (/outbox) as the owner sees it: the fake SMTP server's catch. Opens its own
 * browser context so the caller's session is left alone.
 */
export class Outbox {
  constructor(private readonly browser: Browser) {}

  /** Wait until a message to `to` whose subject matches arrives; return its text and the first link into the app. */
  async waitFor(to: string, subject: RegExp | string): Promise<{ subject: string; text: string; link: string }> {
    const context = await this.browser.newContext();
    const page = await context.newPage();
    try {
      await new SignInPage(page).signInAs("owner");
      const message = page
        .getByTestId("outbox-message")
        .filter({ has: page.locator("summary", { hasText: subject }) })
        .and(page.locator(`[data-to*="${to}"]`))
        .first();
      await expect(async () => {
        await page.goto("/outbox");
        await expect(message).toBeVisible({ timeout: 1000 });
      }).toPass({ timeout: 20_000 });
      await message.locator("summary").click();
      const body = message.getByTestId("outbox-body");
      const text = (await body.textContent()) ?? "";
      const link = await body.locator("a").first().getAttribute("href");
      expect(link, "a link in the e-mail").toBeTruthy();
      return { subject: (await message.locator("summary span").first().textContent()) ?? "", text, link: link! };
    } finally {
      await context.close();
    }
  }
}

/** A fresh signed-in page for another demo person (own cookies). */
export async function pageFor(browser: Browser, role: Parameters<typeof demoPerson>[0]): Promise<Page> {
  const context = await browser.newContext();
  const page = await context.newPage();
  await new SignInPage(page).signInAs(role);
  return page;
}

/** /audits/:id/review */
export class ReviewPage {
  constructor(private readonly page: Page) {}
  get bar() {
    return this.page.getByTestId("review-bar");
  }
  get badge() {
    return this.bar.getByTestId("state-badge");
  }
  get signoffForm() {
    return this.page.getByTestId("signoff-form");
  }
  get record() {
    return this.page.getByTestId("signoff-record");
  }

  async open(auditId: string) {
    await this.page.goto(`/audits/${auditId}/review`);
    await expect(this.page.getByTestId("review-workspace")).toBeVisible();
  }

  async submit(note: string) {
    await this.page.getByTestId("review-bar-submit").click();
    await this.bar.getByLabel("Note for the QA lead (optional)").fill(note);
    await this.bar.getByRole("button", { name: "Submit", exact: true }).click();
    await expect(this.badge).toHaveAttribute("data-state", "submitted");
  }

  async signOff(o: { precisionMm: string; controlMarkNote: string; comment: string; name: string }) {
    const f = this.signoffForm;
    await f.getByRole("checkbox", { name: /Enough checkpoints/ }).check();
    await f.getByRole("checkbox", { name: /Survey instrument at least 3/ }).check();
    // The demo survey states its precision (precision_m = 2 mm), so the form takes it from the file.
    const precision = f.getByLabel("Instrument's stated horizontal precision (mm)");
    if (await precision.count()) await precision.fill(o.precisionMm);
    else await expect(f).toContainText(`The survey file states ${o.precisionMm}.0 mm`);
    await f.getByRole("checkbox", { name: /Control mark checked/ }).check();
    await f.getByLabel("Which mark, and how far off (optional)").fill(o.controlMarkNote);
    await f.getByRole("checkbox", { name: /Right tolerance profile/ }).check();
    await f.getByLabel(/Why you accept it anyway/).fill(o.comment);
    await f.getByLabel(/Type your full name to sign/).fill(o.name);
    await f.getByRole("button", { name: /^Sign off/ }).click();
  }
}
