import type { RecordTrustDto } from "@/lib/map/record-guidance";
import { EXCLUSION_CAUTION } from "@/lib/map/exclusions";
import { formatCount, TableScroll } from "@/app/_components/ui";

const WORD_CLASS: Record<string, string> = {
  meets: "text-leaf",
  "does not meet": "text-alarm",
  "not enough evidence yet": "text-loam",
};

/**
 * Plant by plant: which records to rely on by the trust by cause, the rule in one sentence, the strata named, and the
 * exclusion list for the next pass (CSV or GeoJSON, for the audit's profile or another one).
 */
export function RecordTrustPanel({
  trust,
  profiles,
}: {
  trust: RecordTrustDto;
  profiles: { id: string; name: string }[];
}) {
  const c = trust.counts;
  const base = `/api/audits/${trust.audit.id}`;
  return (
    <section
      className="grid gap-3 rounded-plot border border-chalk-line bg-white p-4"
      aria-labelledby="record-trust-title"
      data-testid="record-trust"
    >
      <h2 id="record-trust-title" className="text-lg font-semibold">
        Plant by plant: which records to rely on
      </h2>
      <p className="text-sm" data-testid="record-trust-summary">
        {trust.summary}
      </p>
      <dl className="flex flex-wrap gap-x-6 gap-y-1 text-sm" data-testid="record-trust-counts">
        <div>
          <dt className="inline text-ink-soft">Do not rely on: </dt>
          <dd className="inline font-semibold text-alarm" data-testid="count-do-not-rely">
            {formatCount(c.doNotRely)}
          </dd>
        </div>
        <div>
          <dt className="inline text-ink-soft">Rely on: </dt>
          <dd className="inline font-semibold text-leaf" data-testid="count-rely">
            {formatCount(c.rely)}
          </dd>
        </div>
        <div>
          <dt className="inline text-ink-soft">Not yet shown: </dt>
          <dd className="inline font-semibold text-loam" data-testid="count-not-shown">
            {formatCount(c.notShown)}
          </dd>
        </div>
      </dl>
      <p className="text-sm text-ink-soft" data-testid="record-rule">
        <span className="font-medium text-ink">The rule: </span>
        {trust.rule}
      </p>
      {trust.named.length || trust.untested.length ? (
        <TableScroll label="Groups of records">
          <table className="w-full text-left text-sm" data-testid="record-causes">
            <caption className="sr-only">Groups of records judged not to rely on, or not yet checked</caption>
            <thead className="text-ink-soft">
              <tr>
                <th className="py-1 pr-3 font-medium">Group of records</th>
                <th className="pr-3 font-medium">Records</th>
                <th className="pr-3 font-medium">Checkpoints out of tolerance</th>
                <th className="font-medium">Judgement</th>
              </tr>
            </thead>
            <tbody className="divide-y divide-chalk-deep">
              {trust.named.map((n) => (
                <tr key={`${n.dimension}:${n.key}`} data-stratum={n.label}>
                  <td className="py-1 pr-3">{n.label}</td>
                  <td className="pr-3 tabular-nums">{formatCount(n.records)}</td>
                  <td className="pr-3 tabular-nums">
                    {n.outside} of {n.n}
                  </td>
                  <td className="font-medium text-alarm">do not rely</td>
                </tr>
              ))}
              {trust.untested.map((u) => (
                <tr key={u.label} data-stratum={u.label}>
                  <td className="py-1 pr-3">{u.label}</td>
                  <td className="pr-3 tabular-nums">{formatCount(u.records)}</td>
                  <td className="pr-3">no checkpoint</td>
                  <td className="font-medium text-loam">not yet shown</td>
                </tr>
              ))}
            </tbody>
          </table>
        </TableScroll>
      ) : null}
      {trust.remainder ? (
        <p className="text-sm" data-testid="record-remainder">
          All other checkpoints together: {formatCount(trust.remainder.n - trust.remainder.outside)} of{" "}
          {formatCount(trust.remainder.n)} within tolerance —{" "}
          <span className={`font-medium ${WORD_CLASS[trust.remainder.word]}`}>{trust.remainder.word}</span>.
        </p>
      ) : null}
      <form method="get" action={`${base}/exclusions.csv`} className="grid gap-2 text-sm" data-testid="exclusions-form">
        <h3 className="font-medium">List of records not to rely on, for the next pass</h3>
        <label className="grid gap-1 sm:max-w-md">
          <span>For the operation</span>
          <select
            name="profile"
            defaultValue=""
            className="min-h-11 rounded-plot border border-chalk-line bg-white px-2"
          >
            <option value="">{trust.profile.name} — the audit's own profile</option>
            {profiles
              .filter((p) => !(trust.profile.own && p.name === trust.profile.name))
              .map((p) => (
                <option key={p.id} value={p.id}>
                  {p.name} (the audit's checkpoints against its limits)
                </option>
              ))}
          </select>
        </label>
        <label className="flex min-h-11 items-center gap-2">
          <input type="checkbox" name="include" value="not-shown" className="size-5" />
          Also list records not yet shown
        </label>
        <div className="flex flex-wrap gap-2">
          <button type="submit" className="min-h-11 rounded-plot bg-leaf px-4 font-medium text-white">
            Download list (CSV)
          </button>
          <button
            type="submit"
            formAction={`${base}/exclusions.geojson`}
            className="min-h-11 rounded-plot border border-leaf px-4 font-medium text-leaf"
          >
            Download list (GeoJSON)
          </button>
        </div>
        <p className="text-xs text-ink-soft">
          In the field's coordinate system, with the audit, the profile and the sign-off hash written in the file.{" "}
          {EXCLUSION_CAUTION}
        </p>
      </form>
    </section>
  );
}
