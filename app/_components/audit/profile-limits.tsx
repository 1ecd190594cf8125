import type { ToleranceProfileDto } from "@/lib/api-types";
import { formatMm, formatPct } from "./format";

/** A profile's limits in one short block. */
export function ProfileLimits({ profile }: { profile: ToleranceProfileDto }) {
  return (
    <div className="mb-2 rounded-plot bg-chalk p-3 text-sm" data-testid="profile-limits">
      <dl className="grid grid-cols-2 gap-x-4 gap-y-1 sm:grid-cols-3">
        <div>
          <dt className="text-xs text-ink-faint">Radial</dt>
          <dd>{profile.radialM !== null ? formatMm(profile.radialM) : "not checked"}</dd>
        </div>
        <div>
          <dt className="text-xs text-ink-faint">Cross-row</dt>
          <dd>{profile.crossM !== null ? formatMm(profile.crossM) : "not checked"}</dd>
        </div>
        <div>
          <dt className="text-xs text-ink-faint">Along-row</dt>
          <dd>{profile.alongM !== null ? formatMm(profile.alongM) : "not checked"}</dd>
        </div>
        <div>
          <dt className="text-xs text-ink-faint">Required share within</dt>
          <dd>
            {formatPct(profile.requiredShare, 0)} at {formatPct(profile.confidence, 0)} confidence
          </dd>
        </div>
        <div>
          <dt className="text-xs text-ink-faint">Minimum checkpoints</dt>
          <dd>{profile.minCheckpoints}</dd>
        </div>
      </dl>
      {profile.builtIn ? (
        <p className="mt-2 text-xs text-ink-soft">Starting values from common practice, not a standard.</p>
      ) : null}
    </div>
  );
}
