"use client";
import { useState } from "react";
import { useSWRConfig } from "swr";
import { type ApiError, sendJson } from "@/lib/fetcher";
import { reviewKeys } from "@/lib/review/keys";
import type { VerificationDto } from "@/lib/review/types";
import { FieldTime } from "@/app/_components/ui";
import { buttonClass } from "@/app/_components/field-form/controls";

const show = (v: unknown) => (v === undefined ? "missing" : typeof v === "string" ? v : JSON.stringify(v));

/** Re-compute from the raw files and compare; a mismatch is impossible to overlook. */
export function VerifyPanel({
  auditId,
  canVerify,
  signed,
  timeZone,
}: {
  auditId: string;
  canVerify: boolean;
  signed: boolean;
  timeZone: string;
}) {
  const { mutate } = useSWRConfig();
  const [result, setResult] = useState<VerificationDto | null>(null);
  const [busy, setBusy] = useState(false);
  const [problem, setProblem] = useState<string | null>(null);

  async function run() {
    setBusy(true);
    setProblem(null);
    try {
      const { verification } = await sendJson<{ verification: VerificationDto }>(
        `/api/audits/${auditId}/verify`,
        "POST",
      );
      setResult(verification);
      await mutate(reviewKeys.review(auditId));
      await mutate(reviewKeys.activity(auditId));
    } catch (err) {
      setProblem((err as ApiError).message);
    } finally {
      setBusy(false);
    }
  }

  return (
    <section
      aria-label="Verify"
      className="rounded-plot border border-chalk-line bg-white p-5"
      data-testid="verify-panel"
    >
      <div className="flex flex-wrap items-baseline justify-between gap-3">
        <div>
          <h2 className="text-base font-semibold">Verify</h2>
          <p className="text-sm text-ink-soft">
            Reads both raw files again exactly as uploaded, computes the audit again and compares every figure, every
            per-plant row
            {signed ? " and the SHA-256 stored at sign-off" : " with what is stored"}. Nothing is changed.
          </p>
        </div>
        {canVerify ? (
          <button
            type="button"
            onClick={run}
            disabled={busy}
            className={buttonClass.secondary}
            data-testid="verify-button"
          >
            {busy ? "Re-computing…" : "Re-compute and compare"}
          </button>
        ) : (
          <p className="text-sm text-ink-faint">Available once the audit has results.</p>
        )}
      </div>
      {problem ? (
        <p role="alert" className="mt-3 text-sm text-alarm">
          {problem}
        </p>
      ) : null}
      {result ? (
        <div className="mt-4" data-testid="verify-result" data-ok={result.ok}>
          {result.ok ? (
            <p
              role="status"
              className="rounded-plot border-l-4 border-leaf bg-leaf-pale p-3 font-semibold text-leaf-deep"
            >
              ✓ Everything matches
              {result.signed ? ` the signed record (SHA-256 ${result.signedSha256!.slice(0, 16)}…)` : " what is stored"}
              .
            </p>
          ) : (
            <div role="alert" className="rounded-plot border-4 border-alarm bg-alarm-pale p-4 text-alarm">
              <p className="text-lg font-bold uppercase tracking-wide">Mismatch</p>
              <p className="font-semibold">
                {result.signed
                  ? "This audit no longer matches what was signed off."
                  : "Re-computing does not give the stored results."}{" "}
                Do not rely on it until this is explained.
              </p>
            </div>
          )}
          <ul className="mt-3 divide-y divide-chalk-deep text-sm">
            {result.checks.map((c, i) => (
              <li key={`${c.id}-${i}`} className="py-2" data-check={c.id} data-ok={c.ok}>
                <span
                  className={`mr-2 font-semibold ${c.informational ? "text-loam" : c.ok ? "text-leaf" : "text-alarm"}`}
                  data-informational={c.informational ? "true" : undefined}
                >
                  {c.informational ? "ℹ" : c.ok ? "✓" : "✗"} {c.label}
                </span>
                <span className="text-ink-soft">{c.text}</span>
                {c.differences && c.differences.length > 0 ? (
                  <table className="mt-2 w-full text-left text-xs">
                    <thead className="text-ink-faint">
                      <tr>
                        <th className="font-medium">Where</th>
                        <th className="font-medium">Signed / stored</th>
                        <th className="font-medium">Now</th>
                      </tr>
                    </thead>
                    <tbody>
                      {c.differences.map((d) => (
                        <tr key={d.path} className="align-top">
                          <td className="pr-2 font-mono">{d.path}</td>
                          <td className="break-all pr-2 font-mono">{show(d.signed)}</td>
                          <td className="break-all font-mono text-alarm">{show(d.now)}</td>
                        </tr>
                      ))}
                    </tbody>
                  </table>
                ) : null}
              </li>
            ))}
          </ul>
          <p className="mt-2 text-xs text-ink-faint">
            Verified by {result.verifiedBy}, <FieldTime iso={result.verifiedAt} timeZone={timeZone} />.
          </p>
        </div>
      ) : null}
    </section>
  );
}
