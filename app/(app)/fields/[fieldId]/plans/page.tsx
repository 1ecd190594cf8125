import type { Metadata } from "next";
import Link from "next/link";
import { notFound } from "next/navigation";
import { requirePageViewer } from "@/lib/server/access";
import { getDb } from "@/db/client";
import { listDatasets } from "@/db/queries/datasets";
import { getFieldById } from "@/db/queries/fields";
import { listProfiles } from "@/db/queries/profiles";
import { listControlMarks, listSurveyPlans } from "@/db/queries/survey-plans";
import { can } from "@/lib/roles";
import { idFromParams } from "@/lib/validation/ids";
import { Empty, FieldTime, PageTitle, Panel, TableScroll, TextLink } from "@/app/_components/ui";
import { ControlMarkForm, NewPlanForm } from "@/app/(app)/plans/plan-forms";
import { PlanSafetyNote } from "@/app/(app)/plans/plan-parts";

export const metadata: Metadata = { title: "Survey plans" };

export default async function FieldPlansPage({ params }: { params: Promise<{ fieldId: string }> }) {
  const viewer = await requirePageViewer();
  const fieldId = idFromParams(await params, "fieldId") ?? notFound();
  const db = await getDb();
  const field = await getFieldById(db, { id: fieldId, orgId: viewer.orgId });
  if (!field) notFound();
  const [plans, marks, datasets, profiles] = await Promise.all([
    listSurveyPlans(db, { orgId: viewer.orgId, fieldId }),
    listControlMarks(db, { orgId: viewer.orgId, fieldId }),
    listDatasets(db, { orgId: viewer.orgId, fieldId }),
    listProfiles(db, { orgId: viewer.orgId }),
  ]);
  const mayPlan = can(viewer.role, "CAN_PLAN_SURVEYS");
  const planted = datasets.filter((d) => d.kind === "planted");
  return (
    <div className="space-y-6">
      <PageTitle sub={<TextLink href={`/fields/${field.id}`}>{field.name}</TextLink>}>Survey plans</PageTitle>
      <PlanSafetyNote />
      <Panel title="Plans">
        {plans.length === 0 ? (
          <Empty>No survey plan for this field yet.</Empty>
        ) : (
          <ul className="divide-y divide-chalk-line text-sm" data-testid="plan-list">
            {plans.map((p) => (
              <li key={p.id} className="py-2">
                <Link href={`/plans/${p.id}`} className="font-medium text-leaf hover:underline">
                  {p.name}
                </Link>{" "}
                · {p.checkpoints} checkpoints, {p.spares} spares · profile &ldquo;{p.profile.name}&rdquo; ·{" "}
                {p.createdByName}, <FieldTime iso={p.createdAt} timeZone={field.timeZone} />
                {p.usedBy > 0 ? ` · surveyed (${p.usedBy})` : ""}
              </li>
            ))}
          </ul>
        )}
      </Panel>
      {mayPlan ? (
        <Panel title="Plan a check survey">
          {planted.length === 0 ? (
            <Empty>Upload the as-planted records first: a plan chooses plants from them.</Empty>
          ) : (
            <NewPlanForm
              fieldId={field.id}
              datasets={planted.map((d) => ({ id: d.id, fileName: d.fileName }))}
              profiles={profiles.map((p) => ({ id: p.id, name: p.name }))}
            />
          )}
        </Panel>
      ) : null}
      <Panel title="Control marks">
        {marks.length === 0 ? (
          <Empty>No control mark for this field yet.</Empty>
        ) : (
          <TableScroll label="Control marks">
            <table className="mb-4 w-full text-sm tabular-nums" data-testid="mark-list">
              <thead>
                <tr className="text-left text-ink-soft">
                  <th className="py-1 pr-3 font-medium">Mark</th>
                  <th className="py-1 pr-3 text-right font-medium">Easting</th>
                  <th className="py-1 pr-3 text-right font-medium">Northing</th>
                  <th className="py-1 pr-3 text-right font-medium">Height</th>
                  <th className="py-1 font-medium">Description and source</th>
                </tr>
              </thead>
              <tbody>
                {marks.map((m) => (
                  <tr key={m.id} className="border-t border-chalk-line">
                    <td className="py-1 pr-3 font-medium">{m.name}</td>
                    <td className="py-1 pr-3 text-right">{m.e.toFixed(3)}</td>
                    <td className="py-1 pr-3 text-right">{m.n.toFixed(3)}</td>
                    <td className="py-1 pr-3 text-right">{m.h !== null ? m.h.toFixed(3) : "–"}</td>
                    <td className="py-1">{[m.description, m.source].filter(Boolean).join(" · ") || "–"}</td>
                  </tr>
                ))}
              </tbody>
            </table>
          </TableScroll>
        )}
        {mayPlan ? <ControlMarkForm fieldId={field.id} /> : null}
      </Panel>
    </div>
  );
}
