import type { Metadata } from "next";
import { requirePageViewer, type Viewer } from "@/lib/server/access";
import { getDb } from "@/db/client";
import { listFields } from "@/db/queries/fields";
import { listAudits, listRecentDatasets } from "@/db/queries/audits";
import { listTeamMembers } from "@/db/queries/members";
import { listGrowerFields } from "@/lib/server/map/field-map";
import {
  Empty,
  FieldSafetyNote,
  FieldTime,
  PageTitle,
  Panel,
  RevisionTag,
  TextLink,
  formatCount,
  formatMm,
  TableScroll,
} from "@/app/_components/ui";
import { ROLE_DUTY, ROLE_LABEL } from "@/lib/roles";
import { STATE_NAME } from "@/lib/review/lifecycle";
import { countOpenAlerts } from "@/db/queries/alerts";

export const metadata: Metadata = { title: "Home" };

export default async function HomePage() {
  const viewer = await requirePageViewer();
  return (
    <>
      <PageTitle sub={ROLE_DUTY[viewer.role]}>{homeTitle(viewer)}</PageTitle>
      <div className="grid gap-6" data-testid={`home-${viewer.role}`}>
        {viewer.role === "technician" ? <TechnicianHome viewer={viewer} /> : null}
        {viewer.role === "qa_lead" || viewer.role === "owner" ? <OpenAlerts viewer={viewer} /> : null}
        {viewer.role === "qa_lead" ? <QaLeadHome viewer={viewer} /> : null}
        {viewer.role === "grower" ? <GrowerHome viewer={viewer} /> : null}
        {viewer.role === "owner" ? <OwnerHome viewer={viewer} /> : null}
      </div>
    </>
  );
}

function homeTitle(v: Viewer): string {
  switch (v.role) {
    case "technician":
      return "Your uploads and audits";
    case "qa_lead":
      return "Audits waiting for your review";
    case "grower":
      return "Your fields and how far to trust their records";
    case "owner":
      return `${v.orgName}: team and fields`;
  }
}

async function TechnicianHome({ viewer }: { viewer: Viewer }) {
  const db = await getDb();
  const [datasets, audits] = await Promise.all([
    listRecentDatasets(db, { orgId: viewer.orgId, limit: 10 }),
    listAudits(db, { orgId: viewer.orgId, limit: 10 }),
  ]);
  return (
    <>
      <FieldSafetyNote />
      <div className="grid gap-6 md:grid-cols-2">
        <Panel title="Recent uploads" action={<TextLink href="/fields">Choose a field</TextLink>}>
          {datasets.length === 0 ? (
            <Empty>No files uploaded yet. Open a field to upload its as-planted records and your survey.</Empty>
          ) : (
            <ul className="divide-y divide-chalk-deep text-sm">
              {datasets.map((d) => (
                <li key={d.id} className="flex justify-between gap-3 py-2" data-testid="home-upload">
                  <span>
                    <TextLink href={`/fields/${d.fieldId}`}>{d.fileName}</TextLink> ·{" "}
                    {d.kind === "planted" ? "as-planted" : "survey"} · {d.fieldName}
                  </span>
                  <span className="text-ink-faint">
                    {d.rowCount} rows · <FieldTime iso={d.uploadedAt} timeZone={d.fieldTimeZone} />
                  </span>
                </li>
              ))}
            </ul>
          )}
        </Panel>
        <AuditList title="Recent audits" audits={audits} empty="No audits yet." />
      </div>
    </>
  );
}

/** Alerts (issue 13): how many breaches of the thresholds nobody has acknowledged yet. */
async function OpenAlerts({ viewer }: { viewer: Viewer }) {
  const open = await countOpenAlerts(await getDb(), { orgId: viewer.orgId });
  return (
    <p
      className={`rounded-plot border px-4 py-3 text-sm ${open ? "border-alarm bg-alarm-pale" : "border-chalk-line bg-white"}`}
      data-testid="home-alerts"
      data-open={open}
    >
      {open === 0
        ? "No open alerts: no computed audit has crossed your thresholds since the last ones were acknowledged. "
        : `${open} open ${open === 1 ? "alert" : "alerts"}: computed audits crossed your thresholds. `}
      <TextLink href="/alerts">{open ? "Read the alerts" : "Thresholds and alerts"}</TextLink>
    </p>
  );
}

async function QaLeadHome({ viewer }: { viewer: Viewer }) {
  const db = await getDb();
  const [waiting, recent] = await Promise.all([
    listAudits(db, { orgId: viewer.orgId, state: "submitted" }),
    listAudits(db, { orgId: viewer.orgId, limit: 10 }),
  ]);
  return (
    <div className="grid gap-6 md:grid-cols-2">
      <AuditList title="Waiting for review" audits={waiting} empty="Nothing is waiting for your review." toReview />
      <AuditList title="Recent audits" audits={recent} empty="No audits yet." />
    </div>
  );
}

async function GrowerHome({ viewer }: { viewer: Viewer }) {
  const fields = await listGrowerFields(await getDb(), { orgId: viewer.orgId });
  return (
    <Panel title="Fields">
      {fields.length === 0 ? (
        <Empty>No fields yet.</Empty>
      ) : (
        <>
          <p className="mb-3 text-sm text-ink-soft">
            Each field shows its latest signed-off audit only; an audit not yet signed off is never used here.
          </p>
          <TableScroll label="Your fields">
            <table className="w-full text-left text-sm" data-testid="grower-fields">
              <thead className="text-ink-faint">
                <tr>
                  <th className="py-1 font-medium">Field</th>
                  <th className="font-medium">Signed-off audit</th>
                  <th className="font-medium">Records against its profile</th>
                  <th className="font-medium">Plant by plant</th>
                  <th className="font-medium">Horizontal RMSE</th>
                </tr>
              </thead>
              <tbody className="divide-y divide-chalk-deep">
                {fields.map((f) => (
                  <tr key={f.field.id} data-field-id={f.field.id} data-signed-audit={f.signed?.id ?? ""}>
                    <td className="py-2">
                      <TextLink href={`/fields/${f.field.id}/map`}>{f.field.name}</TextLink>{" "}
                      <span className="text-ink-faint">· {f.field.farm}</span>
                    </td>
                    <td>
                      {f.signed ? (
                        <>
                          {f.signed.title}
                          {f.signed.passed === null ? null : f.signed.passed ? " (passed)" : " (failed)"}
                        </>
                      ) : (
                        "None signed off yet"
                      )}
                      {f.pending ? (
                        <span className="block text-xs text-loam" data-testid="grower-pending">
                          A newer audit is waiting for sign-off.
                        </span>
                      ) : null}
                    </td>
                    <td data-word={f.signed?.word ?? ""}>{f.signed?.word ?? "–"}</td>
                    <td data-testid="grower-records">
                      {f.signed?.records ? (
                        <>
                          {f.signed.records.doNotRely > 0 ? (
                            <span className="block text-alarm">
                              {formatCount(f.signed.records.doNotRely)} not to rely on
                              {f.signed.causes.length ? ` (${f.signed.causes.join("; ")})` : ""}
                            </span>
                          ) : null}
                          <span className="block">{formatCount(f.signed.records.rely)} to rely on</span>
                          {f.signed.records.notShown > 0 ? (
                            <span className="block text-loam">
                              {formatCount(f.signed.records.notShown)} not yet shown
                            </span>
                          ) : null}
                        </>
                      ) : (
                        "–"
                      )}
                    </td>
                    <td>{formatMm(f.signed?.rmseR)}</td>
                  </tr>
                ))}
              </tbody>
            </table>
          </TableScroll>
        </>
      )}
    </Panel>
  );
}

async function OwnerHome({ viewer }: { viewer: Viewer }) {
  const db = await getDb();
  const [members, fields] = await Promise.all([
    listTeamMembers(db, { orgId: viewer.orgId }),
    listFields(db, { orgId: viewer.orgId }),
  ]);
  return (
    <div className="grid gap-6 md:grid-cols-2">
      <Panel title="Team" action={<TextLink href="/team">Manage team</TextLink>}>
        <ul className="divide-y divide-chalk-deep text-sm">
          {members.map((m) => (
            <li key={m.memberId} className="flex justify-between py-2">
              <span>{m.name}</span>
              <span className="text-ink-soft">{ROLE_LABEL[m.role]}</span>
            </li>
          ))}
        </ul>
      </Panel>
      <Panel title="Fields" action={<TextLink href="/fields">All fields</TextLink>}>
        {fields.length === 0 ? (
          <Empty>No fields yet.</Empty>
        ) : (
          <ul className="divide-y divide-chalk-deep text-sm">
            {fields.map((f) => (
              <li key={f.id} className="flex justify-between py-2">
                <TextLink href={`/fields/${f.id}`}>{f.name}</TextLink>
                <span className="text-ink-faint">{f.datasetCount} files</span>
              </li>
            ))}
          </ul>
        )}
      </Panel>
    </div>
  );
}

function AuditList({
  title,
  audits,
  empty,
  toReview = false,
}: {
  title: string;
  audits: Awaited<ReturnType<typeof listAudits>>;
  empty: string;
  /** Link each item to its review page rather than its result. */
  toReview?: boolean;
}) {
  return (
    <Panel title={title}>
      {audits.length === 0 ? (
        <Empty>{empty}</Empty>
      ) : (
        <ul className="divide-y divide-chalk-deep text-sm">
          {audits.map((a) => (
            <li key={a.id} className="flex justify-between gap-3 py-2" data-testid="home-audit" data-state={a.state}>
              <span>
                <TextLink href={toReview ? `/audits/${a.id}/review` : `/audits/${a.id}`}>{a.title}</TextLink>
                <RevisionTag revision={a.revision} /> · {a.fieldName}
                {a.profileName ? <span className="text-ink-faint"> · {a.profileName}</span> : null}
              </span>
              <span className="text-ink-faint">
                {STATE_NAME[a.state]} · <FieldTime iso={a.updatedAt} timeZone={a.fieldTimeZone} />
              </span>
            </li>
          ))}
        </ul>
      )}
    </Panel>
  );
}
