/**
 * Shapes shared by the map's server side (payload builder) and client side (decoder, layers).
 * Lengths in metres, in the audit's work CRS, relative to `origin` (see binary.ts for the byte layout).
 */
import type { ToleranceProfile } from "@/lib/audit/profile";
import type { TrustWord } from "@/lib/audit/trust";

/** Text columns sent as dictionary codes; `NO_CODE` means the value was empty. */
export const DICT_NAMES = ["crop", "bed", "row", "arm", "fix", "day"] as const;
export type DictName = (typeof DICT_NAMES)[number];

/** Code of an empty value in a Uint16 code column. */
export const NO_CODE = 0xffff;

/** Bits of `pair.flags`. */
export const PAIR_FLAG = {
  /** The audit had tolerance limits, so WITHIN is meaningful. */
  WITHIN_KNOWN: 1,
  /** Within every limit of the profile. */
  WITHIN: 2,
  /** Flagged by the engine's outlier rule. */
  OUTLIER: 4,
  /** Paired by position (else by plant id). */
  BY_POSITION: 8,
  /** Paired by id although farther apart than the maximum pairing distance. */
  BEYOND_MAX: 16,
} as const;

/** `unpaired.kind` codes, in this order. */
export const UNPAIRED_KINDS = ["planted-not-found", "surveyed-not-planted", "ambiguous"] as const;
export type UnpairedKind = (typeof UNPAIRED_KINDS)[number];

/** Tolerance limits of the audit's profile copy, metres; null = not checked. */
export interface MapProfile extends ToleranceProfile {
  operation: string | null;
}

/** Field settings the beds and rows are drawn from. */
export interface MapFieldGeometry {
  bedSpacingM: number | null;
  rowsPerBed: number | null;
  rowSpacingM: number | null;
}

/** Everything in the payload's JSON header except the array table. */
export interface MapMeta {
  audit: { id: string; title: string; state: string; fieldId: string; fieldName: string; computedAt: string | null };
  /** Work CRS the coordinates are in, e.g. "EPSG:25831". */
  crs: string;
  /** Easting, northing (m) subtracted from every coordinate so Float32 keeps sub-millimetre steps. */
  origin: [number, number];
  /** Angle from true north to grid north at the origin, degrees, positive when grid north lies east of true north; null when unknown. */
  gridConvergenceDeg: number | null;
  /** Row bearing used by the audit, degrees clockwise from grid north; null when none. */
  rowBearingDeg: number | null;
  field: MapFieldGeometry;
  /** Outline to draw: the field's boundary, else the convex hull of the records. Flat [x0, y0, x1, y1, …], local metres, closed implicitly. */
  boundary: { source: "field" | "records" | "none"; ring: number[] };
  profile: MapProfile | null;
  /** Number of pairs (checkpoints paired with a record). */
  pairs: number;
  /** Number of unpaired points (all kinds). */
  unpaired: number;
  /** Values of each text column; a code is an index into its list. */
  dict: Record<DictName, string[]>;
}

/** The typed arrays of a decoded payload. Index i of every pair.* array is pair seq i. */
export interface MapArrays {
  /** Planted position, x/y interleaved, local metres. */
  pairXY: Float32Array;
  /** Survey minus planted (dE, dN) interleaved, metres. */
  pairD: Float32Array;
  /** Along-row error, m; NaN without a row bearing. */
  pairAlong: Float32Array;
  /** Cross-row error (positive right of the row direction), m; NaN without a row bearing. */
  pairCross: Float32Array;
  pairFlags: Uint8Array;
  pairCodes: Record<DictName, Uint16Array>;
  /** Plant id of each pair ("" when none). */
  pairIds: string[];
  /** Position of each unpaired point, x/y interleaved, local metres. */
  unpairedXY: Float32Array;
  /** Index into UNPAIRED_KINDS. */
  unpairedKind: Uint8Array;
  unpairedCodes: Record<"crop" | "bed" | "row", Uint16Array>;
}

export interface MapData {
  meta: MapMeta;
  arrays: MapArrays;
}

/** Statistics of the checkpoints of one bed (see bedStats in guidance.ts). */
export interface BedStats {
  /** Bed label; "" for checkpoints without one. */
  bed: string;
  /** Checkpoints (pairs) in the bed. */
  n: number;
  /** Of them with a tolerance verdict, within and out of tolerance. */
  known: number;
  within: number;
  out: number;
  /** within / known and its two-sided Clopper–Pearson interval at the profile's confidence (a description); null when known = 0. */
  share: number | null;
  lower: number | null;
  upper: number | null;
  /** One-sided exact lower bound at the profile's confidence, the bound the trust rule decides on; null when known = 0. */
  lowerOneSided: number | null;
  /** 95th percentile of radial, |cross-row| and |along-row| error, metres (type 7); null without values. */
  p95Radial: number | null;
  p95Cross: number | null;
  p95Along: number | null;
  meanRadial: number | null;
}

/** How far the records of one bed can be relied on (see bedGuidance in guidance.ts). */
export type BedState = "relied-on" | "not-relied-on" | "not-shown" | "no-checkpoints" | "no-limits";

export interface BedGuidance {
  bed: string;
  state: BedState;
  /** The trust rule's word (lib/audit/trust.ts); null without checkpoints or limits. */
  word: TrustWord | null;
  /** When "not enough evidence yet": more checkpoints, all within, that would settle it. */
  moreNeeded?: number | null;
  /** One sentence for the grower. */
  line: string;
}

/** GET /api/fields/:fieldId/map — the grower's view of the field's latest signed-off audit. */
export interface FieldMapDto {
  field: { id: string; name: string; crs: string; timeZone: string };
  /** The latest signed-off audit with stored results; null when none is signed off yet. */
  audit: { id: string; title: string; state: string; computedAt: string | null; pairs: number } | null;
  profile: MapProfile | null;
  beds: BedStats[];
  guidance: BedGuidance[];
  /** One line over all beds, ending with the reminder that the map shows record accuracy, not machine safety. */
  summary: string;
  /** A newer audit with results waiting for sign-off (computed or submitted): mentioned, never used. */
  pending: { id: string; title: string; state: string } | null;
}
