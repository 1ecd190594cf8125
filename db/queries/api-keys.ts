import "server-only";
import { and, desc, eq, isNull } from "drizzle-orm";
import type { DB } from "@/db/client";
import { apiKey, user } from "@/db/schema";
import type { ApiKeyDto } from "@/lib/api-types";
import { logActivity } from "./activity";

export async function listApiKeys(db: DB, { orgId }: { orgId: string }): Promise<ApiKeyDto[]> {
  const rows = await db
    .select({
      id: apiKey.id,
      name: apiKey.name,
      prefix: apiKey.prefix,
      createdBy: user.name,
      createdAt: apiKey.createdAt,
      lastUsedAt: apiKey.lastUsedAt,
      revokedAt: apiKey.revokedAt,
    })
    .from(apiKey)
    .innerJoin(user, eq(user.id, apiKey.userId))
    .where(eq(apiKey.orgId, orgId))
    .orderBy(desc(apiKey.createdAt));
  return rows.map((r) => ({
    ...r,
    createdAt: r.createdAt.toISOString(),
    lastUsedAt: r.lastUsedAt?.toISOString() ?? null,
    revokedAt: r.revokedAt?.toISOString() ?? null,
  }));
}

export async function insertApiKey(
  db: DB,
  k: { orgId: string; userId: string; name: string; prefix: string; hash: string },
): Promise<string> {
  return db.transaction(async (tx) => {
    const [row] = await tx.insert(apiKey).values(k).returning({ id: apiKey.id });
    await logActivity(tx, {
      orgId: k.orgId,
      actorId: k.userId,
      action: "api_key.created",
      subjectType: "api_key",
      subjectId: row.id,
      detail: { name: k.name, prefix: k.prefix },
    });
    return row.id;
  });
}

export async function revokeApiKey(
  db: DB,
  { id, orgId, userId }: { id: string; orgId: string; userId: string },
): Promise<boolean> {
  return db.transaction(async (tx) => {
    const rows = await tx
      .update(apiKey)
      .set({ revokedAt: new Date() })
      .where(and(eq(apiKey.id, id), eq(apiKey.orgId, orgId), isNull(apiKey.revokedAt)))
      .returning({ id: apiKey.id });
    if (rows.length)
      await logActivity(tx, {
        orgId,
        actorId: userId,
        action: "api_key.revoked",
        subjectType: "api_key",
        subjectId: id,
      });
    return rows.length > 0;
  });
}

/** The live key with this hash: its organisation and creator. Touches last-used time. */
export async function findLiveApiKey(
  db: DB,
  { hash }: { hash: string },
): Promise<{ orgId: string; userId: string; name: string; email: string } | null> {
  const [row] = await db
    .select({ id: apiKey.id, orgId: apiKey.orgId, userId: apiKey.userId, name: user.name, email: user.email })
    .from(apiKey)
    .innerJoin(user, eq(user.id, apiKey.userId))
    .where(and(eq(apiKey.hash, hash), isNull(apiKey.revokedAt)));
  if (!row) return null;
  await db.update(apiKey).set({ lastUsedAt: new Date() }).where(eq(apiKey.id, row.id));
  return { orgId: row.orgId, userId: row.userId, name: row.name, email: row.email };
}
