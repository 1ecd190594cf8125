import type { Metadata } from "next";
import { requirePageViewer } from "@/lib/server/access";
import { getDb } from "@/db/client";
import { listFields } from "@/db/queries/fields";
import { CAN_PREPARE } from "@/lib/roles";
import { PageTitle } from "@/app/_components/ui";
import { FieldForm } from "@/app/_components/field-form/field-form";

export const metadata: Metadata = { title: "New field" };

export default async function NewFieldPage() {
  const viewer = await requirePageViewer(CAN_PREPARE);
  const fields = await listFields(await getDb(), { orgId: viewer.orgId });
  const farms = [...new Set(fields.map((f) => f.farm))].sort();
  return (
    <>
      <PageTitle sub="Set the field up once; every file uploaded to it is projected into its coordinate system.">
        New field
      </PageTitle>
      <FieldForm mode="create" farms={farms} />
    </>
  );
}
