import type { Metadata } from "next";
import { notFound } from "next/navigation";
import { requirePageViewer } from "@/lib/server/access";
import { can } from "@/lib/roles";
import { idFromParams } from "@/lib/validation/ids";
import { AuditResult } from "@/app/_components/audit/audit-result";
import { AuditPlanPanel } from "@/app/(app)/plans/audit-plan-panel";

export const metadata: Metadata = { title: "Audit result" };

export default async function AuditPage({ params }: { params: Promise<{ auditId: string }> }) {
  const viewer = await requirePageViewer();
  // The layout has already answered 404 for a malformed id.
  const auditId = idFromParams(await params, "auditId") ?? notFound();
  return (
    <>
      <AuditPlanPanel viewer={viewer} auditId={auditId} />
      <AuditResult auditId={auditId} canPrepare={can(viewer.role, "CAN_PREPARE")} />
    </>
  );
}
