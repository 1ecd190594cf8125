import "server-only";
import { setImmediate as turn } from "node:timers/promises";
import { getDb } from "@/db/client";
import { residualRowsAfter } from "@/db/queries/audits";
import { logActivity } from "@/db/queries/activity";
import { loadDatasetPoints } from "@/db/queries/datasets";
import { getAuditForReview, getSignoff } from "@/db/queries/review";
import {
  residualsSheet,
  type SheetFormat,
  type SheetResidualRow,
  sheetSuffix,
  summarySheet,
} from "@/lib/audit/spreadsheet-csv";
import type { AuditDto } from "@/lib/api-types";
import { AppError } from "@/lib/errors";
import { contentDisposition, fileSlug } from "@/lib/http";
import { STATE_NAME } from "@/lib/review/lifecycle";
import type { Viewer } from "@/lib/server/access";
import type { ReportFormatQuery } from "@/lib/validation/audit";
import { auditForViewer } from "./audit-access";
import { readAuditReport } from "./report-files";

type ReportKind = "residuals" | "unpaired" | "summary";

function noResults(audit: AuditDto): AppError {
  return new AppError(
    "conflict",
    audit.state === "failed" ? `This audit failed: ${audit.error}` : "This audit has no results yet.",
  );
}

/** A download's name: field, audit title, revision, computation day and what it holds, e.g. `…_rev2_2026-04-20_summary.csv`. */
export function auditFileName(audit: AuditDto, kind: string, extension = "csv"): string {
  const day = (audit.computedAt ?? audit.createdAt).slice(0, 10);
  const rev = audit.revision > 1 ? `_rev${audit.revision}` : "";
  return `plotproof_${fileSlug(audit.field.name)}_${fileSlug(audit.title)}${rev}_${day}_${kind}.${extension}`;
}

function csvResponse(body: BodyInit, name: string): Response {
  return new Response(body, {
    headers: {
      "content-type": "text/csv; charset=utf-8",
      "content-disposition": contentDisposition(name),
      "cache-control": "no-store",
    },
  });
}

async function logDownload(viewer: Viewer, auditId: string, detail: Record<string, string>): Promise<void> {
  await logActivity(await getDb(), {
    orgId: viewer.orgId,
    actorId: viewer.userId,
    action: "report.downloaded",
    subjectType: "audit",
    subjectId: auditId,
    detail,
  });
}

/**
 * A CSV report as a download named after field, audit and computation date: without a format, the stored report
 * byte for byte (what was computed and hashed); with `units` or `sep`, a spreadsheet variant of the per-plant or
 * summary report made from the stored rows, its format stated in the file name (`…_residuals-mm-semicolon.csv`).
 */
export async function downloadReport(
  viewer: Viewer,
  params: { id: string },
  kind: ReportKind,
  query: ReportFormatQuery = {},
): Promise<Response> {
  const audit = await auditForViewer(viewer, params);
  if (kind !== "unpaired" && (query.units !== undefined || query.sep !== undefined)) {
    const format: SheetFormat = { units: query.units ?? "mm", sep: query.sep ?? "comma" };
    const body =
      kind === "residuals"
        ? await residualsVariant(viewer, audit, format)
        : await summaryVariant(viewer, audit, format);
    await logDownload(viewer, audit.id, { kind, format: sheetSuffix(format) });
    return csvResponse(body, auditFileName(audit, `${kind}-${sheetSuffix(format)}`));
  }
  const db = await getDb();
  const bytes = await readAuditReport(db, { auditId: audit.id, kind });
  if (!bytes) throw noResults(audit);
  await logDownload(viewer, audit.id, { kind });
  return csvResponse(bytes as BodyInit, auditFileName(audit, kind));
}

const BATCH = 2000;

/** Planting time per plant id of the planted records, for ids that occur once (a repeated id cannot be traced). */
async function plantingTimes(viewer: Viewer, audit: AuditDto): Promise<Map<string, number>> {
  const times = new Map<string, number>();
  if (!audit.planted) return times;
  const loaded = await loadDatasetPoints(await getDb(), { id: audit.planted.id, orgId: viewer.orgId });
  const table = loaded?.table;
  if (!table?.time || !table.id) return times;
  const repeated = new Set<string>();
  for (let i = 0; i < table.length; i++) {
    const id = table.id.get(i);
    if (times.has(id)) repeated.add(id);
    else times.set(id, table.time[i]);
  }
  for (const id of repeated) times.delete(id);
  return times;
}

async function residualsVariant(viewer: Viewer, audit: AuditDto, format: SheetFormat): Promise<ReadableStream> {
  if (!audit.summary) throw noResults(audit);
  const db = await getDb();
  const times = await plantingTimes(viewer, audit);
  const timeZone = audit.settings?.timeZone ?? audit.field.timeZone;
  const encoder = new TextEncoder();
  let afterSeq = -1;
  let header = true;
  return new ReadableStream<Uint8Array>({
    async pull(controller) {
      if (header) {
        header = false;
        const [first] = residualsSheet([], format, timeZone);
        // A byte-order mark so spreadsheets read the file as UTF-8 (plant ids and time zone names may not be ASCII).
        controller.enqueue(encoder.encode(`\uFEFF${first}`));
        return;
      }
      // One batch per pull with a real event-loop turn between, so other requests are served meanwhile.
      await turn();
      const rows = await residualRowsAfter(db, { auditId: audit.id, afterSeq, limit: BATCH });
      if (rows.length === 0) {
        controller.close();
        return;
      }
      afterSeq = rows[rows.length - 1].seq;
      const sheetRows: SheetResidualRow[] = rows.map((r) => {
        const t = r.plantId === null ? undefined : times.get(r.plantId);
        return { ...r, plantedAt: t !== undefined && Number.isFinite(t) ? t : null };
      });
      const chunks = [...residualsSheet(sheetRows, format, timeZone, BATCH)].slice(1);
      controller.enqueue(encoder.encode(chunks.join("")));
    },
  });
}

async function summaryVariant(viewer: Viewer, audit: AuditDto, format: SheetFormat): Promise<string> {
  const db = await getDb();
  const row = await getAuditForReview(db, { id: audit.id, orgId: viewer.orgId });
  if (!row?.summary) throw noResults(audit);
  const signoff = row.state === "signed_off" ? await getSignoff(db, { auditId: audit.id, orgId: viewer.orgId }) : null;
  return `\uFEFF${summarySheet(
    {
      title: row.title,
      fieldName: row.fieldName,
      revision: row.revision,
      stateLabel: STATE_NAME[row.state],
      computedAt: row.computedAt?.toISOString() ?? null,
      profile: row.profile,
      verdict: row.verdict,
      summary: row.summary,
      signoff: signoff && { signerName: signoff.signerName, signedAt: signoff.signedAt, sha256: signoff.sha256 },
    },
    format,
  )}`;
}
