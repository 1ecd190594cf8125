/**
 * The grower's summary of a field (FieldMapDto) from its latest audit with results and that audit's per-pair bed
 * columns: statistics and guidance per bed, and one line over all beds. Pure; the database reads are in
 * lib/server/map/field-map.ts.
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

/**
 * The field's map summary. Without an audit (`audit` null) the beds are empty and the summary says so;
 * otherwise `columns` are the audit's pairs in seq order. Beds are judged at the profile's confidence (0.95 without one).
 *
 * @example fieldMapSummary({ id: "f1", name: "North", crs: "EPSG:25831" }, null, null).summary // "No audit of North has results yet. …"
 */
export function fieldMapSummary(
  field: FieldMapDto["field"],
  audit: AuditDto | null,
  columns: BedColumns | null,
): FieldMapDto {
  if (!audit || !columns)
    return {
      field,
      audit: null,
      profile: null,
      beds: [],
      guidance: [],
      summary: `No audit of ${field.name} has results yet. ${RECORD_ACCURACY_REMINDER}`,
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
    summary: overallGuidance(guidance, profile),
  };
}
