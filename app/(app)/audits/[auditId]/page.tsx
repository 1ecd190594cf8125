import type { Metadata } from "next";
import { requirePageViewer } from "@/lib/access";
import { CAN_PREPARE } from "@/lib/roles";
import { AuditResult } from "@/app/_components/audit/audit-result";
import { AuditIdParam } from "./params";

export const metadata: Metadata = { title: "Audit result" };

export default async function AuditPage({ params }: { params: Promise<{ auditId: string }> }) {
  const viewer = await requirePageViewer();
  // The layout has already answered 404 for a malformed id.
  const { auditId } = AuditIdParam.parse(await params);
  return <AuditResult auditId={auditId} canPrepare={CAN_PREPARE.includes(viewer.role)} />;
}
