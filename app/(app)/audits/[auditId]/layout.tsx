import { notFound } from "next/navigation";
import { requirePageViewer } from "@/lib/server/access";
import { getDb } from "@/db/client";
import { getAuditById } from "@/db/queries/audits";
import { idFromParams } from "@/lib/validation/ids";

// The existence check lives in the layout, outside any loading boundary,
// so another organisation's audit answers with a real 404 status.
export default async function AuditLayout({
  children,
  params,
}: {
  children: React.ReactNode;
  params: Promise<{ auditId: string }>;
}) {
  const viewer = await requirePageViewer();
  const auditId = idFromParams(await params, "auditId") ?? notFound();
  const audit = await getAuditById(await getDb(), { id: auditId, orgId: viewer.orgId });
  if (!audit) notFound();
  return children;
}
