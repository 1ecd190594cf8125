import type { AuditSummary } from "@/lib/api-types";
import { accuracyStatement } from "@/lib/audit/accuracy-statement";

/**
 * The accuracy statement in the standards' own form: NSSDA (FGDC-STD-007.3-1998 §3.2.3) and ASPRS Positional
 * Accuracy Standards, Edition 2 (2023). `surveyRmseH` is the checkpoint survey's own horizontal RMSE in metres,
 * null when the audit does not know it; `surveySource` says where it came from.
 */
export function AccuracyStatementBlock({
  summary,
  surveyRmseH,
  surveySource,
  compact = false,
}: {
  summary: AuditSummary;
  surveyRmseH: number | null;
  surveySource?: string;
  /** Without its own heading and frame (the printable report gives it a section). */
  compact?: boolean;
}) {
  const s = summary;
  if (s.rmseE === null || s.rmseN === null || s.r95 === null || s.pairs === 0) return null;
  const st = accuracyStatement({ rmseE: s.rmseE, rmseN: s.rmseN, r95: s.r95, pairs: s.pairs, surveyRmseH });
  const body = (
    <dl className="grid grid-cols-[auto_1fr] gap-x-4 gap-y-1 text-sm">
      <dt className="text-ink-soft">NSSDA (FGDC-STD-007.3-1998)</dt>
      <dd data-testid="statement-nssda">{st.nssda.sentence}</dd>
      <dt className="text-ink-soft">ASPRS Edition 2 (2023)</dt>
      <dd data-testid="statement-asprs">
        {st.asprs.sentence}
        {st.asprs.surveyAccounted && surveySource ? (
          <span className="text-ink-soft">
            {" "}
            RMSE_H2 taken as {surveySource}, read as the survey&apos;s horizontal RMSE.
          </span>
        ) : null}
      </dd>
    </dl>
  );
  if (compact) return <div data-testid="accuracy-statement">{body}</div>;
  return (
    <section aria-labelledby="statement-heading" data-testid="accuracy-statement" className="mt-4">
      <h2 id="statement-heading" className="mb-2 text-base font-semibold">
        Accuracy statement
      </h2>
      {body}
    </section>
  );
}
