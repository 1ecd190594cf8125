import { expect, test } from "@playwright/test";
import { AuditApi } from "./pages/audit";
import { SignInPage } from "./pages/session";

const ATTACKER = "mallow@evil.example";

test("security -- a cross-site text/plain POST with the owner's cookie is refused (403) and invites nobody", async ({
  page,
}) => {
  await new SignInPage(page).signInAs("owner");
  // What a page on another site can send without asking the browser: a "simple" POST with the cookie attached.
  const attack = await page.request.post("/api/team/invitations", {
    headers: { origin: "http://evil.example", "content-type": "text/plain" },
    data: JSON.stringify({ email: ATTACKER, role: "owner" }),
  });
  expect(attack.status()).toBe(403);
  expect((await attack.json()).error.message).toContain("http://evil.example");

  for (const [path, body] of [
    ["/api/keys", { name: "stolen" }],
    ["/api/fields", { name: "Evil field" }],
  ] as const) {
    const r = await page.request.post(path, {
      headers: { origin: "http://evil.example", "content-type": "application/json" },
      data: body,
    });
    expect(r.status(), path).toBe(403);
  }

  const team = await (await page.request.get("/api/team")).json();
  expect(JSON.stringify(team)).not.toContain(ATTACKER);
});

test("security -- the product's own page sending text/plain to the API gets 415 asking for JSON", async ({ page }) => {
  await new SignInPage(page).signInAs("owner");
  const answer = await page.evaluate(async () => {
    const r = await fetch("/api/team/invitations", {
      method: "POST",
      body: JSON.stringify({ email: "wren@kestrelfen.example", role: "grower" }),
    });
    return { status: r.status, body: await r.json() };
  });
  expect(answer.status).toBe(415);
  expect(answer.body.error.message).toContain("application/json");
});

test("security -- pages, JSON and file downloads carry the security headers", async ({ page }) => {
  await new SignInPage(page).signInAs("technician");
  const home = await page.goto("/fields");
  const fields = await page.request.get("/api/fields");
  const api = new AuditApi(page);
  const dataset = await api.upload(await api.fieldId("Willow Strip"), "survey");
  const raw = await page.request.get(`/api/datasets/${dataset.id}/file`);
  expect(raw.status()).toBe(200);
  for (const [what, headers] of [
    ["page", home!.headers()],
    ["JSON", fields.headers()],
    ["raw file", raw.headers()],
  ] as const) {
    expect(headers["x-content-type-options"], what).toBe("nosniff");
    expect(headers["x-frame-options"], what).toBe("DENY");
    expect(headers["referrer-policy"], what).toBe("strict-origin-when-cross-origin");
    expect(headers["content-security-policy"], what).toContain("frame-ancestors 'none'");
  }
});

test("security -- thirty wrong passwords, each with a forged X-Forwarded-For, meet a wait (429) by the sixth", async ({
  request,
  baseURL,
}) => {
  const statuses: number[] = [];
  for (let i = 0; i < 30; i++) {
    const r = await request.post("/api/auth/sign-in/email", {
      headers: { origin: baseURL!, "x-forwarded-for": `10.77.${i}.1` },
      data: { email: "nobody@kestrelfen.example", password: `guess-number-${i}` },
    });
    statuses.push(r.status());
  }
  expect(statuses.slice(0, 5)).toEqual([401, 401, 401, 401, 401]);
  expect(statuses.slice(5).every((s) => s === 429)).toBe(true);
});
