import Link from "next/link";
import { getDb } from "@/db/client";
import { getAuditById } from "@/db/queries/audits";
import { getSurveyRecord, planOfSurvey, unpairedSplitCounts } from "@/db/queries/survey-plans";
import type { Viewer } from "@/lib/server/access";
import { CoverageBlock, InstrumentText, MarkCheckText } from "./survey-evidence";

const n = (x: number) => x.toLocaleString("en-GB");

/**
 * For an audit whose survey was made from a plan: coverage of the plan and the unpaired points split into not sampled,
 * sampled but not found, and surveyed but no record. Nothing for other audits (the result page stays as it was).
 */
export async function AuditPlanPanel({ viewer, auditId }: { viewer: Viewer; auditId: string }) {
  const db = await getDb();
  const audit = await getAuditById(db, { id: auditId, orgId: viewer.orgId });
  if (!audit?.survey || !audit.summary) return null;
  const plan = await planOfSurvey(db, { surveyDatasetId: audit.survey.id, orgId: viewer.orgId });
  if (!plan) return null;
  const [split, record] = await Promise.all([
    unpairedSplitCounts(db, { auditId: audit.id, plan }),
    getSurveyRecord(db, { datasetId: audit.survey.id, orgId: viewer.orgId }),
  ]);
  return (
    <section
      className="mb-6 rounded-plot border border-chalk-line bg-white p-5"
      aria-label="Planned survey"
      data-testid="audit-plan-panel"
    >
      <h2 className="mb-2 text-base font-semibold">
        Survey made from the plan{" "}
        <Link href={`/plans/${plan.id}`} className="text-leaf hover:underline">
          {plan.name}
        </Link>
      </h2>
      {record ? <CoverageBlock record={record} /> : null}
      <dl className="my-3 grid gap-3 text-sm sm:grid-cols-3" data-testid="unpaired-split">
        <div>
          <dt className="text-ink-soft">Sampled, not found</dt>
          <dd className="text-lg font-semibold tabular-nums" data-testid="split-sampled-not-found">
            {n(split.sampledNotFound)}
          </dd>
          <dd className="text-xs text-ink-faint">planned plants with no survey point: dead, missed or mislabelled</dd>
        </div>
        <div>
          <dt className="text-ink-soft">Surveyed, no record</dt>
          <dd className="text-lg font-semibold tabular-nums" data-testid="split-surveyed-no-record">
            {n(split.surveyedNoRecord)}
          </dd>
          <dd className="text-xs text-ink-faint">
            survey points with no as-planted record{split.ambiguous ? `; ${n(split.ambiguous)} more ambiguous` : ""}
          </dd>
        </div>
        <div>
          <dt className="text-ink-soft">Not sampled</dt>
          <dd className="text-lg font-semibold tabular-nums" data-testid="split-not-sampled">
            {n(split.notSampled)}
          </dd>
          <dd className="text-xs text-ink-faint">planted, never asked for by the plan: expected, not a finding</dd>
        </div>
      </dl>
      <p className="text-sm">
        <a className="font-medium text-leaf hover:underline" href={`/api/audits/${audit.id}/unpaired.csv`} download>
          Unpaired CSV (sampled and surveyed only)
        </a>{" "}
        ·{" "}
        <a className="text-leaf hover:underline" href={`/api/audits/${audit.id}/unpaired.csv?all=1`} download>
          with the not-sampled records too
        </a>
      </p>
      {record ? (
        <p className="mt-2 text-sm">
          <MarkCheckText record={record} /> <InstrumentText record={record} />
        </p>
      ) : null}
    </section>
  );
}
