import type { Metadata } from "next";
import { requirePageViewer } from "@/lib/access";
import { getDb } from "@/db/client";
import { listAudits } from "@/db/queries/audits";
import { Empty, PageTitle, Panel, formatDate } from "@/app/_components/ui";
import { CAN_REVIEW } from "@/lib/roles";

export const metadata: Metadata = { title: "Review" };

export default async function ReviewPage() {
  const viewer = await requirePageViewer(CAN_REVIEW);
  const waiting = await listAudits(await getDb(), { orgId: viewer.orgId, state: "submitted", limit: 100 });
  return (
    <>
      <PageTitle sub="Audits a technician has submitted for sign-off.">Review</PageTitle>
      <Panel title="Waiting for review">
        {waiting.length === 0 ? <Empty>Nothing is waiting for review.</Empty> : (
          <ul className="divide-y divide-chalk-deep text-sm">
            {waiting.map((a) => <li key={a.id} className="py-2">{a.title} · {a.fieldName} · {formatDate(a.updatedAt)}</li>)}
          </ul>
        )}
      </Panel>
    </>
  );
}
