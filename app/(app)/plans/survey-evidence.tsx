import type { SurveyRecordDto } from "@/lib/plan/dto";

const mm = (m: number) => `${Number((m * 1000).toFixed(1))} mm`;
const WORD_CLASS = { meets: "text-leaf", check: "text-loam", fails: "text-alarm" } as const;

/** The control-mark check of a survey in words and numbers. */
export function MarkCheckText({ record }: { record: SurveyRecordDto }) {
  const c = record.instrumentCheck;
  if (!c || !record.markCheck) return <span>No control-mark check was recorded with this survey.</span>;
  return (
    <span data-testid="mark-check" data-word={c.word}>
      Mark {c.markName}: before the survey {mm(c.before.d)} off (east {mm(c.before.dE)}, north {mm(c.before.dN)})
      {c.after ? `, after ${mm(c.after.d)}` : ", not re-measured after"}; instrument precision {mm(c.precisionM)}
      {c.tightestLimitM !== null ? `, tightest limit ${mm(c.tightestLimitM)}` : ""}.{" "}
      <strong className={WORD_CLASS[c.word]}>
        {c.word === "meets" ? "Meets" : c.word === "check" ? "Check" : "Fails"}
      </strong>
      : {c.reasons.join("; ")}.
    </span>
  );
}

/** Instrument, calibration, surveyor and method as recorded at upload. */
export function InstrumentText({ record }: { record: SurveyRecordDto }) {
  const parts = [
    record.instrument ? `instrument ${record.instrument}` : null,
    record.serial ? `serial ${record.serial}` : null,
    record.calibrationDate ? `calibrated ${record.calibrationDate}` : null,
    record.surveyor ? `surveyed by ${record.surveyor}` : null,
    record.method ? `method: ${record.method}` : null,
  ].filter(Boolean);
  return <span>{parts.length ? `${parts.join(", ")}.` : "No instrument details were recorded."}</span>;
}

/** Coverage of the plan by one survey. */
export function CoverageBlock({ record }: { record: SurveyRecordDto }) {
  const c = record.coverage;
  if (!c) return null;
  const reported = c.missing.filter((m) => m.status !== "absent");
  const absent = c.missing.filter((m) => m.status === "absent");
  return (
    <div className="text-sm" data-testid="coverage">
      <p>
        <strong data-testid="coverage-surveyed">
          {c.checkpointsSurveyed} of {c.planned} planned checkpoints surveyed
        </strong>
        {c.sparesSurveyed ? `, plus ${c.sparesSurveyed} spare(s)` : ""}; {c.missing.length} missing ({reported.length}{" "}
        reported {reported.map((m) => `${m.name} ${m.status}${m.line ? ` (line ${m.line})` : ""}`).join(", ") || "–"};{" "}
        {absent.length} absent); {c.extra.count} extra point(s) not in the plan
        {c.extra.unnamed ? ` (${c.extra.unnamed} without an id)` : ""}.
      </p>
      <p className={c.allStrataMeet ? "text-leaf" : "font-semibold text-alarm"} data-testid="coverage-strata">
        {c.allStrataMeet
          ? `Every stratum still has its minimum (${c.strata.length} strata).`
          : `Below the minimum: ${c.strata
              .filter((s) => !s.meets)
              .map((s) => `${s.key} ${s.surveyed} of ${s.minimum}`)
              .join("; ")}.`}
      </p>
    </div>
  );
}
