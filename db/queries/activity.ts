import "server-only";
import { and, desc, eq, inArray, lt, notInArray, or, type SQL } from "drizzle-orm";
import type { DB } from "@/db/client";
import { activity, user } from "@/db/schema";

export async function logActivity(
  db: Pick<DB, "insert">,
  entry: {
    orgId: string;
    actorId: string | null;
    action: string;
    subjectType: string;
    subjectId?: string;
    detail?: unknown;
  },
): Promise<void> {
  await db.insert(activity).values({ ...entry, detail: entry.detail ?? null });
}

export interface ActivityRow {
  id: number;
  at: Date;
  action: string;
  actorName: string | null;
  subjectType: string;
  subjectId: string | null;
  detail: unknown;
}

const activityCols = {
  id: activity.id,
  at: activity.at,
  action: activity.action,
  actorName: user.name,
  subjectType: activity.subjectType,
  subjectId: activity.subjectId,
  detail: activity.detail,
};

/** What happened to one audit and its two input files, oldest first. */
export async function listAuditActivity(
  db: DB,
  { orgId, auditId, datasetIds }: { orgId: string; auditId: string; datasetIds: string[] },
): Promise<ActivityRow[]> {
  const subjects: SQL[] = [and(eq(activity.subjectType, "audit"), eq(activity.subjectId, auditId))!];
  if (datasetIds.length)
    subjects.push(and(eq(activity.subjectType, "dataset"), inArray(activity.subjectId, datasetIds))!);
  return db
    .select(activityCols)
    .from(activity)
    .leftJoin(user, eq(user.id, activity.actorId))
    .where(and(eq(activity.orgId, orgId), or(...subjects)))
    .orderBy(activity.at, activity.id)
    .limit(500);
}

/** The organisation's activity, newest first, `limit` at a time before the entry `before`. */
export async function listOrgActivity(
  db: DB,
  {
    orgId,
    before,
    limit = 50,
    hideTypes = [],
  }: { orgId: string; before?: number; limit?: number; hideTypes?: string[] },
): Promise<ActivityRow[]> {
  const where: SQL[] = [eq(activity.orgId, orgId)];
  if (before) where.push(lt(activity.id, before));
  if (hideTypes.length) where.push(notInArray(activity.subjectType, hideTypes));
  return db
    .select(activityCols)
    .from(activity)
    .leftJoin(user, eq(user.id, activity.actorId))
    .where(and(...where))
    .orderBy(desc(activity.id))
    .limit(limit);
}

/** The most recent entries with one of the actions about one subject (e.g. the outcome of an e-mail). */
export async function latestActivityFor(
  db: DB,
  { orgId, subjectId, actions }: { orgId: string; subjectId: string; actions: string[] },
): Promise<ActivityRow | null> {
  const [row] = await db
    .select(activityCols)
    .from(activity)
    .leftJoin(user, eq(user.id, activity.actorId))
    .where(and(eq(activity.orgId, orgId), eq(activity.subjectId, subjectId), inArray(activity.action, actions)))
    .orderBy(desc(activity.id))
    .limit(1);
  return row ?? null;
}
