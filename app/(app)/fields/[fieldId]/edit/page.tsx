import type { Metadata } from "next";
import { notFound } from "next/navigation";
import { requirePageViewer } from "@/lib/server/access";
import { getDb } from "@/db/client";
import { getFieldById, listFields } from "@/db/queries/fields";
import { CAN_PREPARE } from "@/lib/roles";
import { idFromParams } from "@/lib/validation/ids";
import type { FieldDto } from "@/lib/api-types";
import { PageTitle } from "@/app/_components/ui";
import { FieldForm } from "@/app/_components/field-form/field-form";

export const metadata: Metadata = { title: "Edit field" };

export default async function EditFieldPage({ params }: { params: Promise<{ fieldId: string }> }) {
  const viewer = await requirePageViewer(CAN_PREPARE);
  const fieldId = idFromParams(await params, "fieldId") ?? notFound();
  const db = await getDb();
  const [row, fields] = await Promise.all([
    getFieldById(db, { id: fieldId, orgId: viewer.orgId }),
    listFields(db, { orgId: viewer.orgId }),
  ]);
  if (!row) notFound();
  const field: FieldDto = { ...row, boundary: (row as Partial<Pick<FieldDto, "boundary">>).boundary ?? null };
  const farms = [...new Set(fields.map((f) => f.farm))].sort();
  return (
    <>
      <PageTitle sub={`${field.farm} · ${field.crs}`}>Edit {field.name}</PageTitle>
      <FieldForm mode="edit" field={field} farms={farms} />
    </>
  );
}
