"use client";
import Link from "next/link";
import useSWR from "swr";
import { ApiError, fetcher } from "@/lib/fetcher";
import { keys } from "@/lib/swr-keys";
import type { AuditDto, AuditState } from "@/lib/api-types";
import { FieldTime, RevisionTag } from "@/app/_components/ui";
import { VerdictPanel } from "./verdict";
import { HeadlineFigures } from "./headline";
import { AccuracyStatementBlock } from "./accuracy-statement";
import { BreakdownTables } from "./groups";
import { ResidualsTable } from "./residuals-table";
import { UnpairedLists } from "./unpaired";
import { AuditCharts } from "./charts";
import { DownloadLinks } from "./downloads";
import { AuditProgress } from "./progress";
import { RecomputeButton } from "./recompute";
import { STATE_NAME } from "@/lib/review/lifecycle";
import { ReviewBar } from "@/app/_components/review/review-bar";
import { ScopeCaution, TermsExplained } from "./glossary";
import { formatMm, formatPct } from "./format";

// One set of state names across the product (review workflow owns them).
const STATE_LABEL: Record<AuditState, string> = STATE_NAME;

const POLL_MS = 1000;

/** The audit result: polls while computing, then shows the verdict first and everything behind it. */
export function AuditResult({
  auditId,
  canPrepare,
  surveyPrecision = { rmseH: null },
}: {
  auditId: string;
  canPrepare: boolean;
  /** The checkpoint survey's own precision for the accuracy statement (lib/server/audits/survey-precision.ts). */
  surveyPrecision?: { rmseH: number | null; source?: string };
}) {
  const { data, error } = useSWR<{ audit: AuditDto }>(keys.audit(auditId), fetcher, {
    refreshInterval: (latest) => (latest?.audit.state === "computing" ? POLL_MS : 0),
  });

  if (error) {
    const notFound = error instanceof ApiError && error.status === 404;
    return (
      <div
        role="alert"
        className="rounded-plot border border-chalk-line bg-white p-5"
        data-testid={notFound ? "not-found" : "audit-error"}
      >
        <h1 className="text-xl font-semibold">{notFound ? "Nothing here" : "The audit could not be loaded"}</h1>
        <p className="mt-2 text-sm text-ink-soft">
          {notFound
            ? "This audit does not exist, or it belongs to an organisation you are not part of."
            : (error as Error).message}
        </p>
      </div>
    );
  }
  if (!data)
    return (
      <p className="text-sm text-ink-faint" aria-busy="true">
        Loading the audit…
      </p>
    );

  const audit = data.audit;
  const done = audit.state !== "computing" && audit.state !== "failed" && audit.summary !== null;
  return (
    // On a phone the verdict comes straight after the title (order); the inputs and links follow it.
    <div className="grid gap-6" data-testid="audit-result" data-state={audit.state}>
      <header className="-order-2 sm:order-none">
        <p className="text-sm text-ink-soft">
          <Link href={`/fields/${audit.field.id}`} className="font-medium text-leaf underline-offset-2 hover:underline">
            {audit.field.name}
          </Link>
          {" · "}audit
        </p>
        <h1 className="text-xl font-semibold tracking-tight">
          {audit.title}
          <RevisionTag revision={audit.revision} />
        </h1>
        <p className="mt-1 text-sm text-ink-soft">
          <span className="font-medium text-ink" data-testid="audit-state">
            {STATE_LABEL[audit.state] ?? "Unknown state"}
          </span>
          {audit.profile ? <> · against {audit.profile.name}</> : null}
          {" · "}created <FieldTime iso={audit.createdAt} timeZone={audit.field.timeZone} />
          {audit.computedAt ? (
            <>
              {" "}
              · computed <FieldTime iso={audit.computedAt} timeZone={audit.field.timeZone} />
            </>
          ) : null}
        </p>
      </header>
      <div className="sm:-mt-3">
        <AuditInputs audit={audit} />
        <div className="mt-3 flex flex-wrap items-center gap-3">
          {done ? <DownloadLinks auditId={audit.id} /> : null}
          {done ? (
            <Link
              href={`/audits/${audit.id}/map`}
              className="text-sm font-medium text-leaf underline-offset-2 hover:underline"
              data-testid="map-link"
            >
              Open this audit’s map
            </Link>
          ) : null}
          {done ? (
            <Link
              href={`/audits/${audit.id}/diagnostics`}
              className="text-sm font-medium text-leaf underline-offset-2 hover:underline"
              data-testid="diagnostics-link"
            >
              Diagnose the machine
            </Link>
          ) : null}
          {canPrepare ? (
            <Link
              href={`/fields/${audit.field.id}/audits/new`}
              className="text-sm font-medium text-leaf underline-offset-2 hover:underline"
              data-testid="new-audit-link"
            >
              Run another audit on this field
            </Link>
          ) : null}
        </div>
      </div>

      {done ? <ReviewBar auditId={audit.id} timeZone={audit.field.timeZone} /> : null}
      {audit.state === "computing" ? <AuditProgress audit={audit} /> : null}
      {audit.state === "failed" ? (
        <section
          role="alert"
          className="rounded-plot border-l-4 border-alarm bg-alarm-pale p-5"
          data-testid="audit-failed"
        >
          <h2 className="text-base font-semibold">The audit could not be computed</h2>
          <p className="mt-1 text-sm">{audit.error ?? "No reason was recorded."}</p>
          {canPrepare ? (
            <>
              <p className="mt-2 text-sm">
                If the reason lies in the files or the pairing settings, run a new audit with corrected ones; if it does
                not (the server stopped, for example), compute this audit again.
              </p>
              <RecomputeButton auditId={audit.id} />
            </>
          ) : null}
        </section>
      ) : null}

      {done ? (
        <>
          <div className="-order-1 sm:order-none">
            <VerdictPanel audit={audit} />
          </div>
          <ScopeCaution />
          <HeadlineFigures summary={audit.summary!} />
          <AccuracyStatementBlock
            summary={audit.summary!}
            surveyRmseH={surveyPrecision.rmseH}
            surveySource={surveyPrecision.source}
          />
          <TermsExplained />
          <BreakdownTables audit={audit} />
          <AuditCharts audit={audit} />
          <ResidualsTable audit={audit} />
          <UnpairedLists audit={audit} />
        </>
      ) : null}
    </div>
  );
}

function AuditInputs({ audit }: { audit: AuditDto }) {
  const p = audit.profile;
  const st = audit.settings;
  const limits = p
    ? [
        p.radialM !== null ? `radial ${formatMm(p.radialM)}` : null,
        p.crossM !== null ? `cross-row ${formatMm(p.crossM)}` : null,
        p.alongM !== null ? `along-row ${formatMm(p.alongM)}` : null,
      ]
        .filter(Boolean)
        .join(", ")
    : "";
  const match = st
    ? { auto: "by plant id, else by position", id: "by plant id only", nearest: "by position only" }[st.match]
    : null;
  return (
    <dl className="grid gap-x-6 gap-y-1 text-sm sm:grid-cols-[9rem_1fr]" data-testid="audit-inputs">
      <dt className="text-ink-faint">As-planted file</dt>
      <dd>
        {audit.planted ? (
          <>
            {audit.planted.fileName}{" "}
            <span className="text-ink-faint">
              ({audit.planted.rowCount} rows, SHA-256 {audit.planted.sha256.slice(0, 12)}…)
            </span>
          </>
        ) : (
          "removed"
        )}
      </dd>
      {audit.machine ? (
        <>
          <dt className="text-ink-faint">Machine</dt>
          <dd data-testid="audit-machine">
            <Link className="text-leaf hover:underline" href={`/machines/${audit.machine.id}/season`}>
              {audit.machine.name}
            </Link>
          </dd>
        </>
      ) : null}
      <dt className="text-ink-faint">Survey file</dt>
      <dd>
        {audit.survey ? (
          <>
            {audit.survey.fileName}{" "}
            <span className="text-ink-faint">
              ({audit.survey.rowCount} rows, SHA-256 {audit.survey.sha256.slice(0, 12)}…)
            </span>
          </>
        ) : (
          "removed"
        )}
      </dd>
      <dt className="text-ink-faint">Tolerance profile</dt>
      <dd>
        {p ? (
          <>
            {p.name} — {limits || "no limits"}; {formatPct(p.requiredShare, 0)} of plants at{" "}
            {formatPct(p.confidence, 0)} confidence; at least {p.minCheckpoints} checkpoints
          </>
        ) : (
          "none"
        )}
      </dd>
      {st ? (
        <>
          <dt className="text-ink-faint">Pairing</dt>
          <dd>
            {match}, at most {formatMm(st.maxDistanceM)} apart;{" "}
            {st.rowBearingDeg !== null ? `rows at ${st.rowBearingDeg}°` : "row direction from the field or the records"}
            ; grid {st.workCrs}
          </dd>
        </>
      ) : null}
    </dl>
  );
}
