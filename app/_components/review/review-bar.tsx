"use client";
import { useState } from "react";
import Link from "next/link";
import useSWR, { useSWRConfig } from "swr";
import { fetcher, sendJson, type ApiError } from "@/lib/fetcher";
import { reviewKeys } from "@/lib/review/keys";
import type { ReviewDto } from "@/lib/review/types";
import { FieldTime, formatDate } from "@/app/_components/ui";
import { RETURN_REASONS } from "@/lib/review/return-reasons";
import { StateBadge } from "./state-badge";

const button = "rounded-plot bg-leaf px-3 py-1.5 text-sm font-medium text-white hover:bg-leaf-deep disabled:opacity-60";
const link = "text-sm font-medium text-leaf underline-offset-2 hover:underline";

/**
 * Where an audit stands in review, with the steps the viewer's role allows: submit here, the others on
 * the audit's review page. Place it on any page about one audit.
 */
export function ReviewBar({
  auditId,
  showReviewLink = true,
  timeZone,
}: {
  auditId: string;
  showReviewLink?: boolean;
  /** The field's time zone: times are shown in it (UTC on hover); UTC when not given. */
  timeZone?: string;
}) {
  const { data, error, mutate } = useSWR<{ review: ReviewDto }>(reviewKeys.review(auditId), fetcher);
  const { mutate: mutateOther } = useSWRConfig();
  const [submitting, setSubmitting] = useState(false);
  const [note, setNote] = useState("");
  const [busy, setBusy] = useState(false);
  const [problem, setProblem] = useState<string | null>(null);

  if (error)
    return (
      <p className="text-sm text-alarm" role="alert">
        The review state could not be loaded: {(error as Error).message}
      </p>
    );
  if (!data) return <div className="h-10" aria-busy="true" />;
  const r = data.review;
  const reviewHref = `/audits/${auditId}/review`;
  const when = (iso: string) => (timeZone ? <FieldTime iso={iso} timeZone={timeZone} /> : formatDate(iso));

  async function submit() {
    setBusy(true);
    setProblem(null);
    try {
      const res = await sendJson<{ review: ReviewDto }>(`/api/audits/${auditId}/submit`, "POST", {
        note: note.trim() || null,
      });
      await mutate(res, { revalidate: false });
      await mutateOther(reviewKeys.audit(auditId));
      await mutateOther(reviewKeys.activity(auditId));
      setSubmitting(false);
    } catch (err) {
      setProblem((err as ApiError).message);
    } finally {
      setBusy(false);
    }
  }

  return (
    <section
      aria-label="Review"
      className="rounded-plot border border-chalk-line bg-white px-4 py-3 print:hidden"
      data-testid="review-bar"
      data-state={r.state}
    >
      <div className="flex flex-wrap items-center gap-x-4 gap-y-2">
        <StateBadge state={r.state} />
        <span className="text-sm text-ink-soft">
          Revision {r.revision}
          {r.state === "submitted" && r.submitted ? (
            <>
              {" "}
              · submitted by {r.submitted.by}, {when(r.submitted.at)}
            </>
          ) : null}
          {r.state === "signed_off" && r.signoff ? (
            <>
              {" "}
              · signed off by {r.signoff.signerName}, {when(r.signoff.signedAt)}
              {r.signoff.deviation ? " (with deviation)" : ""}
            </>
          ) : null}
          {r.state === "returned" && r.returned ? (
            <>
              {" "}
              · returned by {r.returned.by}, {when(r.returned.at)}
            </>
          ) : null}
        </span>
        {r.revisedBy ? (
          <Link className={link} href={`/audits/${r.revisedBy}`}>
            Go to the corrected revision
          </Link>
        ) : null}
        <div className="ml-auto flex flex-wrap items-center gap-3">
          {r.allowed.includes("submit") && !submitting ? (
            <button
              type="button"
              className={button}
              onClick={() => setSubmitting(true)}
              data-testid="review-bar-submit"
            >
              Submit for sign-off
            </button>
          ) : null}
          {r.allowed.includes("sign_off") ? (
            <Link className={button} href={`${reviewHref}#decide`} data-testid="review-bar-decide">
              Review and decide
            </Link>
          ) : null}
          {r.allowed.includes("revise") ? (
            <Link className={button} href={`${reviewHref}#revise`}>
              Correct and re-run
            </Link>
          ) : null}
          {r.state === "signed_off" ? (
            <Link className={link} href={`/audits/${auditId}/report`} data-testid="review-bar-report">
              Printable sign-off report
            </Link>
          ) : null}
          {showReviewLink ? (
            <Link className={link} href={reviewHref} data-testid="review-bar-link">
              Review page
            </Link>
          ) : null}
        </div>
      </div>
      {r.state === "returned" && r.returned ? (
        <div className="mt-3 border-t border-chalk-deep pt-3 text-sm" data-testid="returned-reasons">
          <p className="font-medium">Why it was returned</p>
          <ul className="mt-1 list-disc pl-5">
            {r.returned.reasons.map((reason) => (
              <li key={reason}>{RETURN_REASONS[reason] ?? "A reason no longer in the list"}</li>
            ))}
          </ul>
          {r.returned.comment ? (
            <p className="mt-1 whitespace-pre-line text-ink-soft" data-testid="returned-comment">
              {r.returned.by}: “{r.returned.comment}”
            </p>
          ) : null}
        </div>
      ) : null}
      {submitting ? (
        <form
          className="mt-3 flex flex-wrap items-end gap-3 border-t border-chalk-deep pt-3"
          onSubmit={(e) => {
            e.preventDefault();
            void submit();
          }}
          aria-label="Submit for sign-off"
        >
          <label className="min-w-64 flex-1 text-sm">
            <span className="mb-1 block font-medium">Note for the QA lead (optional)</span>
            <input
              value={note}
              onChange={(e) => setNote(e.target.value)}
              maxLength={1000}
              name="note"
              className="w-full rounded-plot border border-ink-faint px-3 py-1.5 outline-none focus:border-leaf"
            />
          </label>
          <button type="submit" className={button} disabled={busy}>
            {busy ? "Submitting…" : "Submit"}
          </button>
          <button type="button" className={link} onClick={() => setSubmitting(false)}>
            Cancel
          </button>
          <p className="w-full text-xs text-ink-faint">
            The QA leads get an e-mail. You can no longer change the audit while it waits.
          </p>
        </form>
      ) : null}
      {problem ? (
        <p role="alert" className="mt-2 text-sm text-alarm">
          {problem}
        </p>
      ) : null}
    </section>
  );
}
