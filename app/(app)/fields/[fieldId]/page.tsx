import type { Metadata } from "next";
import { notFound } from "next/navigation";
import { requirePageViewer } from "@/lib/access";
import { getDb } from "@/db/client";
import { getFieldById } from "@/db/queries/fields";
import { listAudits, listRecentDatasets } from "@/db/queries/audits";
import { Empty, PageTitle, Panel, formatDate } from "@/app/_components/ui";
import { FieldIdParam } from "@/lib/validation/field";

export const metadata: Metadata = { title: "Field" };

export default async function FieldPage({ params }: { params: Promise<{ fieldId: string }> }) {
  const viewer = await requirePageViewer();
  const parsed = FieldIdParam.safeParse(await params);
  if (!parsed.success) notFound();
  const db = await getDb();
  const field = await getFieldById(db, { id: parsed.data.fieldId, orgId: viewer.orgId });
  if (!field) notFound();
  const [datasets, audits] = await Promise.all([
    listRecentDatasets(db, { orgId: viewer.orgId, fieldId: field.id }),
    listAudits(db, { orgId: viewer.orgId, fieldId: field.id }),
  ]);
  const geometry = [
    field.bedSpacingM ? `beds every ${field.bedSpacingM} m` : null,
    field.rowsPerBed ? `${field.rowsPerBed} rows per bed` : null,
    field.rowSpacingM ? `${field.rowSpacingM * 100} cm between rows` : null,
    field.rowBearingDeg !== null ? `rows at ${field.rowBearingDeg}° from grid north` : "row bearing derived from the records",
  ].filter(Boolean).join(" · ");
  return (
    <>
      <PageTitle sub={`${field.farm} · ${field.crs} · ${field.timeZone}`}>{field.name}</PageTitle>
      <p className="mb-6 text-sm text-ink-soft">{geometry}</p>
      <div className="grid gap-6 md:grid-cols-2">
        <Panel title="Files">
          {datasets.length === 0 ? <Empty>No files uploaded for this field yet.</Empty> : (
            <ul className="divide-y divide-chalk-deep text-sm">
              {datasets.map((d) => <li key={d.id} className="py-2">{d.fileName} · {d.kind} · {d.rowCount} rows · {formatDate(d.uploadedAt)}</li>)}
            </ul>
          )}
        </Panel>
        <Panel title="Audits">
          {audits.length === 0 ? <Empty>No audits for this field yet.</Empty> : (
            <ul className="divide-y divide-chalk-deep text-sm">
              {audits.map((a) => <li key={a.id} className="py-2">{a.title} · {a.state}</li>)}
            </ul>
          )}
        </Panel>
      </div>
    </>
  );
}
