import pg from "pg";
import { openDb, openServerDb, setDbForTests, type DB } from "@/db/client";

/**
 * A fresh database on the PostgreSQL server of TEST_DATABASE_URL (its role may create databases): one per test file,
 * so files never see each other's rows. DATABASE_URL points at it, so the code under test is in server mode.
 */
async function freshServerDb(adminUrl: string): Promise<DB> {
  const name = `plotproof_t${process.pid}_${Math.random().toString(36).slice(2, 8)}`;
  const admin = new pg.Client({ connectionString: adminUrl });
  await admin.connect();
  try {
    await admin.query(`CREATE DATABASE ${name}`);
  } finally {
    await admin.end();
  }
  const url = new URL(adminUrl);
  url.pathname = `/${name}`;
  process.env.DATABASE_URL = url.toString();
  const db = await openServerDb(url.toString());
  // Audits are computed by the queue's workers in server mode: this test file's process takes its own jobs.
  const { startJobWorkers } = await import("@/lib/server/jobs/worker");
  await startJobWorkers();
  return db;
}

/**
 * One database per test file, with the real migrations, used by the app's own getDb(): in memory (embedded), or a
 * fresh one on a PostgreSQL server when TEST_DATABASE_URL is set (the server-mode run of tests/run-all.mjs).
 */
export async function useMemoryDb(): Promise<DB> {
  process.env.BETTER_AUTH_SECRET ??= "test-secret-test-secret-test-secret-0123";
  process.env.BETTER_AUTH_URL ??= "http://localhost:3000";
  process.env.AUTH_SIGNIN_PER_MINUTE ??= "1000";
  const adminUrl = process.env.TEST_DATABASE_URL;
  const db = adminUrl ? await freshServerDb(adminUrl) : await openDb("memory://");
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
