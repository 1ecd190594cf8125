import "server-only";
import { and, desc, eq, isNull } from "drizzle-orm";
import type { DB } from "@/db/client";
import { apiKey, user } from "@/db/schema";
import type { ApiKeyDto } from "@/lib/api-types";
import type { ApiKeyScope } from "@/lib/security/key-scope";
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
      scope: apiKey.scope,
      expiresAt: apiKey.expiresAt,
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
    expiresAt: r.expiresAt?.toISOString() ?? null,
  }));
}

export async function insertApiKey(
  db: DB,
  k: {
    orgId: string;
    userId: string;
    name: string;
    prefix: string;
    hash: string;
    scope: ApiKeyScope;
    expiresAt: Date | null;
  },
): Promise<string> {
  return db.transaction(async (tx) => {
    const [row] = await tx.insert(apiKey).values(k).returning({ id: apiKey.id });
    await logActivity(tx, {
      orgId: k.orgId,
      actorId: k.userId,
      action: "api_key.created",
      subjectType: "api_key",
      subjectId: row.id,
      detail: { name: k.name, prefix: k.prefix, scope: k.scope, expiresAt: k.expiresAt?.toISOString() ?? null },
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

/** A key that is not revoked: who made it, in which organisation, with which scope and expiry. */
export interface LiveApiKey {
  orgId: string;
  userId: string;
  name: string;
  email: string;
  scope: ApiKeyScope;
  /** Set when the key expired at or before `now`; such a key must be refused. */
  expiredAt: Date | null;
}

/**
 * The unrevoked key with this hash, or null. An expired key is returned with `expiredAt` set (so the caller can
 * say when it expired) and its last-used time is left alone; a live key's last-used time is touched.
 */
export async function findLiveApiKey(
  db: DB,
  { hash, now = new Date() }: { hash: string; now?: Date },
): Promise<LiveApiKey | null> {
  const [row] = await db
    .select({
      id: apiKey.id,
      orgId: apiKey.orgId,
      userId: apiKey.userId,
      name: user.name,
      email: user.email,
      scope: apiKey.scope,
      expiresAt: apiKey.expiresAt,
    })
    .from(apiKey)
    .innerJoin(user, eq(user.id, apiKey.userId))
    .where(and(eq(apiKey.hash, hash), isNull(apiKey.revokedAt)));
  if (!row) return null;
  const expiredAt = row.expiresAt && row.expiresAt.getTime() <= now.getTime() ? row.expiresAt : null;
  if (!expiredAt) await db.update(apiKey).set({ lastUsedAt: now }).where(eq(apiKey.id, row.id));
  return {
    orgId: row.orgId,
    userId: row.userId,
    name: row.name,
    email: row.email,
    scope: row.scope,
    expiredAt,
  };
}
