import { test, expect } from "@playwright/test";
import { SignInPage } from "./pages/session";
import { AuditApi, ProfilesPage } from "./pages/audit";

const PROFILE = "In-row weeding around plants";

test("profiles -- QA lead edits a radial limit, and a taken name is refused", async ({ page }) => {
  await new SignInPage(page).signInAs("qa_lead");
  const api = new AuditApi(page);
  const before = (await api.profiles()).find((p) => p.name === PROFILE)!;
  expect(before.builtIn).toBe(true);

  const profiles = new ProfilesPage(page);
  await profiles.open();
  await expect(profiles.row(PROFILE).getByTestId("built-in-label")).toHaveText(
    "Starting values from common practice, not a standard",
  );
  const newMm = before.radialM !== null && Math.abs(before.radialM - 0.0125) < 1e-9 ? "11" : "12.5";
  await profiles.edit(PROFILE, { "Radial limit": newMm });
  await expect(page.getByTestId("profile-notice")).toHaveText(`Saved “${PROFILE}”.`);
  await expect(profiles.row(PROFILE).locator('[data-col="radial"]')).toHaveText(`${Number(newMm).toFixed(1)} mm`);
  const after = (await api.profiles()).find((p) => p.id === before.id)!;
  expect(after.radialM).toBeCloseTo(Number(newMm) / 1000, 9);
  expect(after.crossM).toBe(before.crossM);
  expect(after.requiredShare).toBe(before.requiredShare);

  // A name another profile already has: 409, shown on the name field, nothing saved.
  const other = (await api.profiles()).find((p) => p.id !== before.id)!;
  await profiles.edit(PROFILE, { Name: other.name });
  await expect(page.locator('[data-field-error="name"]')).toContainText("already has this name");
  await expect(page.locator("[data-form-error]")).toContainText("already exists");
  expect((await api.profiles()).filter((p) => p.name === other.name)).toHaveLength(1);

  // Put the starting value back so other tests see the seeded profile.
  const restore = await page.request.patch(`/api/profiles/${before.id}`, { data: { radialM: before.radialM } });
  expect(restore.status()).toBe(200);
});

test("profiles -- technician sees the limits but no edit controls, and the API refuses a change", async ({ page }) => {
  await new SignInPage(page).signInAs("technician");
  const profiles = new ProfilesPage(page);
  await profiles.open();
  await expect(profiles.row(PROFILE)).toBeVisible();
  await expect(profiles.row(PROFILE)).toContainText("mm");
  await expect(page.getByRole("button", { name: /^(Edit|Delete) / })).toHaveCount(0);
  await expect(page.getByRole("button", { name: "New profile" })).toHaveCount(0);

  const target = (await new AuditApi(page).profiles()).find((p) => p.name === PROFILE)!;
  const res = await page.request.patch(`/api/profiles/${target.id}`, { data: { radialM: 0.05 } });
  expect(res.status()).toBe(403);
  expect(await res.json()).toMatchObject({ error: { code: "forbidden" } });
  const unchanged = (await new AuditApi(page).profiles()).find((p) => p.id === target.id)!;
  expect(unchanged.radialM).toBe(target.radialM);
});
