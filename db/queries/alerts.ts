import "server-only";
import { and, count, desc, eq, inArray, isNull } from "drizzle-orm";
import { alias } from "drizzle-orm/pg-core";
import type { DB } from "@/db/client";
import { alertBreach, alertRule, audit, datasetMachine, field, machine, user } from "@/db/schema";
import type { AlertFinding, AlertKind } from "@/lib/audit/alerts";
import type { AlertDto, AlertRulesDto } from "@/lib/machine-types";
import type { AlertRulesInput } from "@/lib/validation/machines";

/** The organisation's thresholds; all off when none were ever set. */
export async function getAlertRules(db: DB, { orgId }: { orgId: string }): Promise<AlertRulesDto> {
  const [row] = await db
    .select({
      armCrossOffsetM: alertRule.armCrossOffsetM,
      rmseRise: alertRule.rmseRise,
      failedVerdict: alertRule.failedVerdict,
      updatedBy: user.name,
      updatedAt: alertRule.updatedAt,
    })
    .from(alertRule)
    .leftJoin(user, eq(user.id, alertRule.updatedBy))
    .where(eq(alertRule.orgId, orgId));
  if (!row) return { armCrossOffsetM: null, rmseRise: null, failedVerdict: false, updatedBy: null, updatedAt: null };
  return { ...row, updatedAt: row.updatedAt.toISOString() };
}

export async function saveAlertRules(
  db: DB,
  { orgId, userId, input }: { orgId: string; userId: string | null; input: AlertRulesInput },
): Promise<AlertRulesDto> {
  const values = { ...input, updatedBy: userId, updatedAt: new Date() };
  await db
    .insert(alertRule)
    .values({ orgId, ...values })
    .onConflictDoUpdate({ target: alertRule.orgId, set: values });
  return getAlertRules(db, { orgId });
}

/**
 * Store the breaches found for one audit, replacing those of an earlier computation of it: a breach found again
 * word for word (same kind and sentence) keeps its row, so its time and acknowledgement stay; one no longer found
 * goes. Returns the breaches that are new, the only ones worth telling anyone about.
 */
export async function storeAlertBreaches(
  db: DB,
  { orgId, auditId, findings }: { orgId: string; auditId: string; findings: AlertFinding[] },
): Promise<AlertFinding[]> {
  return db.transaction(async (tx) => {
    const where = and(eq(alertBreach.auditId, auditId), eq(alertBreach.orgId, orgId));
    const stored = await tx
      .select({ id: alertBreach.id, kind: alertBreach.kind, message: alertBreach.message })
      .from(alertBreach)
      .where(where);
    const key = (kind: string, message: string) => `${kind}\u0000${message}`;
    const found = new Set(findings.map((f) => key(f.kind, f.message)));
    const gone = stored.filter((r) => !found.has(key(r.kind, r.message))).map((r) => r.id);
    if (gone.length) await tx.delete(alertBreach).where(and(where, inArray(alertBreach.id, gone)));
    const kept = new Set(stored.map((r) => key(r.kind, r.message)));
    const fresh = findings.filter((f) => !kept.has(key(f.kind, f.message)));
    if (fresh.length)
      await tx
        .insert(alertBreach)
        .values(fresh.map((f) => ({ orgId, auditId, kind: f.kind, message: f.message, detail: f.detail })));
    return fresh;
  });
}

const ackUser = alias(user, "ack_user");

/** The organisation's alerts, newest first; `open` only those nobody has acknowledged. */
export async function listAlerts(
  db: DB,
  { orgId, open = false, limit = 200 }: { orgId: string; open?: boolean; limit?: number },
): Promise<AlertDto[]> {
  const rows = await db
    .select({
      id: alertBreach.id,
      kind: alertBreach.kind,
      message: alertBreach.message,
      createdAt: alertBreach.createdAt,
      acknowledgedAt: alertBreach.acknowledgedAt,
      acknowledgedBy: ackUser.name,
      auditId: audit.id,
      title: audit.title,
      fieldId: field.id,
      fieldName: field.name,
      machineId: machine.id,
      machineName: machine.name,
    })
    .from(alertBreach)
    .innerJoin(audit, and(eq(audit.id, alertBreach.auditId), eq(audit.orgId, orgId)))
    .innerJoin(field, eq(field.id, audit.fieldId))
    .leftJoin(datasetMachine, eq(datasetMachine.datasetId, audit.plantedDatasetId))
    .leftJoin(machine, eq(machine.id, datasetMachine.machineId))
    .leftJoin(ackUser, eq(ackUser.id, alertBreach.acknowledgedBy))
    .where(and(eq(alertBreach.orgId, orgId), open ? isNull(alertBreach.acknowledgedAt) : undefined))
    .orderBy(desc(alertBreach.createdAt), desc(alertBreach.id))
    .limit(limit);
  return rows.map((r) => ({
    id: r.id,
    kind: r.kind as AlertKind,
    message: r.message,
    audit: { id: r.auditId, title: r.title, fieldId: r.fieldId, fieldName: r.fieldName },
    machine: r.machineId && r.machineName ? { id: r.machineId, name: r.machineName } : null,
    createdAt: r.createdAt.toISOString(),
    acknowledgedAt: r.acknowledgedAt?.toISOString() ?? null,
    acknowledgedBy: r.acknowledgedBy,
  }));
}

/** Alerts nobody has acknowledged yet (the count on the home page). */
export async function countOpenAlerts(db: DB, { orgId }: { orgId: string }): Promise<number> {
  const [{ n }] = await db
    .select({ n: count() })
    .from(alertBreach)
    .where(and(eq(alertBreach.orgId, orgId), isNull(alertBreach.acknowledgedAt)));
  return Number(n);
}

/** Acknowledge or re-open one alert; false when the organisation has no such alert. */
export async function setAlertAcknowledged(
  db: DB,
  { id, orgId, userId, acknowledged }: { id: string; orgId: string; userId: string; acknowledged: boolean },
): Promise<boolean> {
  const rows = await db
    .update(alertBreach)
    .set(
      acknowledged
        ? { acknowledgedAt: new Date(), acknowledgedBy: userId }
        : { acknowledgedAt: null, acknowledgedBy: null },
    )
    .where(and(eq(alertBreach.id, id), eq(alertBreach.orgId, orgId)))
    .returning({ id: alertBreach.id });
  return rows.length > 0;
}
