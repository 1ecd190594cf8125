import { expect, type Locator, type Page } from "@playwright/test";

/** The owner's API keys page as a page object. */
export class ApiKeysPage {
  constructor(private readonly page: Page) {}

  async open() {
    await this.page.goto("/settings/keys");
    await expect(this.page.getByRole("heading", { level: 1 })).toHaveText("API keys");
  }

  /** Create a key and return it as shown once on the page. */
  async create(name: string, opts: { scope: "Full" | "Upload only" | "Read only"; expiresOn?: string }) {
    const form = this.page.getByRole("form", { name: "Create an API key" });
    await form.getByLabel("Name").fill(name);
    await form.getByRole("radio", { name: opts.scope }).check();
    if (opts.expiresOn) await form.getByLabel("Stops working on").fill(opts.expiresOn);
    await form.getByRole("button", { name: "Create key" }).click();
    const key = this.page.getByTestId("new-api-key");
    await expect(key).toHaveText(/^plotkey_/);
    return (await key.textContent())!.trim();
  }

  row(name: string): Locator {
    return this.page.locator(`tr[data-key-name="${name}"]`);
  }
}
