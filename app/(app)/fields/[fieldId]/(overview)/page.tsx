import type { Metadata } from "next";
import Link from "next/link";
import { notFound } from "next/navigation";
import { requirePageViewer } from "@/lib/server/access";
import { getDb } from "@/db/client";
import { getFieldById } from "@/db/queries/fields";
import { listAudits } from "@/db/queries/audits";
import { listDatasets } from "@/db/queries/datasets";
import { Empty, FieldTime, PageTitle, Panel, RevisionTag, formatMm, TableScroll } from "@/app/_components/ui";
import { STATE_NAME } from "@/lib/review/lifecycle";
import { idFromParams } from "@/lib/validation/ids";
import { can } from "@/lib/roles";
import { DeleteDatasetButton } from "./delete-dataset-button";

export const metadata: Metadata = { title: "Field" };

function ActionLink({ href, children }: { href: string; children: React.ReactNode }) {
  return (
    <Link
      href={href}
      className="inline-flex min-h-11 items-center rounded-plot border border-leaf px-3 py-1.5 text-sm font-medium text-leaf no-underline hover:bg-leaf-pale"
    >
      {children}
    </Link>
  );
}

export default async function FieldPage({ params }: { params: Promise<{ fieldId: string }> }) {
  const viewer = await requirePageViewer();
  const fieldId = idFromParams(await params, "fieldId") ?? notFound();
  const db = await getDb();
  const field = await getFieldById(db, { id: fieldId, orgId: viewer.orgId });
  if (!field) notFound();
  const [datasets, audits] = await Promise.all([
    listDatasets(db, { orgId: viewer.orgId, fieldId: field.id }),
    listAudits(db, { orgId: viewer.orgId, fieldId: field.id }),
  ]);
  const canPrepare = can(viewer.role, "CAN_PREPARE");
  const geometry = [
    field.bedSpacingM ? `beds every ${field.bedSpacingM} m` : null,
    field.rowsPerBed ? `${field.rowsPerBed} rows per bed` : null,
    field.rowSpacingM ? `${Math.round(field.rowSpacingM * 1000) / 10} cm between rows` : null,
    field.rowBearingDeg !== null
      ? `rows at ${field.rowBearingDeg}° from grid north`
      : "row bearing derived from the records",
    field.boundary ? "boundary set" : null,
  ]
    .filter(Boolean)
    .join(" · ");
  const hasBoth = datasets.some((d) => d.kind === "planted") && datasets.some((d) => d.kind === "survey");
  return (
    <>
      <PageTitle sub={`${field.farm} · ${field.crs} · ${field.timeZone}`}>{field.name}</PageTitle>
      <p className="mb-4 text-sm text-ink-soft">{geometry}</p>
      {audits.some((a) => a.state !== "computing" && a.state !== "failed") ? (
        <p className="mb-4 text-sm">
          <Link href={`/fields/${field.id}/map`} className="font-medium text-leaf hover:underline">
            Where can the records be trusted? Open the field map
          </Link>
          {" · "}
          <Link
            href={`/fields/${field.id}/season`}
            className="font-medium text-leaf hover:underline"
            data-testid="field-season-link"
          >
            The field's season: its audits over the months
          </Link>
        </p>
      ) : null}
      {canPrepare ? (
        <nav className="mb-6 flex flex-wrap gap-3" aria-label="Field actions">
          <ActionLink href={`/fields/${field.id}/upload?kind=planted`}>Upload as-planted records</ActionLink>
          <ActionLink href={`/fields/${field.id}/upload?kind=survey`}>Upload survey</ActionLink>
          {hasBoth ? <ActionLink href={`/fields/${field.id}/audits/new`}>New audit</ActionLink> : null}
          <ActionLink href={`/fields/${field.id}/edit`}>Edit field</ActionLink>
          <ActionLink href={`/fields/${field.id}/plans`}>Survey plans</ActionLink>
        </nav>
      ) : null}
      <div className="grid gap-6">
        <Panel title="Audits">
          {audits.length === 0 ? (
            <Empty>No audits for this field yet.</Empty>
          ) : (
            <TableScroll label="Audits of this field">
              <table className="w-full text-left text-sm" data-testid="field-audits">
                <thead className="text-ink-faint">
                  <tr>
                    <th className="py-1 font-medium">Audit</th>
                    <th className="font-medium">State</th>
                    <th className="font-medium">Verdict</th>
                    <th className="font-medium">Horizontal RMSE</th>
                    <th className="font-medium">Updated</th>
                  </tr>
                </thead>
                <tbody className="divide-y divide-chalk-deep">
                  {audits.map((a) => (
                    <tr key={a.id}>
                      <td className="py-2">
                        <Link href={`/audits/${a.id}`} className="font-medium text-leaf hover:underline">
                          {a.title}
                        </Link>
                        <RevisionTag revision={a.revision} />
                        {a.profileName ? <span className="block text-xs text-ink-faint">{a.profileName}</span> : null}
                      </td>
                      <td data-testid="field-audit-state">{STATE_NAME[a.state]}</td>
                      <td>
                        {a.passed === null ? (
                          "–"
                        ) : a.passed ? (
                          <span className="text-leaf">✓ passed</span>
                        ) : (
                          <span className="text-alarm">✗ failed</span>
                        )}
                      </td>
                      <td>{formatMm(a.rmseR)}</td>
                      <td className="text-ink-faint">
                        <FieldTime iso={a.updatedAt} timeZone={field.timeZone} />
                      </td>
                    </tr>
                  ))}
                </tbody>
              </table>
            </TableScroll>
          )}
        </Panel>
        <Panel title="Files">
          {datasets.length === 0 ? (
            <Empty>No files uploaded for this field yet.</Empty>
          ) : (
            <TableScroll label="Files of this field">
              <table className="w-full text-left text-sm" data-testid="field-datasets">
                <thead className="text-ink-faint">
                  <tr>
                    <th className="py-1 font-medium">File</th>
                    <th className="font-medium">Kind</th>
                    <th className="font-medium">Rows</th>
                    <th className="font-medium">CRS</th>
                    <th className="font-medium">SHA-256</th>
                    <th className="font-medium">Uploaded</th>
                    <th>
                      <span className="sr-only">Actions</span>
                    </th>
                  </tr>
                </thead>
                <tbody className="divide-y divide-chalk-deep">
                  {datasets.map((d) => (
                    <tr key={d.id}>
                      <td className="py-2">
                        <a href={`/api/datasets/${d.id}/file`} className="text-leaf hover:underline">
                          {d.fileName}
                        </a>
                      </td>
                      <td>{d.kind === "planted" ? "as-planted" : "survey"}</td>
                      <td>{d.rowCount.toLocaleString("en-GB")}</td>
                      <td className="font-mono text-xs">{d.crs}</td>
                      <td className="font-mono text-xs" title={d.sha256}>
                        {d.sha256.slice(0, 12)}…
                      </td>
                      <td className="text-ink-faint">
                        <FieldTime iso={d.uploadedAt} timeZone={field.timeZone} />
                      </td>
                      <td className="text-right">
                        {canPrepare && !d.inUse ? (
                          <DeleteDatasetButton id={d.id} name={d.fileName} />
                        ) : d.inUse ? (
                          <span className="text-xs text-ink-faint">used by an audit</span>
                        ) : null}
                      </td>
                    </tr>
                  ))}
                </tbody>
              </table>
            </TableScroll>
          )}
        </Panel>
      </div>
    </>
  );
}
