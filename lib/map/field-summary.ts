/**
 * The grower's summary of a field (FieldMapDto) from its latest signed-off audit and that audit's per-pair bed
 * columns: statistics and guidance per bed, and one line over all beds. A newer audit waiting for sign-off is
 * mentioned, never used. Pure; the database reads are in lib/server/map/field-map.ts.
 */
import type { AuditDto, ProfileSnapshot } from "@/lib/api-types";
import { RECORD_ACCURACY_REMINDER, bedGuidance, bedStats, overallGuidance } from "./guidance";
import type { FieldMapDto, MapProfile } from "./types";

/** Per-pair columns of the per-bed summary: bed label, radial, cross, along (NaN unknown), within (1, 0, −1 unknown). */
export interface BedColumns {
  bed: readonly string[];
  radial: ArrayLike<number>;
  cross: ArrayLike<number>;
  along: ArrayLike<number>;
  within: ArrayLike<number>;
}

/**
 * The tolerance limits the map shows, from the audit's profile copy; null when the audit has none.
 *
 * @example mapProfile(null) // null
 */
export function mapProfile(p: ProfileSnapshot | null): MapProfile | null {
  return p
    ? {
        name: p.name,
        operation: p.operation ?? null,
        radialM: p.radialM,
        crossM: p.crossM,
        alongM: p.alongM,
        requiredShare: p.requiredShare,
        confidence: p.confidence,
        minCheckpoints: p.minCheckpoints,
      }
    : null;
}

/** The sentence about a newer audit waiting for sign-off, or "". */
export function pendingSentence(pending: FieldMapDto["pending"]): string {
  return pending
    ? `A newer audit, “${pending.title}”, is waiting for sign-off; until it is signed off this page does not use it.`
    : "";
}

/**
 * The field's map summary. `audit` is the field's latest signed-off audit; without one (`audit` null) the beds are
 * empty and the summary says so; otherwise `columns` are the audit's pairs in seq order. `pending` is a newer
 * audit waiting for sign-off: mentioned, never used. Beds are judged at the profile's confidence (0.95 without one).
 *
 * @example fieldMapSummary({ id: "f1", name: "North", crs: "EPSG:25831" }, null, null).summary // "No audit of North has been signed off yet. …"
 */
export function fieldMapSummary(
  field: FieldMapDto["field"],
  audit: AuditDto | null,
  columns: BedColumns | null,
  pending: FieldMapDto["pending"] = null,
): FieldMapDto {
  const waiting = pendingSentence(pending);
  if (!audit || !columns)
    return {
      field,
      audit: null,
      profile: null,
      beds: [],
      guidance: [],
      pending,
      summary: `No audit of ${field.name} has been signed off yet.${waiting ? ` ${waiting}` : ""} ${RECORD_ACCURACY_REMINDER}`,
    };
  const profile = mapProfile(audit.profile);
  const beds = bedStats({ ...columns, confidence: profile?.confidence ?? 0.95 });
  const guidance = beds.map((s) => bedGuidance(s, profile));
  return {
    field,
    audit: {
      id: audit.id,
      title: audit.title,
      state: audit.state,
      computedAt: audit.computedAt,
      pairs: columns.bed.length,
    },
    profile,
    beds,
    guidance,
    pending,
    summary: overallGuidance(guidance, profile),
  };
}
