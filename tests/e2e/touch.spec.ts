import path from "node:path";
import { test, expect, type Page } from "@playwright/test";
import { SignInPage, demoPerson } from "./pages/session";
import { DEMO_FILES, AuditResultPage } from "./pages/audit";
import { DEMO_PASSWORD } from "@/lib/demo/farm";

// The technician at the edge of a field: a tablet held in one hand, fingers (taps) only, then the keyboard and the
// bright-light option as someone relying on them uses them.
test.describe.configure({ mode: "serial" });

const TABLET = { width: 820, height: 1180 };
let resultUrl = "";
let mapUrl = "";
const PHONE = { width: 390, height: 844 };

async function noSidewaysScroll(page: Page) {
  const { scrollWidth, innerWidth } = await page.evaluate(() => ({
    scrollWidth: document.documentElement.scrollWidth,
    innerWidth: window.innerWidth,
  }));
  expect(scrollWidth, page.url()).toBeLessThanOrEqual(innerWidth);
}

/** Choose a demo file from the upload page's picker by tapping it, save, accept the warnings if any, wait until kept. */
async function uploadByTouch(page: Page, kind: keyof typeof DEMO_FILES) {
  const picker = page.getByTestId("drop-zone").locator("label");
  const box = await picker.boundingBox();
  // A file picker for a thumb: the whole box is the target, far over 44 px high.
  expect(box!.height).toBeGreaterThanOrEqual(120);
  const [chooser] = await Promise.all([page.waitForEvent("filechooser"), picker.tap()]);
  await chooser.setFiles(path.resolve(DEMO_FILES[kind].file));
  await expect(page.getByTestId("preview-table")).toBeVisible();
  await noSidewaysScroll(page);
  await page.getByRole("button", { name: "Check and save the file" }).tap();
  const warnings = page.getByTestId("upload-warnings");
  const saved = page.getByTestId("upload-saved");
  await expect(warnings.or(saved)).toBeVisible({ timeout: 30_000 });
  if (await warnings.isVisible()) {
    await page.getByLabel("I have read these warnings and want to save the file anyway").tap();
    await page.getByRole("button", { name: "Save with these warnings" }).tap();
  }
  await expect(saved).toBeVisible({ timeout: 30_000 });
  // Progress in plain figures: both steps at 100 %.
  await expect(page.getByRole("progressbar", { name: "Sending the file" })).toHaveAttribute("aria-valuenow", "100");
  await expect(page.getByTestId("upload-server")).toHaveAttribute("aria-valuenow", "100");
}

test("touch -- on a tablet the technician signs in, uploads both files, runs an audit and opens its map by tapping", async ({
  browser,
}) => {
  test.setTimeout(240_000);
  const context = await browser.newContext({ viewport: TABLET, hasTouch: true, isMobile: true });
  const page = await context.newPage();
  await page.goto("/login");
  await page.getByLabel("E-mail").tap();
  await page.getByLabel("E-mail").fill(demoPerson("technician").email);
  await page.getByLabel("Password").tap();
  await page.getByLabel("Password").fill(DEMO_PASSWORD);
  await page.getByRole("button", { name: "Sign in" }).tap();
  await expect(page.getByTestId("home-technician")).toBeVisible();

  await page.getByRole("navigation", { name: "Main" }).getByRole("link", { name: "Fields" }).tap();
  await page.getByTestId("field-list").getByRole("link", { name: "Long Acre" }).tap();
  await expect(page.getByRole("heading", { level: 1 })).toContainText("Long Acre");
  const fieldUrl = page.url();

  await page.getByRole("link", { name: "Upload as-planted records" }).tap();
  await uploadByTouch(page, "planted");
  await page.goto(fieldUrl);
  await page.getByRole("link", { name: "Upload survey" }).tap();
  await uploadByTouch(page, "survey");

  await page.goto(fieldUrl);
  await page.getByRole("link", { name: "New audit" }).tap();
  await expect(page.getByTestId("new-audit-form")).toBeVisible();
  await page.getByLabel("Title").tap();
  await page.getByLabel("Title").fill("Tablet check");
  for (const label of ["As-planted records", "Survey of checkpoints", "Tolerance profile"]) {
    const select = page.getByLabel(label);
    await expect(select.locator("option:not([value=''])").first()).toBeAttached();
    const value = await select.locator("option:not([value=''])").first().getAttribute("value");
    await select.selectOption(value!);
  }
  const run = page.getByRole("button", { name: "Run the audit" });
  expect((await run.boundingBox())!.height).toBeGreaterThanOrEqual(44);
  await run.tap();

  const result = new AuditResultPage(page);
  await result.waitUntilComputed();
  await noSidewaysScroll(page);
  // The verdict is on the first screen.
  const verdict = await result.verdict.boundingBox();
  expect(verdict!.y).toBeLessThan(TABLET.height);

  resultUrl = page.url();
  await page.getByTestId("map-link").tap();
  await expect(page.getByTestId("field-map")).toBeVisible({ timeout: 30_000 });
  mapUrl = page.url();
  await noSidewaysScroll(page);
  // The map first, its filters behind one button below it.
  const frame = (await page.getByTestId("map-frame").boundingBox())!;
  const filters = page.getByTestId("map-filters-button");
  expect((await filters.boundingBox())!.y).toBeGreaterThan(frame.y + frame.height - 1);
  await expect(page.getByTestId("map-controls")).toBeHidden();
  await filters.tap();
  await expect(filters).toHaveAttribute("aria-expanded", "true");
  await expect(page.getByTestId("map-controls")).toBeVisible();
  await expect(page.getByText("Tap or click a plant for its full record")).toBeVisible();
  await context.close();
});

test("keyboard -- Escape on the map's detail panel gives focus back to the control that opened it", async ({
  page,
}) => {
  expect(mapUrl, "the map of the audit made by tapping").not.toBe("");
  await new SignInPage(page).signInAs("technician");
  await page.goto(mapUrl);
  const next = page.getByTestId("next-out");
  await expect(next).toBeEnabled({ timeout: 30_000 });
  await next.focus();
  await page.keyboard.press("Enter");
  const details = page.getByTestId("map-details");
  await expect(details).toBeVisible();
  await expect(details.getByRole("heading", { name: "Checkpoint" })).toBeFocused();
  await page.keyboard.press("Escape");
  await expect(details).toHaveCount(0);
  await expect(next).toBeFocused();
  // The same from the Close button, by touch.
  await next.click();
  await details.getByRole("button", { name: "Close" }).click();
  await expect(next).toBeFocused();
});

// The README's pictures of a phone (SCREENSHOTS=1 npx playwright test tests/e2e/touch.spec.ts rewrites them).
test("screenshots -- the result page and the map on a phone", async ({ browser }) => {
  test.skip(!process.env.SCREENSHOTS, "only when asked for with SCREENSHOTS=1");
  const context = await browser.newContext({ viewport: PHONE, hasTouch: true, isMobile: true, deviceScaleFactor: 2 });
  const page = await context.newPage();
  await new SignInPage(page).signInAs("technician");
  await page.goto(resultUrl);
  await new AuditResultPage(page).waitUntilComputed();
  await page.screenshot({ path: "docs/screenshots/result-phone.png" });
  await page.goto(mapUrl);
  await page.waitForFunction(
    () => Number(document.querySelector<HTMLElement>('[data-testid="field-map"]')?.dataset.draws) > 0,
  );
  await page.getByTestId("map-frame").scrollIntoViewIfNeeded();
  await page.screenshot({ path: "docs/screenshots/map-phone.png" });
  await context.close();
});

test("touch -- on a phone the main navigation is one Menu button; Escape closes it and focus goes back to it", async ({
  browser,
}) => {
  const context = await browser.newContext({ viewport: PHONE, hasTouch: true, isMobile: true });
  const page = await context.newPage();
  await new SignInPage(page).signInAs("owner");
  const nav = page.getByRole("navigation", { name: "Main" });
  await expect(nav).toBeHidden();
  const menu = page.getByRole("button", { name: "Menu" });
  expect((await menu.boundingBox())!.height).toBeGreaterThanOrEqual(44);
  await menu.tap();
  await expect(menu).toHaveAttribute("aria-expanded", "true");
  await expect(nav).toBeVisible();
  for (const link of await nav.getByRole("link").all())
    expect((await link.boundingBox())!.height, (await link.textContent()) ?? "").toBeGreaterThanOrEqual(44);
  await page.keyboard.press("Escape");
  await expect(nav).toBeHidden();
  await expect(menu).toBeFocused();
  await menu.tap();
  await nav.getByRole("link", { name: "Team" }).tap();
  await expect(page).toHaveURL(/\/team$/);
  await expect(nav).toBeHidden();
  await noSidewaysScroll(page);
  await context.close();
});

test("keyboard -- the first Tab reaches the skip link, which moves focus to the page's content", async ({ page }) => {
  await new SignInPage(page).signInAs("technician");
  await page.goto("/fields");
  await page.keyboard.press("Tab");
  const skip = page.getByRole("link", { name: "Skip to the page’s content" });
  await expect(skip).toBeFocused();
  await expect(skip).toBeVisible();
  await page.keyboard.press("Enter");
  await expect(page.locator("main#main")).toBeFocused();
});

test("keyboard -- the focus ring is 3 px of deep stake, and a focused control shows it", async ({ page }) => {
  await page.goto("/login");
  await page.getByLabel("E-mail").focus();
  const ring = await page.getByLabel("E-mail").evaluate((el) => {
    const s = getComputedStyle(el);
    return { style: s.outlineStyle, width: s.outlineWidth, colour: s.outlineColor };
  });
  expect(ring).toEqual({ style: "solid", width: "3px", colour: "rgb(156, 107, 12)" });
});

test("high contrast -- the switch darkens grey text, is remembered after a reload and can be turned off", async ({
  page,
}) => {
  await new SignInPage(page).signInAs("technician");
  await page.goto("/fields");
  const faint = page.getByTestId("field-list").locator("thead");
  const colour = () => faint.evaluate((el) => getComputedStyle(el).color);
  expect(await colour()).toBe("rgb(92, 105, 98)");
  const toggle = page.getByRole("button", { name: "High contrast" });
  await expect(toggle).toHaveAttribute("aria-pressed", "false");
  await toggle.click();
  await expect(toggle).toHaveAttribute("aria-pressed", "true");
  await expect(page.locator("html")).toHaveClass(/high-contrast/);
  expect(await colour()).toBe("rgb(29, 42, 36)");
  await page.reload();
  await expect(page.locator("html")).toHaveClass(/high-contrast/);
  await expect(page.getByRole("button", { name: "High contrast" })).toHaveAttribute("aria-pressed", "true");
  expect(await colour()).toBe("rgb(29, 42, 36)");
  await page.getByRole("button", { name: "High contrast" }).click();
  await expect(page.locator("html")).not.toHaveClass(/high-contrast/);
  await page.reload();
  expect(await colour()).toBe("rgb(92, 105, 98)");
});
