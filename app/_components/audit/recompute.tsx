"use client";
import { useState } from "react";
import { useSWRConfig } from "swr";
import { sendJson, type ApiError } from "@/lib/fetcher";
import { keys } from "@/lib/swr-keys";
import type { AuditDto } from "@/lib/api-types";

/** "Compute again" on a failed audit: the same files, profile copy and settings, as the same audit. */
export function RecomputeButton({ auditId }: { auditId: string }) {
  const { mutate } = useSWRConfig();
  const [busy, setBusy] = useState(false);
  const [problem, setProblem] = useState<string | null>(null);

  async function recompute() {
    setBusy(true);
    setProblem(null);
    try {
      const res = await sendJson<{ audit: AuditDto }>(`/api/audits/${auditId}/recompute`, "POST");
      // The answer says "computing": the result page polls again until it has finished.
      await mutate(keys.audit(auditId), res, { revalidate: false });
    } catch (err) {
      setProblem((err as ApiError).message);
      await mutate(keys.audit(auditId));
    } finally {
      setBusy(false);
    }
  }

  return (
    <div className="mt-3 flex flex-wrap items-center gap-3">
      <button
        type="button"
        onClick={recompute}
        disabled={busy}
        className="rounded-plot bg-leaf px-3 py-1.5 text-sm font-medium text-white hover:bg-leaf-deep disabled:opacity-60"
        data-testid="recompute"
      >
        {busy ? "Starting…" : "Compute again"}
      </button>
      <span className="text-sm text-ink-soft">Uses the same two files, profile and pairing settings.</span>
      {problem ? (
        <p className="w-full text-sm text-alarm" role="alert" data-testid="recompute-problem">
          {problem}
        </p>
      ) : null}
    </div>
  );
}
