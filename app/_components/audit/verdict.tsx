import type { AuditDto, Criterion } from "@/lib/api-types";
import { PassMark } from "./pass-mark";
import { formatMm, formatPct } from "./format";

const CRITERION_NAME: Record<Criterion["id"], string> = {
  checkpoints: "Enough checkpoints",
  radial: "Radial error",
  cross: "Cross-row error",
  along: "Along-row error",
  share: "Share of plants within tolerance",
};

function figure(value: number | null, unit: Criterion["unit"]): string {
  if (value === null) return "–";
  if (unit === "m") return formatMm(value);
  if (unit === "share") return formatPct(value);
  return String(value);
}

/** The verdict first: overall result, then every criterion in plain words with its figures. */
export function VerdictPanel({ audit }: { audit: AuditDto }) {
  const { verdict, profile } = audit;
  if (!verdict) {
    return (
      <section
        aria-labelledby="verdict-heading"
        className="rounded-plot border border-chalk-line bg-white p-5"
        data-testid="verdict"
      >
        <h2 id="verdict-heading" className="text-base font-semibold">
          Verdict
        </h2>
        <p className="mt-2 text-sm text-ink-soft">
          {profile
            ? "No verdict was stored for this audit."
            : "This audit was run without a tolerance profile, so there is no pass or fail — only the figures below."}
        </p>
      </section>
    );
  }
  return (
    <section
      aria-labelledby="verdict-heading"
      className={`rounded-plot border-l-4 bg-white p-5 ${verdict.passed ? "border-leaf" : "border-alarm"} border-y border-r border-y-chalk-line border-r-chalk-line`}
      data-testid="verdict"
      data-passed={verdict.passed ? "true" : "false"}
    >
      <div className="flex flex-wrap items-baseline gap-x-4 gap-y-1">
        <h2 id="verdict-heading" className="text-base font-semibold">
          Verdict
        </h2>
        <PassMark passed={verdict.passed} passWord="Passed" failWord="Failed" size="lg" />
        {profile ? (
          <span className="text-sm text-ink-soft">
            against the profile “{profile.name}” ({profile.operation})
          </span>
        ) : null}
      </div>
      <p className="mt-2 text-sm text-ink-soft">
        {verdict.passed
          ? "The records meet every limit of the profile: they can be used for the next operation it describes."
          : "At least one limit of the profile is not met: do not steer the next operation by these records without checking the failed points below."}
      </p>
      <ul className="mt-4 divide-y divide-chalk-deep" aria-label="Criteria">
        {verdict.criteria.map((c) => (
          <li
            key={c.id}
            className="grid gap-x-4 gap-y-1 py-2 sm:grid-cols-[7rem_14rem_1fr]"
            data-testid="criterion"
            data-criterion={c.id}
            data-pass={c.passed ? "true" : "false"}
          >
            <PassMark passed={c.passed} />
            <span className="text-sm font-medium">{CRITERION_NAME[c.id]}</span>
            <span className="text-sm">
              {c.trust ? (
                <strong className="mr-1" data-testid="criterion-word" data-word={c.trust.word}>
                  {c.trust.word[0].toUpperCase() + c.trust.word.slice(1)}.
                </strong>
              ) : null}
              {c.text}
              {c.trust?.interval ? (
                <span className="block text-xs text-ink-faint">
                  Two-sided {Math.round(c.trust.confidence * 100)} % interval, a description only:{" "}
                  {formatPct(c.trust.interval.lower)} – {formatPct(c.trust.interval.upper)}
                </span>
              ) : null}
              <span className="sr-only">
                {" "}
                (measured {figure(c.observed, c.unit)}, limit {figure(c.limit, c.unit)})
              </span>
            </span>
          </li>
        ))}
      </ul>
    </section>
  );
}
