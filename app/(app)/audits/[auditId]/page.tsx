import type { Metadata } from "next";
import { notFound } from "next/navigation";
import { requirePageViewer } from "@/lib/server/access";
import { can } from "@/lib/roles";
import { idFromParams } from "@/lib/validation/ids";
import { AuditResult } from "@/app/_components/audit/audit-result";
import { getDb } from "@/db/client";
import { getAuditById } from "@/db/queries/audits";
import { checkpointSurveyPrecision } from "@/lib/server/audits/survey-precision";
import { AuditPlanPanel } from "@/app/(app)/plans/audit-plan-panel";

export const metadata: Metadata = { title: "Audit result" };

export default async function AuditPage({ params }: { params: Promise<{ auditId: string }> }) {
  const viewer = await requirePageViewer();
  // The layout has already answered 404 for a malformed id.
  const auditId = idFromParams(await params, "auditId") ?? notFound();
  const db = await getDb();
  const audit = await getAuditById(db, { id: auditId, orgId: viewer.orgId });
  const precision = audit ? await checkpointSurveyPrecision(db, { audit, orgId: viewer.orgId }) : { rmseH: null };
  return (
    <>
      <AuditPlanPanel viewer={viewer} auditId={auditId} />
      <AuditResult auditId={auditId} canPrepare={can(viewer.role, "CAN_PREPARE")} surveyPrecision={precision} />
    </>
  );
}
