/** The terms of the result page in plain words. */
export function TermsExplained() {
  return (
    <details className="rounded-plot border border-chalk-line bg-white p-4 text-sm" data-testid="terms">
      <summary className="cursor-pointer font-semibold">What the figures mean</summary>
      <dl className="mt-3 grid gap-x-6 gap-y-2 text-ink-soft sm:grid-cols-[8rem_1fr]">
        <dt className="font-medium text-ink">Error</dt>
        <dd>
          Where the survey found the plant minus where the machine recorded it: east, north, along the row and across
          it.
        </dd>
        <dt className="font-medium text-ink">Bias</dt>
        <dd>
          The average error. A bias means every record is shifted the same way — often a calibration or antenna offset
          that can be corrected.
        </dd>
        <dt className="font-medium text-ink">RMSE</dt>
        <dd>
          Root mean square error: a typical size of the error, bias and scatter together. Large single errors weigh
          heavily.
        </dd>
        <dt className="font-medium text-ink">CEP</dt>
        <dd>Circular error probable: the radius of the circle around each record that holds half of the plants.</dd>
        <dt className="font-medium text-ink">R95</dt>
        <dd>
          The radius that holds 95 % of the plants. “Measured” counts the plants; the “model” value assumes round,
          unbiased scatter.
        </dd>
        <dt className="font-medium text-ink">NSSDA</dt>
        <dd>
          The US National Standard for Spatial Data Accuracy way of stating horizontal accuracy at 95 % confidence from
          the RMSE. It sets no pass mark; the tolerance profile does.
        </dd>
        <dt className="font-medium text-ink">Interval</dt>
        <dd>
          The range the true value most likely lies in, given how many checkpoints were surveyed. Few checkpoints give
          wide intervals.
        </dd>
        <dt className="font-medium text-ink">Outlier</dt>
        <dd>
          A plant whose error is far from the rest (more than 3.5 scaled median deviations). Often a wrong pairing or a
          survey slip — check it in the field.
        </dd>
      </dl>
    </details>
  );
}

/** What the audit does not certify. */
export function ScopeCaution() {
  return (
    <aside
      className="rounded-plot border-l-4 border-stake bg-stake-pale p-4 text-sm"
      aria-label="What this audit covers"
      data-testid="scope-caution"
    >
      <p>
        <span className="font-semibold">This audit certifies the accuracy of the plant records only.</span> It says
        nothing about whether a machine is safe to run: machine safety, guarding and lock-out stay with the operator and
        the machine&apos;s own checks.
      </p>
    </aside>
  );
}
