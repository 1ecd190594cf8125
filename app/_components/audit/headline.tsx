import type { AuditSummary } from "@/lib/api-types";
import { formatCount, formatIntervalMm, formatMm, formatPct, formatSignedMm } from "./format";

function Figure({
  label,
  value,
  detail,
  testId,
}: {
  label: string;
  value: React.ReactNode;
  detail?: React.ReactNode;
  testId?: string;
}) {
  return (
    <div className="rounded-plot border border-chalk-line bg-white p-4" data-testid={testId}>
      <dt className="text-xs font-medium uppercase tracking-wide text-ink-faint">{label}</dt>
      <dd className="mt-1 text-lg font-semibold">{value}</dd>
      {detail ? <dd className="mt-1 text-xs text-ink-soft">{detail}</dd> : null}
    </div>
  );
}

const NSSDA_CASE: Record<string, string> = {
  case1: "Case 1 (RMSE east ≈ RMSE north)",
  case2: "Case 2 (RMSE east and north differ)",
  "not-applicable": "Standard's formula not applicable; empirical 95 % radius shown",
};

/** Headline accuracy figures in millimetres. */
export function HeadlineFigures({ summary }: { summary: AuditSummary }) {
  const s = summary;
  const w = s.withinTolerance;
  const conf = `${Math.round(s.confidence * 100)} %`;
  const hasRowFrame = s.rowBearingDeg !== null;
  return (
    <section aria-labelledby="figures-heading" data-testid="headline-figures">
      <h2 id="figures-heading" className="mb-3 text-base font-semibold">
        Headline figures
      </h2>
      <p className="mb-3 text-sm text-ink-soft">
        Errors are survey minus as-planted, in millimetres on the {s.crs} grid.{" "}
        {hasRowFrame
          ? `Row direction ${s.rowBearingDeg!.toFixed(1)}° from grid north (${s.rowBearingSource === "given" ? "given" : "derived from the records"}).`
          : "No row direction was known, so there are no along-row or cross-row figures."}
      </p>
      <dl className="grid gap-3 sm:grid-cols-2 lg:grid-cols-4">
        <Figure
          testId="figure-pairs"
          label="Checkpoints paired"
          value={formatCount(s.pairs)}
          detail={`${formatCount(s.pairedById)} by plant id, ${formatCount(s.pairedByPosition)} by position${s.pairedBeyondMaxDistance ? `; ${s.pairedBeyondMaxDistance} by id beyond the maximum distance` : ""}`}
        />
        <Figure
          testId="figure-bias"
          label="Bias east / north"
          value={`${formatSignedMm(s.meanDE)} / ${formatSignedMm(s.meanDN)}`}
          detail={`${conf} intervals: east ${formatIntervalMm(s.meanDECi)}, north ${formatIntervalMm(s.meanDNCi)}`}
        />
        <Figure
          testId="figure-rmse"
          label="RMSE horizontal"
          value={formatMm(s.rmseR)}
          detail={`east ${formatMm(s.rmseE)}, north ${formatMm(s.rmseN)}`}
        />
        <Figure
          testId="figure-cep"
          label="CEP (half of plants within)"
          value={formatMm(s.cep50)}
          detail={
            <>
              measured; <span className="text-ink-faint">circular-normal model {formatMm(s.cep50Model)}</span>
            </>
          }
        />
        <Figure
          testId="figure-r95"
          label="95 % radius (R95)"
          value={formatMm(s.r95)}
          detail={
            <>
              measured; <span className="text-ink-faint">circular-normal model {formatMm(s.r95Model)}</span>
            </>
          }
        />
        <Figure
          testId="figure-nssda"
          label="NSSDA accuracy at 95 %"
          value={formatMm(s.nssda95)}
          detail={s.nssdaNote ?? (s.nssdaCase ? (NSSDA_CASE[s.nssdaCase] ?? s.nssdaCase) : null)}
        />
        <Figure
          testId="figure-cross"
          label="Cross-row RMSE / mean"
          value={hasRowFrame ? `${formatMm(s.rmseCross)} / ${formatSignedMm(s.meanCross)}` : "–"}
          detail={hasRowFrame ? "mean positive = right of the row direction" : "needs a row direction"}
        />
        <Figure
          testId="figure-along"
          label="Along-row RMSE / mean"
          value={hasRowFrame ? `${formatMm(s.rmseAlong)} / ${formatSignedMm(s.meanAlong)}` : "–"}
          detail={hasRowFrame ? "mean positive = ahead in the row direction" : "needs a row direction"}
        />
        <Figure
          testId="figure-within"
          label="Within tolerance"
          value={w ? formatPct(w.share) : "–"}
          detail={
            w
              ? `${formatCount(w.within)} of ${formatCount(w.n)} plants; ${w.lowerOneSided != null ? `decision bound: at least ${formatPct(w.lowerOneSided)} with ${Math.round(w.confidence * 100)} % confidence (one-sided); ` : ""}two-sided ${Math.round(w.confidence * 100)} % interval, a description: ${formatPct(w.lower95)} – ${formatPct(w.upper95)}`
              : "no tolerance limits were set"
          }
        />
        <Figure
          testId="figure-outliers"
          label="Outliers"
          value={formatCount(s.outliers.count)}
          detail={
            <>
              farther than {formatMm(s.outliers.threshold)} from the median error
              {s.withoutOutliers && s.outliers.count > 0 ? (
                <>
                  ; without them RMSE {formatMm(s.withoutOutliers.rmseR)}, R95 {formatMm(s.withoutOutliers.r95)}
                </>
              ) : null}
            </>
          }
        />
        <Figure
          testId="figure-helmert"
          label="Similarity fit (Helmert)"
          value={s.helmert ? `${formatSignedPpm(s.helmert.scale)} · ${formatArcsec(s.helmert.rotationArcsec)}` : "–"}
          detail={
            s.helmert ? (
              <>
                scale (units or projection) and rotation (heading or row-bearing calibration); at the centre of the
                checkpoints the fit shifts east {formatSignedMm(s.meanDE)}, north {formatSignedMm(s.meanDN)}{" "}
                (base-station coordinates or reference frame); fit residual {formatMm(s.helmert.rmse)}
              </>
            ) : (
              "needs at least two pairs"
            )
          }
        />
        <Figure
          testId="figure-unpaired"
          label="Left unpaired"
          value={formatCount(s.unmatchedPlanted + s.unmatchedSurvey + s.ambiguousSurvey)}
          detail={`${formatCount(s.unmatchedPlanted)} planted not found, ${formatCount(s.unmatchedSurvey)} surveyed not planted, ${formatCount(s.ambiguousSurvey)} ambiguous`}
        />
      </dl>
      {s.raw ? <RawComparison summary={s} /> : null}
      {s.notes.length > 0 ? (
        <ul className="mt-3 space-y-1 text-sm text-ink-soft" aria-label="Notes on the result">
          {s.notes.map((n) => (
            <li key={n.code} data-note={n.code}>
              Note: {noteText(n, s.outliers.count)}
            </li>
          ))}
        </ul>
      ) : null}
    </section>
  );
}

function RawComparison({ summary }: { summary: AuditSummary }) {
  const raw = summary.raw!;
  const before = raw.rmseR,
    after = summary.rmseR;
  let sentence: string;
  if (before === null || after === null)
    sentence = "Raw GNSS positions were present, but no RMSE could be computed for them.";
  else if (after < before)
    sentence = `Camera correction reduced the horizontal RMSE from ${formatMm(before)} to ${formatMm(after)}.`;
  else if (after > before)
    sentence = `Camera correction increased the horizontal RMSE from ${formatMm(before)} to ${formatMm(after)} — check the camera calibration.`;
  else sentence = `Camera correction left the horizontal RMSE unchanged at ${formatMm(after)}.`;
  return (
    <div className="mt-3 rounded-plot border border-chalk-line bg-white p-4 text-sm" data-testid="raw-comparison">
      <p className="font-medium">{sentence}</p>
      <p className="mt-1 text-ink-soft">
        Raw GNSS (before camera correction) over {formatCount(raw.pairs)} plants: R95 {formatMm(raw.r95)}, bias{" "}
        {formatSignedMm(raw.meanDE)} east / {formatSignedMm(raw.meanDN)} north
        {summary.rowBearingDeg !== null ? <>, cross-row RMSE {formatMm(raw.rmseCross)}</> : null}.
        {raw.missingRaw > 0 ? ` ${formatCount(raw.missingRaw)} paired plants had no raw position.` : ""}
      </p>
    </div>
  );
}

function formatSignedPpm(scale: number): string {
  const ppm = (scale - 1) * 1e6;
  return `scale ${ppm >= 0 ? "+" : "\u2212"}${Math.abs(ppm).toFixed(0)} ppm`;
}

function formatArcsec(arcsec: number): string {
  return `rotation ${arcsec >= 0 ? "+" : "\u2212"}${Math.abs(arcsec).toFixed(1)}″`;
}

/**
 * A note as the page says it. The engine's outlier note names a key of the summary JSON (it is part of what was
 * signed, so it stays as computed); the page says it in words.
 */
function noteText(n: { code: string; message: string }, outliers: number): string {
  if (n.code !== "outliers") return n.message;
  return `${outliers} pair${outliers === 1 ? " is" : "s are"} flagged as outliers; the figures without them are given above.`;
}
