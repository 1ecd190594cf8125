import { notFound } from "next/navigation";
import { requirePageViewer } from "@/lib/server/access";
import { getDb } from "@/db/client";
import { getFieldById } from "@/db/queries/fields";
import { idFromParams } from "@/lib/validation/ids";

// The existence check lives in the layout, outside this segment's loading boundary,
// so another organisation's field answers with a real 404 status.
export default async function FieldLayout({
  children,
  params,
}: {
  children: React.ReactNode;
  params: Promise<{ fieldId: string }>;
}) {
  const viewer = await requirePageViewer();
  const fieldId = idFromParams(await params, "fieldId") ?? notFound();
  const field = await getFieldById(await getDb(), { id: fieldId, orgId: viewer.orgId });
  if (!field) notFound();
  return children;
}
