import type { Metadata } from "next";
import Link from "next/link";
import { requirePageViewer } from "@/lib/server/access";
import { getDb } from "@/db/client";
import { listAuditsInState, type ReviewListItem } from "@/db/queries/review";
import { Empty, FieldTime, PageTitle, Panel } from "@/app/_components/ui";
import { StateBadge } from "@/app/_components/review/state-badge";
import { CAN_REVIEW } from "@/lib/roles";

export const metadata: Metadata = { title: "Review" };

function AuditRows({
  audits,
  empty,
  testId,
  by,
}: {
  audits: ReviewListItem[];
  empty: string;
  testId: string;
  by: string;
}) {
  if (audits.length === 0) return <Empty>{empty}</Empty>;
  return (
    <table className="w-full text-left text-sm" data-testid={testId}>
      <thead className="text-ink-faint">
        <tr>
          <th className="py-1 font-medium">Audit</th>
          <th className="font-medium">Field</th>
          <th className="font-medium">Profile</th>
          <th className="font-medium">Verdict</th>
          <th className="font-medium">{by}</th>
          <th className="font-medium">When</th>
        </tr>
      </thead>
      <tbody className="divide-y divide-chalk-deep">
        {audits.map((a) => (
          <tr key={a.id} data-audit-id={a.id}>
            <td className="py-2">
              <Link href={`/audits/${a.id}/review`} className="font-medium text-leaf hover:underline">
                {a.title}
              </Link>
              {a.revision > 1 ? <span className="text-ink-faint"> · revision {a.revision}</span> : null}
            </td>
            <td>{a.fieldName}</td>
            <td>{a.profileName ?? "–"}</td>
            <td>
              {a.passed === null ? (
                "–"
              ) : a.passed ? (
                <span className="text-leaf">passed</span>
              ) : (
                <span className="text-alarm">failed</span>
              )}
            </td>
            <td>{a.by ?? "–"}</td>
            <td className="text-ink-soft">
              <FieldTime iso={a.since} timeZone={a.fieldTimeZone} />
            </td>
          </tr>
        ))}
      </tbody>
    </table>
  );
}

export default async function ReviewListPage() {
  const viewer = await requirePageViewer(CAN_REVIEW);
  const db = await getDb();
  const [waiting, returned, signed] = await Promise.all([
    listAuditsInState(db, { orgId: viewer.orgId, state: "submitted" }),
    listAuditsInState(db, { orgId: viewer.orgId, state: "returned", limit: 20 }),
    listAuditsInState(db, { orgId: viewer.orgId, state: "signed_off", limit: 20 }),
  ]);
  return (
    <>
      <PageTitle sub="Audits technicians have submitted, and what became of them.">Review</PageTitle>
      <div className="grid gap-6">
        <Panel title="Waiting for your sign-off" action={<StateBadge state="submitted" />}>
          <AuditRows
            audits={waiting}
            empty="Nothing is waiting for review."
            testId="review-waiting"
            by="Submitted by"
          />
        </Panel>
        <Panel title="Returned for correction" action={<StateBadge state="returned" />}>
          <AuditRows
            audits={returned}
            empty="No audit is waiting for correction."
            testId="review-returned"
            by="Returned by"
          />
        </Panel>
        <Panel title="Recently signed off" action={<StateBadge state="signed_off" />}>
          <AuditRows audits={signed} empty="Nothing signed off yet." testId="review-signed" by="Signed by" />
        </Panel>
        <p className="text-sm text-ink-soft">
          <Link href="/activity" className="font-medium text-leaf hover:underline">
            Activity of the whole organisation
          </Link>
        </p>
      </div>
    </>
  );
}
