import Link from "next/link";
import type { SignoffDto } from "@/lib/review/types";
import { ROLE_LABEL, isRole } from "@/lib/roles";
import { FieldTime } from "@/app/_components/ui";

/** The stored sign-off: who, when, what they confirmed, and the hash. */
export function SignoffRecord({
  auditId,
  signoff: s,
  timeZone,
}: {
  auditId: string;
  signoff: SignoffDto;
  timeZone: string;
}) {
  const c = s.checklist;
  return (
    <section
      aria-label="Sign-off"
      className="rounded-plot border-2 border-leaf bg-white p-5"
      data-testid="signoff-record"
      data-deviation={s.deviation}
    >
      <div className="mb-3 flex flex-wrap items-baseline justify-between gap-3">
        <h2 className="text-base font-semibold text-leaf-deep">
          Signed off{s.deviation ? " with deviation" : ""} by {s.signerName} (
          {isRole(s.signerRole) ? ROLE_LABEL[s.signerRole] : s.signerRole})
        </h2>
        <Link
          href={`/audits/${auditId}/report`}
          className="text-sm font-medium text-leaf underline-offset-2 hover:underline"
          data-testid="report-link"
        >
          Printable sign-off report
        </Link>
      </div>
      <dl className="grid gap-x-6 gap-y-2 text-sm sm:grid-cols-[12rem_1fr]">
        <dt className="text-ink-soft">Signed</dt>
        <dd>
          <FieldTime iso={s.signedAt} timeZone={timeZone} />, revision {s.revision}, typed name “{s.typedName}”
        </dd>
        <dt className="text-ink-soft">Checkpoints</dt>
        <dd>
          {c.checkpoints.pairs} paired; the profile asks for at least {c.checkpoints.required}
        </dd>
        <dt className="text-ink-soft">Survey instrument</dt>
        <dd>
          {c.instrument.precisionMm} mm (
          {c.instrument.source === "signer" ? "stated by the signer" : "from the survey file"}), {c.instrument.ratio}×
          finer than the tightest limit of {c.instrument.tightestLimitMm} mm
        </dd>
        <dt className="text-ink-soft">Control mark</dt>
        <dd>checked before the survey{c.controlMark.note ? ` — ${c.controlMark.note}` : ""}</dd>
        <dt className="text-ink-soft">Profile</dt>
        <dd>
          “{c.profileFits.profile}” confirmed for: {c.profileFits.operation}
        </dd>
        {s.comment ? (
          <>
            <dt className="text-ink-soft">{s.deviation ? "Accepted with deviation because" : "Comment"}</dt>
            <dd>“{s.comment}”</dd>
          </>
        ) : null}
        <dt className="text-ink-soft">SHA-256</dt>
        <dd>
          <code className="break-all font-mono text-xs" data-testid="signoff-sha256">
            {s.sha256}
          </code>{" "}
          <a className="text-xs text-leaf underline" href={`/api/audits/${auditId}/signoff?canonical=1`}>
            signed JSON
          </a>
        </dd>
      </dl>
      <p className="mt-3 text-xs text-ink-faint">
        This audit, its two files and its per-plant results can no longer be changed or deleted by anyone.
      </p>
    </section>
  );
}
