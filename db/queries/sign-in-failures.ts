import "server-only";
import { eq } from "drizzle-orm";
import type { DB } from "@/db/client";
import { signInFailure } from "@/db/schema";
import type { FailureRecord } from "@/lib/security/sign-in-backoff";

export async function getSignInFailures(db: DB, { email }: { email: string }): Promise<FailureRecord | null> {
  const [row] = await db
    .select({
      failures: signInFailure.failures,
      lastFailedAt: signInFailure.lastFailedAt,
      lockedUntil: signInFailure.lockedUntil,
    })
    .from(signInFailure)
    .where(eq(signInFailure.email, email));
  return row ?? null;
}

export async function saveSignInFailures(db: DB, { email, record }: { email: string; record: FailureRecord }) {
  await db
    .insert(signInFailure)
    .values({ email, ...record })
    .onConflictDoUpdate({ target: signInFailure.email, set: { ...record } });
}

export async function clearSignInFailures(db: DB, { email }: { email: string }) {
  await db.delete(signInFailure).where(eq(signInFailure.email, email));
}
