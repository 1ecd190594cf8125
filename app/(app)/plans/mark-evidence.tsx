import type { SurveyRecordDto } from "@/lib/plan/dto";

const mm = (m: number) => `${Number((m * 1000).toFixed(1))} mm`;

/** The control-mark check as one line, kept as the sign-off's note. */
export function markEvidenceNote(record: SurveyRecordDto): string {
  const c = record.instrumentCheck!;
  return `${c.markName}: before ${mm(c.before.d)}, after ${c.after ? mm(c.after.d) : "not measured"}; precision ${mm(c.precisionM)}; ${c.word} (recorded at upload)`.slice(
    0,
    300,
  );
}

/** The sign-off checklist's control-mark item when the survey upload recorded the check. */
export function MarkEvidence({ record }: { record: SurveyRecordDto }) {
  const c = record.instrumentCheck!;
  const tone = c.word === "meets" ? "text-leaf" : c.word === "check" ? "text-loam" : "font-semibold text-alarm";
  return (
    <div className="text-sm" data-testid="control-mark-evidence" data-word={c.word}>
      <p className="font-medium">Control mark checked before and after the survey (recorded at upload)</p>
      <p className="text-ink-soft">
        {c.markName}: before {mm(c.before.d)} from the known position (east {mm(c.before.dE)}, north {mm(c.before.dN)})
        {c.after ? `, after ${mm(c.after.d)}` : ", not measured after"}; the instrument states {mm(c.precisionM)}
        {record.instrument
          ? ` (${record.instrument}${record.serial ? `, serial ${record.serial}` : ""}${record.calibrationDate ? `, calibrated ${record.calibrationDate}` : ""})`
          : ""}
        {record.surveyor ? `; surveyed by ${record.surveyor}` : ""}.
      </p>
      <p className={tone}>
        {c.word === "meets" ? "Meets" : c.word === "check" ? "Check" : "Fails"}: {c.reasons.join("; ")}.
      </p>
      {c.word === "fails" ? (
        <p className="text-alarm">The instrument check failed; return the audit for a new survey rather than sign.</p>
      ) : null}
    </div>
  );
}
