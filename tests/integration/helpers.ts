import { openDb, setDbForTests, type DB } from "@/db/client";

/** One in-memory database per test file, with the real migrations, used by the app's own getDb(). */
export async function useMemoryDb(): Promise<DB> {
  process.env.BETTER_AUTH_SECRET ??= "test-secret-test-secret-test-secret-0123";
  process.env.BETTER_AUTH_URL ??= "http://localhost:3000";
  process.env.AUTH_SIGNIN_PER_MINUTE ??= "1000";
  const db = await openDb("memory://");
  setDbForTests(db);
  return db;
}

/** Sign in through better-auth and return the Cookie header a browser would send. */
export async function cookieFor(email: string, password: string): Promise<string> {
  const { getAuth } = await import("@/lib/server/auth");
  const res = await (await getAuth()).api.signInEmail({ body: { email, password }, asResponse: true });
  if (!res.ok) throw new Error(`sign-in failed for ${email}: ${res.status}`);
  return res.headers
    .getSetCookie()
    .map((c) => c.split(";")[0])
    .join("; ");
}

export function req(url: string, init: RequestInit & { cookie?: string } = {}): Request {
  const headers = new Headers(init.headers);
  if (init.cookie) headers.set("cookie", init.cookie);
  if (init.body) headers.set("content-type", "application/json");
  return new Request(`http://localhost:3000${url}`, { ...init, headers });
}

export const ctx = <P>(params: P) => ({ params: Promise.resolve(params) });
