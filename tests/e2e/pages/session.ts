import { expect, type Page } from "@playwright/test";
import { DEMO_PASSWORD, DEMO_PEOPLE, OTHER_OWNER } from "@/lib/demo/farm";

export type DemoRole = (typeof DEMO_PEOPLE)[number]["role"];

export function demoPerson(role: DemoRole) {
  return DEMO_PEOPLE.find((p) => p.role === role)!;
}

export const otherOwner = OTHER_OWNER;

/** The sign-in page as a page object. */
export class SignInPage {
  constructor(private readonly page: Page) {}
  async open() {
    await this.page.goto("/login");
  }
  async signIn(email: string, password: string) {
    await this.page.getByLabel("E-mail").fill(email);
    await this.page.getByLabel("Password").fill(password);
    await this.page.getByRole("button", { name: "Sign in" }).click();
  }
  async signInAs(role: DemoRole) {
    await this.open();
    await this.signIn(demoPerson(role).email, DEMO_PASSWORD);
    await expect(this.page.getByTestId(`home-${role}`)).toBeVisible();
  }
}
