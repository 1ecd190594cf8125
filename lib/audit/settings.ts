/**
 * The settings an audit is computed with (pairing, row bearing, time zone, work CRS): one type, its
 * limits and defaults, and one builder used for a new audit and for a revision alike. Pure.
 */
import { z } from "zod";
import { resolveCrs } from "@/geo/crs/registry";
import { DEFAULT_MAX_PAIR_DISTANCE_M, type MatchMode } from "@/geo/pair";

export { DEFAULT_MAX_PAIR_DISTANCE_M };

/** Pairing modes, in the order the forms offer them. */
export const MATCH_MODES = ["auto", "id", "nearest"] as const satisfies readonly MatchMode[];

/** Largest accepted maximum pairing distance, metres: farther apart, pairing by position pairs unrelated plants. */
export const MAX_PAIR_DISTANCE_CEILING_M = 5;

/** Time zone of an audit when neither the user, the previous revision nor the field gives one. */
export const FALLBACK_TIME_ZONE = "UTC";

/** Maximum pairing distance, metres (0 < d ≤ {@link MAX_PAIR_DISTANCE_CEILING_M}). */
export const maxDistanceMSchema = z
  .number()
  .positive()
  .max(
    MAX_PAIR_DISTANCE_CEILING_M,
    `Pairing by position farther than ${MAX_PAIR_DISTANCE_CEILING_M} m would pair unrelated plants.`,
  );

/** Row bearing, degrees clockwise from grid north; null = derive it from the records. */
export const rowBearingDegSchema = z.number().min(0).max(360).nullable();

/** The settings an audit is computed with, as stored with it. */
export interface AuditSettings {
  match: MatchMode;
  /** Largest distance for pairing by position, metres. */
  maxDistanceM: number;
  /** Row bearing, degrees clockwise from grid north; null = derived from the records. */
  rowBearingDeg: number | null;
  /** IANA time zone for times without an offset and for grouping by day. */
  timeZone: string;
  /** "auto" (WGS 84 UTM zone of the data) or a projected CRS ("EPSG:n" or a proj string). */
  workCrs: string;
}

/** What the user chose; anything left undefined falls back (see {@link buildAuditSettings}). */
export interface ChosenSettings {
  match?: MatchMode;
  maxDistanceM?: number;
  /** A bearing, or null to derive it from the records. */
  rowBearingDeg?: number | null;
}

/** The field an audit belongs to. */
export interface SettingsField {
  /** The field's CRS: the work CRS when it is projected. */
  crs: string;
  timeZone: string | null;
  rowBearingDeg?: number | null;
}

/** The audit a revision corrects. */
export interface PreviousSettings {
  settings: AuditSettings | null;
  /** The previous revision's bearing was derived from its records (so a revision derives it again). */
  rowBearingDerived: boolean;
}

/**
 * The work CRS for a field: its own CRS when that is projected, else "auto".
 *
 * @example workCrsForField("EPSG:4326") // "auto"
 */
export function workCrsForField(crs: string): string {
  try {
    return resolveCrs(crs).kind === "projected" ? crs : "auto";
  } catch {
    return "auto";
  }
}

/**
 * The time zone of an audit: the one given, else the field's, else {@link FALLBACK_TIME_ZONE}.
 *
 * @example auditTimeZone(undefined, "Europe/Berlin") // "Europe/Berlin"
 */
export function auditTimeZone(given: string | null | undefined, fieldTimeZone: string | null | undefined): string {
  return given || fieldTimeZone || FALLBACK_TIME_ZONE;
}

/**
 * The settings of a new audit or of a revision. Each setting is the user's choice, else the previous
 * revision's, else the field's, else the default: match "auto", {@link DEFAULT_MAX_PAIR_DISTANCE_M},
 * a row bearing derived from the records, the field's time zone (see {@link auditTimeZone}), the
 * field's CRS when projected (see {@link workCrsForField}). A revision derives the bearing again when
 * the previous revision derived it.
 *
 * @example buildAuditSettings({ field: { crs: "EPSG:32632", timeZone: "Europe/Berlin" }, chosen: {} }).maxDistanceM // 0.1
 */
export function buildAuditSettings(o: {
  field: SettingsField;
  chosen: ChosenSettings;
  previous?: PreviousSettings;
}): AuditSettings {
  const { field, chosen } = o;
  const before = o.previous?.settings ?? null;
  let rowBearingDeg: number | null;
  if (chosen.rowBearingDeg !== undefined) rowBearingDeg = chosen.rowBearingDeg;
  else if (o.previous) rowBearingDeg = o.previous.rowBearingDerived ? null : (before?.rowBearingDeg ?? null);
  else rowBearingDeg = field.rowBearingDeg ?? null;
  return {
    match: chosen.match ?? before?.match ?? "auto",
    maxDistanceM: chosen.maxDistanceM ?? before?.maxDistanceM ?? DEFAULT_MAX_PAIR_DISTANCE_M,
    rowBearingDeg,
    timeZone: auditTimeZone(before?.timeZone, field.timeZone),
    workCrs: before?.workCrs ?? workCrsForField(field.crs),
  };
}
