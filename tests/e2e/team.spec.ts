import { test, expect } from "@playwright/test";
import { SignInPage, demoPerson } from "./pages/session";
import { Outbox } from "./pages/review";

test.describe.configure({ mode: "serial" });

const INVITEE = { name: "Wren Talbot", email: "wren@kestrelfen.example", password: "wren-fen-2026" };

test("team -- owner invites a grower; the e-mail arrives; the invitee sets a password and lands on the grower home", async ({
  page,
  browser,
}) => {
  test.setTimeout(120_000);
  await new SignInPage(page).signInAs("owner");
  await page.goto("/team");
  await expect(page.getByTestId("outbox-note")).toBeVisible();
  await page.getByLabel("E-mail", { exact: true }).fill(INVITEE.email);
  await page.getByLabel("Role", { exact: true }).selectOption({ label: "Grower" });
  await page.getByRole("button", { name: "Send invitation" }).click();
  await expect(page.getByTestId("team-notice")).toHaveText(
    `Invitation e-mailed to ${INVITEE.email}. It works for 7 days.`,
  );
  await expect(page.getByTestId("invitations-table").locator(`tr[data-email="${INVITEE.email}"]`)).toHaveAttribute(
    "data-status",
    "pending",
  );

  const mail = await new Outbox(browser).waitFor(INVITEE.email, "Join Kestrel Fen Growers on Plotproof");
  expect(mail.text).toContain(
    `${demoPerson("owner").name} has invited you to join Kestrel Fen Growers on Plotproof as Grower.`,
  );
  expect(new URL(mail.link).pathname).toMatch(/^\/invite\/\S+$/);

  // The invitee has no account and no session.
  const context = await browser.newContext();
  const invitee = await context.newPage();
  await invitee.goto(mail.link);
  await expect(invitee.getByTestId("invitation")).toContainText(`invited ${INVITEE.email} as Grower`);
  const form = invitee.getByTestId("invite-new-account");
  await form.getByLabel("Your name").fill(INVITEE.name);
  await form.getByLabel("Choose a password").fill(INVITEE.password);
  await form.getByLabel("The same password again").fill("something-else-1");
  await form.getByRole("button", { name: "Set password and join" }).click();
  await expect(form.locator('[data-field-error="confirm"]')).toHaveText("The two passwords differ.");
  await form.getByLabel("Choose a password").fill(INVITEE.password);
  await form.getByLabel("The same password again").fill(INVITEE.password);
  await form.getByRole("button", { name: "Set password and join" }).click();
  await expect(invitee.getByTestId("home-grower")).toBeVisible();
  await expect(invitee.getByTestId("viewer")).toHaveText(`${INVITEE.name} · Grower · Kestrel Fen Growers`);

  // The link is used up; the owner's list says so.
  await invitee.goto(mail.link);
  await expect(invitee.getByTestId("invitation-problem")).toContainText("already been accepted");
  await context.close();
  await page.reload();
  await expect(page.getByTestId("invitations-table").locator(`tr[data-email="${INVITEE.email}"]`)).toHaveAttribute(
    "data-status",
    "accepted",
  );
  await expect(page.getByTestId("team-table").locator(`tr[data-email="${INVITEE.email}"]`)).toContainText(INVITEE.name);
});

test("team -- the owner changes the new member's role, then removes them; their session stops working", async ({
  page,
  browser,
}) => {
  const context = await browser.newContext();
  const member = await context.newPage();
  await member.goto("/login");
  await new SignInPage(member).signIn(INVITEE.email, INVITEE.password);
  await expect(member.getByTestId("home-grower")).toBeVisible();

  await new SignInPage(page).signInAs("owner");
  await page.goto("/team");
  const row = page.getByTestId("team-table").locator(`tr[data-email="${INVITEE.email}"]`);
  await row.getByLabel(`Role of ${INVITEE.name}`).selectOption({ label: "Technician" });
  await expect(page.getByTestId("team-notice")).toHaveText(`${INVITEE.name} is now Technician.`);
  await member.goto("/");
  await expect(member.getByTestId("home-technician")).toBeVisible();

  page.once("dialog", (d) => void d.accept());
  await row.getByRole("button", { name: "Remove" }).click();
  await expect(page.getByTestId("team-notice")).toHaveText(`${INVITEE.name} was removed.`);
  await expect(row).toHaveCount(0);
  const me = await member.request.get("/api/me");
  expect(me.status()).toBe(401);
  await context.close();
});
