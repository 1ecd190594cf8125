import "server-only";
import { projectTable } from "@/geo";
import { getDb } from "@/db/client";
import { loadDatasetPoints } from "@/db/queries/datasets";
import {
  getPreviousFieldAudit,
  getPreviousMachineAudit,
  listDiagnosticRows,
  type SeasonAuditRow,
} from "@/db/queries/diagnostics";
import { getDatasetMachine } from "@/db/queries/machines";
import {
  type AuditDiagnostics,
  compareDiagnostics,
  type DiagnosticPair,
  type DiagnosticsComparison,
  diagnoseAudit,
  diagnosticsCsv,
  type PlantedTrack,
  trackFromTable,
} from "@/lib/audit/diagnostics";
import type { AuditDto } from "@/lib/api-types";
import { AppError } from "@/lib/errors";
import { contentDisposition, fileSlug } from "@/lib/http";
import type { Viewer } from "@/lib/server/access";
import { auditForViewer } from "./audit-access";

/** Pairs and the as-planted track of one audit with results, from its stored rows and stored records. */
async function diagnosticInput(
  orgId: string,
  a: { id: string; plantedDatasetId: string | null; crs: string },
): Promise<{ pairs: DiagnosticPair[]; track: PlantedTrack | null }> {
  const db = await getDb();
  const rows = await listDiagnosticRows(db, { auditId: a.id });
  const loaded = a.plantedDatasetId ? await loadDatasetPoints(db, { id: a.plantedDatasetId, orgId }) : null;
  // Planting time and raw GNSS position per plant id, for ids that occur once (a repeated id cannot be traced).
  const byId = new Map<string, number>();
  let rawE: Float64Array | null = null;
  let rawN: Float64Array | null = null;
  if (loaded?.table.id) {
    const t = loaded.table;
    const repeated = new Set<string>();
    for (let i = 0; i < t.length; i++) {
      const id = t.id!.get(i);
      if (!id) continue;
      if (byId.has(id)) repeated.add(id);
      else byId.set(id, i);
    }
    for (const id of repeated) byId.delete(id);
    if (t.rawX && t.rawY) {
      const projected = projectTable(t, loaded.dto.crs, a.crs);
      rawE = projected.rawX;
      rawN = projected.rawY;
    }
  }
  const table = loaded?.table ?? null;
  const pairs: DiagnosticPair[] = rows.map((r) => {
    const i = r.plantId === null ? undefined : byId.get(r.plantId);
    const time = i !== undefined && table?.time ? table.time[i] : Number.NaN;
    const re = i !== undefined && rawE ? rawE[i] : Number.NaN;
    const rn = i !== undefined && rawN ? rawN[i] : Number.NaN;
    const raw = Number.isFinite(re) && Number.isFinite(rn);
    return {
      seq: r.seq,
      plantId: r.plantId,
      bed: r.bed,
      row: r.row,
      arm: r.arm,
      fix: r.fix,
      plantedE: r.plantedE,
      plantedN: r.plantedN,
      dE: r.dE,
      dN: r.dN,
      along: r.along,
      cross: r.cross,
      radial: r.radial,
      outlier: r.outlier,
      time: Number.isFinite(time) ? time : null,
      rawDE: raw ? r.surveyE - re : null,
      rawDN: raw ? r.surveyN - rn : null,
    };
  });
  return { pairs, track: table ? trackFromTable(table) : null };
}

function requireSummary(audit: AuditDto): NonNullable<AuditDto["summary"]> {
  if (!audit.summary)
    throw new AppError(
      "conflict",
      audit.state === "failed" ? `This audit failed: ${audit.error}` : "This audit has no results yet.",
    );
  return audit.summary;
}

/** Diagnostics of a stored audit, computed on read from its stored rows (nothing of a signed audit changes). */
export async function diagnosticsOf(
  orgId: string,
  a: { id: string; plantedDatasetId: string | null; crs: string; confidence: number },
): Promise<AuditDiagnostics> {
  const { pairs, track } = await diagnosticInput(orgId, a);
  return diagnoseAudit({ pairs, track, confidence: a.confidence });
}

export interface DiagnosticsView {
  audit: AuditDto;
  diagnostics: AuditDiagnostics;
  /** The machine that recorded the as-planted records, when the upload named one. */
  machine: { id: string; name: string } | null;
  previous: {
    id: string;
    title: string;
    state: string;
    /** The previous audit of the same machine, else (no machine, or its first audit) of the same field. */
    basis: "machine" | "field";
    fieldName: string;
    comparison: DiagnosticsComparison;
  } | null;
}

/**
 * The audit before this one to compare with: the same machine's previous audit (any field) when the as-planted
 * upload named a machine and it has one, else the field's previous audit.
 */
export async function previousAuditFor(
  orgId: string,
  audit: { id: string; createdAt: string; fieldId: string; plantedDatasetId: string | null },
): Promise<{ row: SeasonAuditRow; basis: "machine" | "field"; machine: { id: string; name: string } | null } | null> {
  const db = await getDb();
  const createdAt = new Date(audit.createdAt);
  const machine = audit.plantedDatasetId
    ? await getDatasetMachine(db, { datasetId: audit.plantedDatasetId, orgId })
    : null;
  if (machine) {
    const row = await getPreviousMachineAudit(db, { orgId, machineId: machine.id, auditId: audit.id, createdAt });
    if (row) return { row, basis: "machine", machine };
  }
  const row = await getPreviousFieldAudit(db, { orgId, fieldId: audit.fieldId, auditId: audit.id, createdAt });
  return row ? { row, basis: "field", machine } : null;
}

/** The diagnostics page's data: this audit's diagnostics and the comparison with the previous audit (machine, else field). */
export async function auditDiagnosticsFor(viewer: Viewer, params: { id: string }): Promise<DiagnosticsView> {
  const audit = await auditForViewer(viewer, params);
  const summary = requireSummary(audit);
  const diagnostics = await diagnosticsOf(viewer.orgId, {
    id: audit.id,
    plantedDatasetId: audit.planted?.id ?? null,
    crs: summary.crs,
    confidence: summary.confidence,
  });
  const prev = await previousAuditFor(viewer.orgId, {
    id: audit.id,
    createdAt: audit.createdAt,
    fieldId: audit.field.id,
    plantedDatasetId: audit.planted?.id ?? null,
  });
  const machine =
    prev?.machine ??
    (audit.planted
      ? await getDatasetMachine(await getDb(), { datasetId: audit.planted.id, orgId: viewer.orgId })
      : null);
  return {
    audit,
    diagnostics,
    machine,
    previous: prev ? await compareWith(viewer.orgId, prev.row, prev.basis, diagnostics) : null,
  };
}

async function compareWith(
  orgId: string,
  prev: SeasonAuditRow,
  basis: "machine" | "field",
  current: AuditDiagnostics,
): Promise<DiagnosticsView["previous"]> {
  const before = await diagnosticsOf(orgId, {
    id: prev.id,
    plantedDatasetId: prev.plantedDatasetId,
    crs: prev.summary.crs,
    confidence: prev.summary.confidence,
  });
  return {
    id: prev.id,
    title: prev.title,
    state: prev.state,
    basis,
    fieldName: prev.fieldName,
    comparison: compareDiagnostics(before, current, current.confidence),
  };
}

/** The diagnostics CSV as a download named after field and audit. */
export async function diagnosticsCsvResponse(viewer: Viewer, params: { id: string }): Promise<Response> {
  const audit = await auditForViewer(viewer, params);
  const summary = requireSummary(audit);
  const d = await diagnosticsOf(viewer.orgId, {
    id: audit.id,
    plantedDatasetId: audit.planted?.id ?? null,
    crs: summary.crs,
    confidence: summary.confidence,
  });
  const name = `plotproof_${fileSlug(audit.field.name)}_${fileSlug(audit.title)}_diagnostics.csv`;
  return new Response(`\uFEFF${diagnosticsCsv(d)}`, {
    headers: {
      "content-type": "text/csv; charset=utf-8",
      "content-disposition": contentDisposition(name),
      "cache-control": "no-store",
    },
  });
}
