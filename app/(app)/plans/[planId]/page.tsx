import type { Metadata } from "next";
import { notFound } from "next/navigation";
import { requirePageViewer } from "@/lib/server/access";
import { getDb } from "@/db/client";
import { getSurveyPlan, listControlMarks, listPlanSurveys } from "@/db/queries/survey-plans";
import { can } from "@/lib/roles";
import { idFromParams } from "@/lib/validation/ids";
import { FieldTime, PageTitle, Panel, TextLink } from "@/app/_components/ui";
import { PlanSurveyUpload } from "../plan-forms";
import { PlanMapLoader } from "../plan-map-loader";
import { PlanSafetyNote, PointsTable, SampleSizeText, StrataTable } from "../plan-parts";
import { CoverageBlock, InstrumentText, MarkCheckText } from "../survey-evidence";

export const metadata: Metadata = { title: "Survey plan" };

export default async function PlanPage({ params }: { params: Promise<{ planId: string }> }) {
  const viewer = await requirePageViewer();
  const id = idFromParams(await params, "planId") ?? notFound();
  const db = await getDb();
  const plan = await getSurveyPlan(db, { id, orgId: viewer.orgId });
  if (!plan) notFound();
  const [marks, surveys] = await Promise.all([
    listControlMarks(db, { orgId: viewer.orgId, fieldId: plan.fieldId }),
    listPlanSurveys(db, { planId: plan.id, orgId: viewer.orgId }),
  ]);
  const base = `/api/plans/${plan.id}`;
  return (
    <div className="space-y-6">
      <PageTitle
        sub={
          <>
            <TextLink href={`/fields/${plan.fieldId}/plans`}>{plan.fieldName}</TextLink> · from {plan.plantedFileName} ·
            made by {plan.createdByName} on <FieldTime iso={plan.createdAt} timeZone="UTC" />
            {plan.usedBy > 0 ? " · used by a survey, so it can no longer change" : ""}
          </>
        }
      >
        {plan.name}
      </PageTitle>
      <PlanSafetyNote />
      <Panel title="How many checkpoints">
        <SampleSizeText plan={plan} />
        <p className="mt-2 text-sm text-ink-soft">
          {plan.checkpoints} checkpoints and {plan.spares} spares chosen from {plan.selectionNotes.eligible} of{" "}
          {plan.selectionNotes.plants} plants
          {plan.selectionNotes.excludedAtBedEnds
            ? ` (${plan.selectionNotes.excludedAtBedEnds} left out near bed ends)`
            : ""}
          ; rows at {plan.selectionNotes.bearingDeg.toFixed(1)}°.
        </p>
      </Panel>
      <Panel
        title="Stakeout"
        action={
          <span className="flex flex-wrap gap-3 text-sm">
            <a
              className="font-medium text-leaf hover:underline"
              href={`${base}/stakeout.csv`}
              download
              data-testid="stakeout-csv"
            >
              Stakeout CSV ({plan.fieldCrs})
            </a>
            <a className="font-medium text-leaf hover:underline" href={`${base}/stakeout.geojson`} download>
              GeoJSON
            </a>
            <TextLink href={`/plans/${plan.id}/sheet`}>Field sheet (A4)</TextLink>
          </span>
        }
      >
        <PlanMapLoader
          planId={plan.id}
          fieldName={plan.fieldName}
          crs={plan.fieldCrs}
          points={plan.points}
          marks={marks}
        />
        <div className="mt-4">
          <StrataTable plan={plan} />
        </div>
      </Panel>
      <Panel title="Surveys made from this plan">
        {surveys.length === 0 ? (
          <p className="text-sm text-ink-faint">No survey uploaded against this plan yet.</p>
        ) : (
          <ul className="space-y-4" data-testid="plan-surveys">
            {surveys.map((s) => (
              <li key={s.datasetId} className="border-t border-chalk-line pt-3 text-sm">
                <p className="font-medium">{s.fileName}</p>
                <CoverageBlock record={s} />
                <p className="mt-1">
                  <MarkCheckText record={s} />
                </p>
                <p className="mt-1 text-ink-soft">
                  <InstrumentText record={s} />
                </p>
              </li>
            ))}
          </ul>
        )}
        {can(viewer.role, "CAN_PREPARE") ? (
          <div className="mt-6 border-t border-chalk-line pt-4">
            <h3 className="mb-3 text-sm font-semibold">Upload the survey made from this plan</h3>
            <PlanSurveyUpload fieldId={plan.fieldId} planId={plan.id} crs={plan.fieldCrs} marks={marks} />
          </div>
        ) : null}
      </Panel>
      <Panel title={`Points (${plan.points.length})`}>
        {/* biome-ignore lint/a11y/noNoninteractiveTabindex: a scrolling region must be reachable by keyboard (WCAG 2.1.1) */}
        <div className="max-h-96 overflow-auto" role="region" aria-label="Points" tabIndex={0}>
          <PointsTable points={plan.points} />
        </div>
      </Panel>
    </div>
  );
}
