"use client";
import Link from "next/link";
import useSWR from "swr";
import { fetcher } from "@/lib/fetcher";
import { reviewKeys } from "@/lib/review/keys";
import type { ReviewDto } from "@/lib/review/types";
import type { ChecklistContext } from "@/lib/review/checklist";
import type { AuditDto } from "@/lib/api-types";
import type { Role } from "@/lib/roles";
import { RETURN_REASONS } from "@/lib/review/return-reasons";
import { FieldTime, Panel, formatMm } from "@/app/_components/ui";
import { StateBadge } from "@/app/_components/review/state-badge";
import { SignoffForm } from "./signoff-form";
import { ReturnForm } from "./return-form";
import { ReviseForm, type DatasetOption } from "./revise-form";
import { VerifyPanel } from "./verify-panel";
import { ActivityList } from "./activity-list";
import { SignoffRecord } from "./signoff-record";

const EVENT_WORDS: Record<ReviewDto["events"][number]["kind"], string> = {
  submitted: "submitted it for sign-off",
  returned: "returned it for correction",
  signed_off: "signed it off",
  revised: "started a corrected revision",
  verified: "verified it",
};

/** Everything about one audit's review: decide, correct, verify, read the history. */
export function ReviewWorkspace({
  audit,
  viewer,
  checklist,
  datasets,
  profiles,
}: {
  audit: AuditDto;
  viewer: { name: string; role: Role };
  checklist: ChecklistContext | null;
  datasets: DatasetOption[];
  profiles: { id: string; name: string }[];
}) {
  const { data } = useSWR<{ review: ReviewDto }>(reviewKeys.review(audit.id), fetcher);
  if (!data)
    return (
      <p className="text-sm text-ink-faint" aria-busy="true">
        Loading the review…
      </p>
    );
  const r = data.review;
  const failed = audit.verdict?.criteria.filter((c) => !c.passed) ?? [];

  return (
    <div className="grid gap-6" data-testid="review-workspace" data-state={r.state}>
      {r.revisions.length > 1 ? (
        <nav aria-label="Revisions" className="flex flex-wrap items-center gap-2 text-sm" data-testid="revisions">
          <span className="text-ink-soft">Revisions:</span>
          {r.revisions.map((v) => (
            <Link
              key={v.id}
              href={`/audits/${v.id}/review`}
              aria-current={v.id === audit.id ? "page" : undefined}
              className={`rounded-plot border px-2 py-0.5 ${v.id === audit.id ? "border-ink bg-ink text-white" : "border-chalk-line bg-white hover:border-leaf"}`}
            >
              {v.revision} · <span className="text-xs">{v.state.replace("_", " ")}</span>
            </Link>
          ))}
        </nav>
      ) : null}

      {r.state === "returned" && r.returned ? (
        <section
          role="status"
          className="rounded-plot border-l-4 border-alarm bg-alarm-pale p-4 text-sm"
          data-testid="returned-reasons"
        >
          <p className="font-semibold">
            Returned for correction by {r.returned.by},{" "}
            <FieldTime iso={r.returned.at} timeZone={audit.field.timeZone} />
          </p>
          <ul className="mt-1 list-disc pl-5">
            {r.returned.reasons.map((x) => (
              <li key={x}>{RETURN_REASONS[x]}</li>
            ))}
          </ul>
          {r.returned.comment ? <p className="mt-2">“{r.returned.comment}”</p> : null}
          {r.revisedBy ? (
            <p className="mt-2">
              A corrected revision exists:{" "}
              <Link className="font-medium text-leaf underline" href={`/audits/${r.revisedBy}/review`}>
                open it
              </Link>
              .
            </p>
          ) : null}
        </section>
      ) : null}

      <div className="grid gap-6 lg:grid-cols-2">
        <Panel title="Verdict against the profile">
          {audit.verdict && audit.profile ? (
            <>
              <p className="mb-2 text-sm">
                <span className={`font-semibold ${audit.verdict.passed ? "text-leaf" : "text-alarm"}`}>
                  {audit.verdict.passed
                    ? "Every criterion passed"
                    : `${failed.length} ${failed.length === 1 ? "criterion" : "criteria"} failed`}
                </span>{" "}
                for “{audit.profile.name}” ({audit.profile.operation}).
              </p>
              <ul className="divide-y divide-chalk-deep text-sm" data-testid="review-criteria">
                {audit.verdict.criteria.map((c) => (
                  <li key={c.id} className="flex gap-2 py-1.5" data-pass={c.passed}>
                    <span className={`w-12 shrink-0 font-semibold ${c.passed ? "text-leaf" : "text-alarm"}`}>
                      {c.passed ? "Pass" : "Fail"}
                    </span>
                    <span>{c.text}</span>
                  </li>
                ))}
              </ul>
              <p className="mt-3 text-xs text-ink-faint">
                {audit.summary?.pairs} pairs · horizontal RMSE {formatMm(audit.summary?.rmseR)} · 95 % radius{" "}
                {formatMm(audit.summary?.r95)} ·{" "}
                <Link className="text-leaf underline" href={`/audits/${audit.id}`}>
                  full result
                </Link>
              </p>
            </>
          ) : (
            <p className="text-sm text-ink-faint">No results yet.</p>
          )}
        </Panel>

        <Panel title="History">
          {r.events.length === 0 ? (
            <p className="text-sm text-ink-faint">Not submitted yet.</p>
          ) : (
            <ol className="space-y-2 text-sm" data-testid="review-events">
              {r.events.map((e) => (
                <li key={e.id} data-kind={e.kind}>
                  <span className="text-ink-faint">
                    <FieldTime iso={e.at} timeZone={audit.field.timeZone} />
                  </span>{" "}
                  · <span className="font-medium">{e.actorName}</span> {EVENT_WORDS[e.kind]}
                  {e.kind === "verified" ? (
                    <span className={(e.detail as { ok?: boolean })?.ok ? "text-leaf" : "font-semibold text-alarm"}>
                      {(e.detail as { ok?: boolean })?.ok ? " — all matched" : " — MISMATCH"}
                    </span>
                  ) : null}
                  {e.note && e.kind !== "verified" ? <span className="text-ink-soft"> — “{e.note}”</span> : null}
                </li>
              ))}
            </ol>
          )}
        </Panel>
      </div>

      {r.signoff ? <SignoffRecord auditId={audit.id} signoff={r.signoff} timeZone={audit.field.timeZone} /> : null}

      {r.allowed.includes("sign_off") && checklist && audit.verdict ? (
        <section id="decide" aria-label="Decide" className="grid gap-6 lg:grid-cols-[3fr_2fr]">
          <SignoffForm
            auditId={audit.id}
            viewerName={viewer.name}
            context={checklist}
            verdict={audit.verdict}
            surveyDatasetId={audit.survey?.id ?? null}
          />
          <ReturnForm auditId={audit.id} />
        </section>
      ) : r.state === "submitted" ? (
        <p className="text-sm text-ink-soft" data-testid="waiting-note">
          <StateBadge state="submitted" /> A QA lead or the owner decides next; everyone gets an e-mail when they do.
        </p>
      ) : null}

      {r.allowed.includes("revise") ? (
        <ReviseForm audit={audit} revision={r.revision} datasets={datasets} profiles={profiles} />
      ) : null}

      <VerifyPanel
        auditId={audit.id}
        canVerify={r.allowed.includes("verify")}
        signed={r.state === "signed_off"}
        timeZone={audit.field.timeZone}
      />
      <ActivityList auditId={audit.id} timeZone={audit.field.timeZone} />
    </div>
  );
}
