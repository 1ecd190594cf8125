import { beforeAll, describe, expect, it } from "vitest";
import type { DB } from "@/db/client";
import { forwardedForToPass, trustedProxyList } from "@/lib/server/http/peer-address.mjs";
import { useMemoryDb } from "./helpers";

let db: DB;
let createAuth: typeof import("@/lib/server/auth").createAuth;
let openBefore: boolean;
let openAfter: boolean;
const BASE = "http://localhost:3000";
const PERSON = { name: "Odile Marsh", email: "odile@kestrelfen.example", password: "marsh-fen-2026" };

beforeAll(async () => {
  db = await useMemoryDb();
  ({ createAuth } = await import("@/lib/server/auth"));
  const { signUpOpen } = await import("@/lib/server/onboarding");
  openBefore = await signUpOpen();
  const auth = createAuth(db, { baseURL: BASE, secret: "s".repeat(40), signInPerMinute: 1000 });
  await auth.api.signUpEmail({ body: PERSON });
  openAfter = await signUpOpen();
}, 60_000);

/** A sign-in POST as the HTTP server passes it on: the socket's address last in X-Forwarded-For. */
function signIn(password: string, headers: Record<string, string> = {}, email = PERSON.email) {
  return new Request(`${BASE}/api/auth/sign-in/email`, {
    method: "POST",
    headers: { "content-type": "application/json", origin: BASE, ...headers },
    body: JSON.stringify({ email, password }),
  });
}

describe("sign-in limits", () => {
  it("sign-in -- five wrong passwords in a row make the account wait, even for the right one; the wait ends", async () => {
    let clock = new Date("2026-12-03T08:00:00Z");
    const auth = createAuth(db, { baseURL: BASE, secret: "s".repeat(40), signInPerMinute: 1000, now: () => clock });
    const statuses: number[] = [];
    for (let i = 0; i < 6; i++) {
      const xff = forwardedForToPass(`198.51.100.${i + 1}`, undefined, trustedProxyList(""))!;
      statuses.push((await auth.handler(signIn("wrong-password", { "x-forwarded-for": xff }))).status);
    }
    expect(statuses).toEqual([401, 401, 401, 401, 401, 429]);
    const locked = await auth.handler(signIn(PERSON.password, { "x-forwarded-for": "198.51.100.77" }));
    expect(locked.status).toBe(429);
    expect(locked.headers.get("retry-after")).toBe("30");
    expect((await locked.json()).message).toContain("Try again in 30 s");

    clock = new Date(clock.getTime() + 31_000);
    const ok = await auth.handler(signIn(PERSON.password, { "x-forwarded-for": "198.51.100.77" }));
    expect(ok.status).toBe(200);
    // Success clears the run: one more mistake costs nothing.
    expect((await auth.handler(signIn("wrong-again", { "x-forwarded-for": "198.51.100.77" }))).status).toBe(401);
    expect((await auth.handler(signIn(PERSON.password, { "x-forwarded-for": "198.51.100.77" }))).status).toBe(200);
  });

  it("sign-in -- a forged X-Forwarded-For per attempt does not escape the address limit", async () => {
    const auth = createAuth(db, { baseURL: BASE, secret: "s".repeat(40), signInPerMinute: 10 });
    const none = trustedProxyList("");
    const statuses: number[] = [];
    for (let i = 0; i < 30; i++) {
      // Different unknown accounts, so only the address limit can stop them.
      const xff = forwardedForToPass("203.0.113.50", `10.9.${i}.1`, none)!;
      const res = await auth.handler(signIn("wrong-password", { "x-forwarded-for": xff }, `ghost${i}@evil.example`));
      statuses.push(res.status);
    }
    expect(statuses.slice(0, 10).every((s) => s === 401)).toBe(true);
    expect(statuses.slice(10).every((s) => s === 429)).toBe(true);
  });

  it("sign-in -- behind a trusted proxy the limit counts the client the proxy names", async () => {
    const auth = createAuth(db, {
      baseURL: BASE,
      secret: "s".repeat(40),
      signInPerMinute: 3,
      trustedProxies: ["10.0.0.5"],
    });
    const proxy = trustedProxyList("10.0.0.5");
    const fromClient = (client: string) => forwardedForToPass("10.0.0.5", client, proxy)!;
    const a = [];
    for (let i = 0; i < 4; i++)
      a.push(
        (await auth.handler(signIn("x", { "x-forwarded-for": fromClient("198.51.100.8") }, `p${i}@x.example`))).status,
      );
    expect(a).toEqual([401, 401, 401, 429]);
    // Another client behind the same proxy still gets in line.
    expect(
      (await auth.handler(signIn("x", { "x-forwarded-for": fromClient("198.51.100.9") }, "q@x.example"))).status,
    ).toBe(401);
  });
});

describe("auth over HTTP", () => {
  const auth = () => createAuth(db, { baseURL: BASE, secret: "s".repeat(40), signInPerMinute: 1000 });
  const post = (path: string, body: unknown, cookie?: string) =>
    new Request(`${BASE}/api/auth${path}`, {
      method: "POST",
      headers: { "content-type": "application/json", origin: BASE, ...(cookie ? { cookie } : {}) },
      body: JSON.stringify(body),
    });

  it("sign-up -- open for the first account of an empty install only (OPEN_SIGNUP unset)", () => {
    expect(openBefore).toBe(true);
    expect(openAfter).toBe(false);
  });

  it("auth -- better-auth's own sign-up and organisation endpoints answer 404 over HTTP", async () => {
    const a = auth();
    const signUp = await a.handler(
      post("/sign-up/email", { name: "Mallow", email: "m@evil.example", password: "p".repeat(12) }),
    );
    expect(signUp.status).toBe(404);
    const signedIn = await a.handler(signIn(PERSON.password, { "x-forwarded-for": "198.51.100.200" }));
    expect(signedIn.status).toBe(200);
    const cookie = signedIn.headers
      .getSetCookie()
      .map((c) => c.split(";")[0])
      .join("; ");
    const create = await a.handler(post("/organization/create", { name: "Shadow farm", slug: "shadow-farm" }, cookie));
    expect(create.status).toBe(404);
    const setActive = await a.handler(post("/organization/set-active", { organizationId: "x" }, cookie));
    expect(setActive.status).toBe(404);
    // What the product's pages use still works.
    const session = await a.handler(new Request(`${BASE}/api/auth/get-session`, { headers: { cookie } }));
    expect(session.status).toBe(200);
    expect((await session.json()).user.email).toBe(PERSON.email);
  });
});
