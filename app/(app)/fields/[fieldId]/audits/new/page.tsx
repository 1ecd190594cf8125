import type { Metadata } from "next";
import { notFound } from "next/navigation";
import { requirePageViewer } from "@/lib/server/access";
import { getDb } from "@/db/client";
import { getFieldById } from "@/db/queries/fields";
import { CAN_PREPARE } from "@/lib/roles";
import { idFromParams } from "@/lib/validation/ids";
import { PageTitle, TextLink } from "@/app/_components/ui";
import { NewAuditForm } from "./new-audit-form";

export const metadata: Metadata = { title: "New audit" };

export default async function NewAuditPage({ params }: { params: Promise<{ fieldId: string }> }) {
  const viewer = await requirePageViewer(CAN_PREPARE);
  const fieldId = idFromParams(await params, "fieldId") ?? notFound();
  const field = await getFieldById(await getDb(), { id: fieldId, orgId: viewer.orgId });
  if (!field) notFound();
  return (
    <>
      <PageTitle
        sub={
          <>
            Compare a survey of checkpoints with the as-planted records of{" "}
            <TextLink href={`/fields/${field.id}`}>{field.name}</TextLink>.
          </>
        }
      >
        New audit
      </PageTitle>
      <NewAuditForm
        field={{
          id: field.id,
          name: field.name,
          crs: field.crs,
          rowBearingDeg: field.rowBearingDeg,
          timeZone: field.timeZone,
        }}
      />
    </>
  );
}
