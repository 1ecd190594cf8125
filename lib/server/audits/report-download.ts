import "server-only";
import { getDb } from "@/db/client";
import { getAuditReport } from "@/db/queries/audits";
import { logActivity } from "@/db/queries/activity";
import { AppError } from "@/lib/errors";
import { contentDisposition, fileSlug } from "@/lib/http";
import type { Viewer } from "@/lib/server/access";
import { auditForViewer } from "./audit-access";

/** A stored CSV report as a download named after field, audit and computation date. */
export async function downloadReport(
  viewer: Viewer,
  params: { id: string },
  kind: "residuals" | "unpaired" | "summary",
): Promise<Response> {
  const audit = await auditForViewer(viewer, params);
  const db = await getDb();
  const bytes = await getAuditReport(db, { auditId: audit.id, kind });
  if (!bytes)
    throw new AppError(
      "conflict",
      audit.state === "failed" ? `This audit failed: ${audit.error}` : "This audit has no results yet.",
    );
  const day = (audit.computedAt ?? audit.createdAt).slice(0, 10);
  const name = `plotproof_${fileSlug(audit.field.name)}_${fileSlug(audit.title)}_${day}_${kind}.csv`;
  await logActivity(db, {
    orgId: viewer.orgId,
    actorId: viewer.userId,
    action: "report.downloaded",
    subjectType: "audit",
    subjectId: audit.id,
    detail: { kind },
  });
  return new Response(bytes as BodyInit, {
    headers: {
      "content-type": "text/csv; charset=utf-8",
      "content-disposition": contentDisposition(name),
      "cache-control": "no-store",
    },
  });
}
