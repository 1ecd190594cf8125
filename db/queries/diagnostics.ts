import "server-only";
import { and, asc, desc, eq, inArray, isNotNull, lt, ne, or, sql } from "drizzle-orm";
import type { DB } from "@/db/client";
import { audit, auditResidual, datasetMachine, field } from "@/db/schema";
import type { AuditState, AuditSummary } from "@/lib/api-types";

/** The stored per-plant rows the diagnostics read, in pairing order; the audit must belong to the caller's organisation. */
export async function listDiagnosticRows(db: DB, { auditId }: { auditId: string }) {
  return db
    .select({
      seq: auditResidual.seq,
      plantId: auditResidual.plantId,
      bed: auditResidual.bed,
      row: auditResidual.row,
      arm: auditResidual.arm,
      fix: auditResidual.fix,
      plantedE: auditResidual.plantedE,
      plantedN: auditResidual.plantedN,
      surveyE: auditResidual.surveyE,
      surveyN: auditResidual.surveyN,
      dE: auditResidual.dE,
      dN: auditResidual.dN,
      along: auditResidual.along,
      cross: auditResidual.cross,
      radial: auditResidual.radial,
      outlier: auditResidual.outlier,
    })
    .from(auditResidual)
    .where(eq(auditResidual.auditId, auditId))
    .orderBy(asc(auditResidual.seq));
}

/** States whose audits have stored results. */
export const STATES_WITH_RESULTS: AuditState[] = ["computed", "submitted", "signed_off", "returned"];

/** An audit with results, as the season and comparison list it. */
export interface SeasonAuditRow {
  id: string;
  title: string;
  state: AuditState;
  revision: number;
  fieldId: string;
  fieldName: string;
  plantedDatasetId: string | null;
  createdAt: Date;
  computedAt: Date | null;
  summary: AuditSummary;
  passed: boolean | null;
}

const seasonCols = {
  id: audit.id,
  title: audit.title,
  state: audit.state,
  revision: audit.revision,
  fieldId: audit.fieldId,
  fieldName: field.name,
  plantedDatasetId: audit.plantedDatasetId,
  createdAt: audit.createdAt,
  computedAt: audit.computedAt,
  summary: audit.summary,
  verdict: audit.verdict,
};

function toSeasonRow(r: {
  id: string;
  title: string;
  state: string;
  revision: number;
  fieldId: string;
  fieldName: string;
  plantedDatasetId: string | null;
  createdAt: Date;
  computedAt: Date | null;
  summary: unknown;
  verdict: unknown;
}): SeasonAuditRow {
  const { verdict, ...rest } = r;
  return {
    ...rest,
    state: r.state as AuditState,
    summary: r.summary as AuditSummary,
    passed: (verdict as { passed?: boolean } | null)?.passed ?? null,
  };
}

/** Audits of a field with results, oldest first (at most `limit`). */
export async function listFieldSeason(
  db: DB,
  { orgId, fieldId, limit = 60 }: { orgId: string; fieldId: string; limit?: number },
): Promise<SeasonAuditRow[]> {
  const rows = await db
    .select(seasonCols)
    .from(audit)
    .innerJoin(field, eq(field.id, audit.fieldId))
    .where(
      and(
        eq(audit.orgId, orgId),
        eq(audit.fieldId, fieldId),
        inArray(audit.state, STATES_WITH_RESULTS),
        isNotNull(audit.summary),
      ),
    )
    .orderBy(desc(audit.createdAt))
    .limit(limit);
  return rows.map(toSeasonRow).reverse();
}

/** The audit with results of the same field created just before this one, or null. */
export async function getPreviousFieldAudit(
  db: DB,
  { orgId, fieldId, auditId, createdAt }: { orgId: string; fieldId: string; auditId: string; createdAt: Date },
): Promise<SeasonAuditRow | null> {
  const [row] = await db
    .select(seasonCols)
    .from(audit)
    .innerJoin(field, eq(field.id, audit.fieldId))
    .where(
      and(
        eq(audit.orgId, orgId),
        eq(audit.fieldId, fieldId),
        ne(audit.id, auditId),
        inArray(audit.state, STATES_WITH_RESULTS),
        isNotNull(audit.summary),
        or(lt(audit.createdAt, createdAt), and(eq(audit.createdAt, createdAt), sql`${audit.id} < ${auditId}`)),
      ),
    )
    .orderBy(desc(audit.createdAt), desc(audit.id))
    .limit(1);
  return row ? toSeasonRow(row) : null;
}

// Machines (issue 13): an audit belongs to the machine that recorded its as-planted dataset.

/** Audits with results of one machine (any field), oldest first (at most `limit`). */
export async function listMachineSeason(
  db: DB,
  { orgId, machineId, limit = 60 }: { orgId: string; machineId: string; limit?: number },
): Promise<SeasonAuditRow[]> {
  const rows = await db
    .select(seasonCols)
    .from(audit)
    .innerJoin(field, eq(field.id, audit.fieldId))
    .innerJoin(datasetMachine, eq(datasetMachine.datasetId, audit.plantedDatasetId))
    .where(
      and(
        eq(audit.orgId, orgId),
        eq(datasetMachine.orgId, orgId),
        eq(datasetMachine.machineId, machineId),
        inArray(audit.state, STATES_WITH_RESULTS),
        isNotNull(audit.summary),
      ),
    )
    .orderBy(desc(audit.createdAt))
    .limit(limit);
  return rows.map(toSeasonRow).reverse();
}

/** The audit with results of the same machine (any field) created just before this one, or null. */
export async function getPreviousMachineAudit(
  db: DB,
  { orgId, machineId, auditId, createdAt }: { orgId: string; machineId: string; auditId: string; createdAt: Date },
): Promise<SeasonAuditRow | null> {
  const [row] = await db
    .select(seasonCols)
    .from(audit)
    .innerJoin(field, eq(field.id, audit.fieldId))
    .innerJoin(datasetMachine, eq(datasetMachine.datasetId, audit.plantedDatasetId))
    .where(
      and(
        eq(audit.orgId, orgId),
        eq(datasetMachine.orgId, orgId),
        eq(datasetMachine.machineId, machineId),
        ne(audit.id, auditId),
        inArray(audit.state, STATES_WITH_RESULTS),
        isNotNull(audit.summary),
        or(lt(audit.createdAt, createdAt), and(eq(audit.createdAt, createdAt), sql`${audit.id} < ${auditId}`)),
      ),
    )
    .orderBy(desc(audit.createdAt), desc(audit.id))
    .limit(1);
  return row ? toSeasonRow(row) : null;
}
