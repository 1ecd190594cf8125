import "server-only";
import { formatFromName, readPoints, type ColumnMapping, type PointFileFormat, type PointTable } from "@/geo";
import type { DB } from "@/db/client";
import { loadDatasetPoints } from "@/db/queries/datasets";
import { getRawFile, loadRecordMaterial, type AuditReviewRow } from "@/db/queries/review";
import { startAuditWorker } from "@/lib/server/audits/run-in-worker";
import { AppError } from "@/lib/errors";
import type { ReportPart } from "@/db/queries/audits";
import { readReportParts, type ReportKind } from "@/lib/server/audits/report-files";
import { readStored, StoredFileProblem } from "@/lib/server/storage";
import type { AuditSettingsDto } from "@/lib/api-types";
import { sha256Hex } from "@/lib/review/hash";
import {
  buildRecord,
  reportHashes,
  residualDigest,
  unpairedDigest,
  type RecordDataset,
  type RecordSigner,
  type SignedRecord,
} from "@/lib/review/record";

export type RecordBody = Omit<SignedRecord, "schema" | "signoff">;

/** An audit that has results and both inputs, or a 409 saying why not. */
export function requireResults(a: AuditReviewRow): asserts a is AuditReviewRow & {
  plantedDatasetId: string;
  surveyDatasetId: string;
  summary: NonNullable<AuditReviewRow["summary"]>;
  verdict: NonNullable<AuditReviewRow["verdict"]>;
  settings: NonNullable<AuditReviewRow["settings"]>;
  profile: NonNullable<AuditReviewRow["profile"]>;
} {
  if (!a.plantedDatasetId || !a.surveyDatasetId || !a.summary || !a.verdict || !a.settings || !a.profile) {
    throw new AppError(
      "conflict",
      a.state === "computing"
        ? "This audit is still computing."
        : a.state === "failed"
          ? "This audit failed to compute; it has no results."
          : "This audit has no results.",
    );
  }
}

function auditPart(a: AuditReviewRow): RecordBody["audit"] {
  return { id: a.id, revision: a.revision, revisionOf: a.revisionOf, title: a.title, fieldId: a.fieldId };
}

/**
 * The record as the database holds it now (the audit row, its datasets, its result rows and reports). A report whose
 * stored object is missing or changed is refused (409 with the reason) — or, given `problems`, left out of the
 * record and its reason added there (verification reports it instead of stopping).
 */
export async function storedRecordBody(db: DB, a: AuditReviewRow, problems?: string[]): Promise<RecordBody> {
  requireResults(a);
  const m = await loadRecordMaterial(db, {
    auditId: a.id,
    orgId: a.orgId,
    plantedDatasetId: a.plantedDatasetId,
    surveyDatasetId: a.surveyDatasetId,
  });
  const planted = m.datasets.get(a.plantedDatasetId);
  const survey = m.datasets.get(a.surveyDatasetId);
  if (!planted || !survey) throw new AppError("conflict", "An input file of this audit is missing.");
  const reports: Partial<Record<ReportKind, Uint8Array>> = {};
  for (const [kind, parts] of Object.entries(m.reports) as [ReportKind, ReportPart[]][]) {
    try {
      reports[kind] = await readReportParts(kind, parts);
    } catch (err) {
      if (!(err instanceof StoredFileProblem) || !problems) throw err;
      problems.push(err.message);
    }
  }
  return {
    audit: auditPart(a),
    inputs: { planted, survey, settings: a.settings, profile: a.profile },
    results: {
      summary: a.summary,
      verdict: a.verdict,
      residuals: residualDigest(m.residuals),
      unpaired: unpairedDigest(m.unpaired),
      reports: reportHashes(reports),
    },
  };
}

export interface Recomputation {
  body: RecordBody | null;
  /** Per input: is the raw file still the one uploaded, and do the stored parsed points match it? */
  files: {
    kind: "planted" | "survey";
    fileName: string;
    rawSha256: string | null;
    storedSha256: string;
    pointsMatch: boolean | null;
    problem: string | null;
  }[];
  problem: string | null;
}

/**
 * Re-read both raw files exactly as uploaded (with each dataset's stored column mapping and CRS) and
 * run the engine again with the audit's settings and profile copy.
 */
export async function recomputeRecordBody(db: DB, a: AuditReviewRow, stored: RecordBody): Promise<Recomputation> {
  requireResults(a);
  const files: Recomputation["files"] = [];
  const tables: Partial<Record<"planted" | "survey", { table: PointTable; meta: RecordDataset }>> = {};
  for (const [kind, meta] of [
    ["planted", stored.inputs.planted],
    ["survey", stored.inputs.survey],
  ] as const) {
    const ref = await getRawFile(db, { datasetId: meta.datasetId, orgId: a.orgId });
    let bytes: Uint8Array | null = null;
    let missing = "the raw file is missing";
    try {
      // Read as stored, unchecked: the SHA-256 comparison below says what changed.
      if (ref) bytes = await readStored(ref, meta.fileName, { check: false });
    } catch (err) {
      if (!(err instanceof StoredFileProblem)) throw err;
      missing = err.message.replace(/\.$/, "");
    }
    if (!bytes) {
      files.push({
        kind,
        fileName: meta.fileName,
        rawSha256: null,
        storedSha256: meta.sha256,
        pointsMatch: null,
        problem: missing,
      });
      continue;
    }
    const rawSha256 = sha256Hex(bytes);
    const read = await readPoints([bytes], {
      source: meta.fileName,
      role: kind,
      mapping: (meta.mapping as ColumnMapping | null) ?? undefined,
      timeZone: a.settings.timeZone,
      format: (meta.format as PointFileFormat) ?? formatFromName(meta.fileName),
    });
    if (!read.table) {
      files.push({
        kind,
        fileName: meta.fileName,
        rawSha256,
        storedSha256: meta.sha256,
        pointsMatch: null,
        problem: `the raw file can no longer be read: ${read.issues.find((i) => i.severity === "error")?.message ?? "unknown error"}`,
      });
      continue;
    }
    const storedPoints = await loadDatasetPoints(db, { id: meta.datasetId, orgId: a.orgId });
    files.push({
      kind,
      fileName: meta.fileName,
      rawSha256,
      storedSha256: meta.sha256,
      pointsMatch: storedPoints ? sameCoordinates(read.table, storedPoints.table) : false,
      problem: null,
    });
    tables[kind] = {
      table: read.table,
      meta: { ...meta, sha256: rawSha256, sizeBytes: bytes.byteLength, rowCount: read.table.length },
    };
  }
  if (!tables.planted || !tables.survey)
    return { body: null, files, problem: "Both raw files are needed to re-compute the audit." };

  // A bearing the engine derived itself is derived again, not passed in as if it had been given.
  const settings: AuditSettingsDto = {
    ...a.settings,
    rowBearingDeg: a.summary.rowBearingSource === "derived" ? null : a.settings.rowBearingDeg,
  };
  // The engine runs on the audit worker thread (lib/audit-job), which sends digests rather than rows.
  const job = await startAuditWorker({
    planted: tables.planted.table,
    plantedCrs: tables.planted.meta.crs,
    survey: tables.survey.table,
    surveyCrs: tables.survey.meta.crs,
    settings,
    profile: a.profile,
    digestsOnly: true,
  });
  try {
    for await (const m of job.messages) {
      if (m.type === "stage") continue;
      if (m.type === "refused")
        return {
          body: null,
          files,
          problem: `Re-computing failed: ${m.errors
            .map((e) => e.message)
            .slice(0, 3)
            .join("; ")}`,
        };
      if (m.type === "error") return { body: null, files, problem: `Re-computing failed: ${m.message}` };
      if (m.type !== "computed" || !m.digests) break;
      return {
        files,
        problem: null,
        body: {
          audit: auditPart(a),
          inputs: {
            planted: tables.planted.meta,
            survey: tables.survey.meta,
            settings: m.settings,
            profile: a.profile,
          },
          results: {
            summary: m.summary,
            verdict: m.verdict,
            residuals: m.digests.residuals,
            unpaired: m.digests.unpaired,
            reports: reportHashes(
              Object.fromEntries(m.reports.map((r) => [r.kind, r.bytes])) as Record<
                "residuals" | "unpaired" | "summary",
                Uint8Array
              >,
            ),
          },
        },
      };
    }
    return { body: null, files, problem: "Re-computing failed: the audit worker stopped without a result." };
  } finally {
    await job.stop();
  }
}

export function withSigner(body: RecordBody, signoff: RecordSigner): SignedRecord {
  return buildRecord({ ...body, signoff });
}

function sameCoordinates(a: PointTable, b: PointTable): boolean {
  if (a.length !== b.length) return false;
  for (let i = 0; i < a.length; i++) {
    if (!Object.is(a.x[i], b.x[i]) || !Object.is(a.y[i], b.y[i])) return false;
  }
  return true;
}
