import "server-only";
import { eq } from "drizzle-orm";
import type { DB } from "@/db/client";
import { organization, user } from "@/db/schema";

export function slugFor(name: string, suffix: string): string {
  const base = name
    .toLowerCase()
    .normalize("NFKD")
    .replace(/[^a-z0-9]+/g, "-")
    .replace(/^-|-$/g, "")
    .slice(0, 40);
  return `${base || "org"}-${suffix}`;
}

export async function getOrganisationBySlug(db: DB, { slug }: { slug: string }) {
  const [row] = await db
    .select({ id: organization.id, name: organization.name })
    .from(organization)
    .where(eq(organization.slug, slug));
  return row ?? null;
}

/** Whether any account exists yet (the first one may always set up its organisation). */
export async function anyAccountExists(db: DB): Promise<boolean> {
  const rows = await db.select({ id: user.id }).from(user).limit(1);
  return rows.length > 0;
}

/** Undo a half-finished sign-up (user created, organisation not). */
export async function deleteUserById(db: DB, { userId }: { userId: string }) {
  await db.delete(user).where(eq(user.id, userId));
}
