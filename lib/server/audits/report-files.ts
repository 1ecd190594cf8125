import "server-only";
import type { DB } from "@/db/client";
import { getAuditReportParts, joinParts, type ReportPart } from "@/db/queries/audits";
import { sha256Hex } from "@/lib/review/hash";
import { keepFilesThenSave, readStored } from "@/lib/server/storage";

export type ReportKind = "residuals" | "unpaired" | "summary";

const REPORT_NAME: Record<ReportKind, string> = {
  residuals: "the residuals report",
  unpaired: "the unpaired report",
  summary: "the summary report",
};

/** A computed report, and (server mode with an object store) the object it was written to. */
export interface ReportToStore {
  kind: ReportKind;
  bytes: Uint8Array;
  object: { key: string; sha256: string } | null;
}

/**
 * Write an audit's reports to the object store (when there is one), then `store` the results naming them; if that
 * fails, the objects are deleted again. Without an object store `store` gets the reports to keep in the database.
 */
export function keepReportsThenStore(
  { orgId, auditId }: { orgId: string; auditId: string },
  reports: readonly { kind: ReportKind; bytes: Uint8Array }[],
  store: (reports: ReportToStore[]) => Promise<void>,
): Promise<void> {
  return keepFilesThenSave(
    reports.map((r) => ({
      orgId,
      name: `reports/${auditId}/${r.kind}`,
      bytes: r.bytes,
      contentType: "text/csv; charset=utf-8",
    })),
    (placed) =>
      store(
        reports.map((r, i) => {
          const key = placed[i].objectKey;
          return { kind: r.kind, bytes: r.bytes, object: key ? { key, sha256: sha256Hex(r.bytes) } : null };
        }),
      ),
  );
}

/** Read stored report parts, each object checked against its recorded SHA-256 and size; joined in order. */
export async function readReportParts(kind: ReportKind, parts: readonly ReportPart[]): Promise<Uint8Array> {
  const bytes: Uint8Array[] = [];
  for (const p of parts)
    bytes.push(await readStored(p, REPORT_NAME[kind], { sha256: p.sha256, sizeBytes: p.sizeBytes }));
  return joinParts(bytes);
}

/** A report of an audit (the caller has checked the audit is the viewer's organisation's), or null when none. */
export async function readAuditReport(
  db: DB,
  { auditId, kind }: { auditId: string; kind: ReportKind },
): Promise<Uint8Array | null> {
  const parts = await getAuditReportParts(db, { auditId, kind });
  return parts.length ? readReportParts(kind, parts) : null;
}
