import type { Metadata } from "next";
import Link from "next/link";
import { notFound } from "next/navigation";
import { requirePageViewer } from "@/lib/server/access";
import { getDb } from "@/db/client";
import { auditRecordTrustDto, getFieldMapSummary } from "@/lib/server/map/field-map";
import { listProfiles } from "@/db/queries/profiles";
import { RecordTrustPanel } from "@/app/_components/map/record-trust-panel";
import { idFromParams } from "@/lib/validation/ids";
import { Empty, FieldTime, Panel } from "@/app/_components/ui";
import { MapLoader } from "@/app/_components/map/map-loader";
import { BedTable } from "@/app/_components/map/bed-table";
import { RECORD_ACCURACY_REMINDER } from "@/lib/map/guidance";
import { pendingSentence } from "@/lib/map/field-summary";

export const metadata: Metadata = { title: "Field map" };

const mm = (m: number | null) => (m === null ? null : `${(m * 1000).toFixed(0)} mm`);

export default async function FieldMapPage({ params }: { params: Promise<{ fieldId: string }> }) {
  const viewer = await requirePageViewer();
  const fieldId = idFromParams(await params, "fieldId") ?? notFound();
  const db = await getDb();
  const view = await getFieldMapSummary(db, { fieldId: fieldId, orgId: viewer.orgId });
  if (!view) notFound();
  const [trust, profiles] = view.audit
    ? await Promise.all([
        auditRecordTrustDto(db, { auditId: view.audit.id, orgId: viewer.orgId }),
        listProfiles(db, { orgId: viewer.orgId }),
      ])
    : [null, []];
  const p = view.profile;
  const limits = p
    ? [
        mm(p.radialM) && `radial ${mm(p.radialM)}`,
        mm(p.crossM) && `cross-row ${mm(p.crossM)}`,
        mm(p.alongM) && `along-row ${mm(p.alongM)}`,
      ]
        .filter(Boolean)
        .join(", ")
    : "";
  return (
    <div className="grid gap-5" data-testid="field-map-page">
      <header>
        <p className="text-sm text-ink-soft">
          <Link href={`/fields/${view.field.id}`} className="font-medium text-leaf underline-offset-2 hover:underline">
            {view.field.name}
          </Link>
          {view.audit ? (
            <>
              {" · "}
              <Link
                href={`/audits/${view.audit.id}/map`}
                className="font-medium text-leaf underline-offset-2 hover:underline"
              >
                full audit map
              </Link>
            </>
          ) : null}
        </p>
        <h1 className="text-xl font-semibold tracking-tight">
          Where the records of {view.field.name} can be relied on
        </h1>
        {view.audit ? (
          <p className="mt-1 text-sm text-ink-soft" data-testid="field-map-audit" data-audit-id={view.audit.id}>
            From the latest signed-off audit, <span className="font-medium text-ink">{view.audit.title}</span>
            {view.audit.computedAt ? (
              <>
                {" "}
                (computed <FieldTime iso={view.audit.computedAt} timeZone={view.field.timeZone} />)
              </>
            ) : null}
            {p ? (
              <>
                , at the tolerance “{p.name}”
                {limits
                  ? ` (${limits}; ${Math.round(p.requiredShare * 100)} % of plants within, shown with ${Math.round(p.confidence * 100)} % confidence)`
                  : ""}
              </>
            ) : null}
            .
          </p>
        ) : null}
        {view.pending ? (
          <p className="mt-2 rounded-plot border-l-4 border-stake bg-white p-3 text-sm" data-testid="field-map-pending">
            {pendingSentence(view.pending)}
          </p>
        ) : null}
      </header>
      {view.audit ? (
        <>
          <p className="rounded-plot border-l-4 border-stake bg-stake-pale p-4 text-sm" data-testid="field-guidance">
            {view.summary}
          </p>
          {trust ? (
            <RecordTrustPanel trust={trust} profiles={profiles.map((p) => ({ id: p.id, name: p.name }))} />
          ) : null}
          <MapLoader auditId={view.audit.id} mode="grower" />
          <Panel title="Bed by bed">
            <BedTable beds={view.beds} guidance={view.guidance} caption={`Checkpoints per bed in ${view.field.name}`} />
            <p className="mt-3 text-xs text-ink-faint">{RECORD_ACCURACY_REMINDER}</p>
          </Panel>
          <Panel title="Downloads of the signed audit">
            <ul className="grid gap-1 text-sm" data-testid="field-map-downloads">
              <li>
                <a
                  className="font-medium text-leaf hover:underline"
                  href={`/api/audits/${view.audit.id}/residuals.csv`}
                >
                  Per-plant errors (CSV)
                </a>
              </li>
              <li>
                <a className="font-medium text-leaf hover:underline" href={`/api/audits/${view.audit.id}/summary.csv`}>
                  Summary (CSV)
                </a>
              </li>
              <li>
                <a className="font-medium text-leaf hover:underline" href={`/api/audits/${view.audit.id}/unpaired.csv`}>
                  Unpaired points (CSV)
                </a>
              </li>
            </ul>
          </Panel>
        </>
      ) : (
        <Panel title="No signed-off audit yet">
          <Empty>{view.summary}</Empty>
        </Panel>
      )}
    </div>
  );
}
