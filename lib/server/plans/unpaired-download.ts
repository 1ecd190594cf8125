import "server-only";
import { getDb } from "@/db/client";
import { logActivity } from "@/db/queries/activity";
import { planOfSurvey, plannedPlantIds } from "@/db/queries/survey-plans";
import { AppError } from "@/lib/errors";
import { contentDisposition, fileSlug } from "@/lib/http";
import { filterUnpairedCsv } from "@/lib/plan/unpaired-csv";
import type { Viewer } from "@/lib/server/access";
import { auditForViewer } from "@/lib/server/audits/audit-access";
import { downloadReport } from "@/lib/server/audits/report-download";
import { readAuditReport } from "@/lib/server/audits/report-files";

/**
 * The unpaired CSV. For an audit whose survey was made from a plan, only "sampled but not found" and "surveyed but no
 * record" (and ambiguous) lines unless `all`; the kept lines are the stored report's own. Without a plan, or with
 * `all`, the stored report byte for byte as before.
 */
export async function downloadUnpaired(viewer: Viewer, params: { id: string }, all: boolean): Promise<Response> {
  const audit = await auditForViewer(viewer, params);
  const db = await getDb();
  const plan =
    !all && audit.survey ? await planOfSurvey(db, { surveyDatasetId: audit.survey.id, orgId: viewer.orgId }) : null;
  if (!plan) return downloadReport(viewer, params, "unpaired");
  const bytes = await readAuditReport(db, { auditId: audit.id, kind: "unpaired" });
  if (!bytes) throw new AppError("conflict", "This audit has no results yet.");
  const filtered = filterUnpairedCsv(new TextDecoder().decode(bytes), await plannedPlantIds(db, { planId: plan.id }));
  await logActivity(db, {
    orgId: viewer.orgId,
    actorId: viewer.userId,
    action: "report.downloaded",
    subjectType: "audit",
    subjectId: audit.id,
    detail: { kind: "unpaired", only: "sampled-and-surveyed", plan: plan.name },
  });
  const day = (audit.computedAt ?? audit.createdAt).slice(0, 10);
  const rev = audit.revision > 1 ? `_rev${audit.revision}` : "";
  const name = `plotproof_${fileSlug(audit.field.name)}_${fileSlug(audit.title)}${rev}_${day}_unpaired-sampled.csv`;
  return new Response(filtered.text, {
    headers: {
      "content-type": "text/csv; charset=utf-8",
      "content-disposition": contentDisposition(name),
      "cache-control": "no-store",
    },
  });
}
