import type { Metadata } from "next";
import { notFound } from "next/navigation";
import { requirePageViewer } from "@/lib/server/access";
import { getDb } from "@/db/client";
import { getSurveyPlan, listControlMarks } from "@/db/queries/survey-plans";
import { idFromParams } from "@/lib/validation/ids";
import { PrintButton } from "@/app/(app)/audits/[auditId]/report/print-button";
import { TableScroll } from "@/app/_components/ui";
import { PlanPlot, PlanSafetyNote, PointsTable, SampleSizeText } from "../../plan-parts";

export const metadata: Metadata = { title: "Field sheet" };

/** The printable A4 field sheet: points, a small plan, control marks, signatures and the safety caution. */
export default async function FieldSheetPage({ params }: { params: Promise<{ planId: string }> }) {
  const viewer = await requirePageViewer();
  const id = idFromParams(await params, "planId") ?? notFound();
  const db = await getDb();
  const plan = await getSurveyPlan(db, { id, orgId: viewer.orgId });
  if (!plan) notFound();
  const marks = await listControlMarks(db, { orgId: viewer.orgId, fieldId: plan.fieldId });
  const line = "inline-block min-w-40 border-b border-ink";
  return (
    <article className="mx-auto max-w-[190mm] space-y-4 bg-white p-6 text-sm print:p-0" data-testid="field-sheet">
      <style>{"@page { size: A4; margin: 12mm; }"}</style>
      <header className="flex items-start justify-between gap-4">
        <div>
          <h1 className="text-lg font-semibold">Field sheet: {plan.name}</h1>
          <p className="text-ink-soft">
            {plan.fieldName} · coordinates in {plan.fieldCrs} · profile &ldquo;{plan.profile.name}&rdquo; · seed{" "}
            {plan.seed}
          </p>
        </div>
        <span className="print:hidden">
          <PrintButton />
        </span>
      </header>
      <PlanSafetyNote />
      <SampleSizeText plan={plan} />
      <PlanPlot points={plan.points} marks={marks} width={640} height={260} />
      <section aria-label="Control marks" data-testid="sheet-marks">
        <h2 className="mb-1 font-semibold">Control mark check (measure before and after the survey)</h2>
        <TableScroll label="Control marks">
          <table className="w-full tabular-nums">
            <thead>
              <tr className="text-left text-ink-soft">
                <th className="py-1 pr-2 font-medium">Mark</th>
                <th className="py-1 pr-2 text-right font-medium">Known E</th>
                <th className="py-1 pr-2 text-right font-medium">Known N</th>
                <th className="py-1 pr-2 font-medium">Before: E / N</th>
                <th className="py-1 font-medium">After: E / N</th>
              </tr>
            </thead>
            <tbody>
              {marks.length === 0 ? (
                <tr>
                  <td colSpan={5} className="py-2 text-ink-soft">
                    This field has no control mark yet: name the mark used and its known position here.
                  </td>
                </tr>
              ) : (
                marks.map((m) => (
                  <tr key={m.id} className="border-t border-chalk-line">
                    <td className="py-2 pr-2">
                      {m.name}
                      {m.description ? <span className="block text-xs text-ink-soft">{m.description}</span> : null}
                    </td>
                    <td className="py-2 pr-2 text-right">{m.e.toFixed(3)}</td>
                    <td className="py-2 pr-2 text-right">{m.n.toFixed(3)}</td>
                    <td className="py-2 pr-2">
                      <span className={line} />
                    </td>
                    <td className="py-2">
                      <span className={line} />
                    </td>
                  </tr>
                ))
              )}
            </tbody>
          </table>
        </TableScroll>
        <p className="mt-2">
          Instrument <span className={line} /> serial <span className={line} /> calibrated <span className={line} />{" "}
          stated precision <span className={line} /> mm
        </p>
      </section>
      <section aria-label="Points">
        <h2 className="mb-1 font-semibold">
          Points ({plan.checkpoints} checkpoints, {plan.spares} spares — survey a spare of the same bed only in place of
          a dead or missing checkpoint)
        </h2>
        <TableScroll label="Points">
          <PointsTable points={plan.points} compact />
        </TableScroll>
      </section>
      <section
        aria-label="Signatures"
        className="grid grid-cols-1 gap-8 pt-6 sm:grid-cols-2 print:grid-cols-2"
        data-testid="sheet-signatures"
      >
        <p>
          Surveyed by <span className={line} />
          <br />
          Date <span className={line} /> Signature <span className={line} />
        </p>
        <p>
          Checked by (QA lead) <span className={line} />
          <br />
          Date <span className={line} /> Signature <span className={line} />
        </p>
      </section>
    </article>
  );
}
