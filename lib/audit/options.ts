/**
 * Options of an audit run, validated with zod at the boundary (CLI flags, web form, API body).
 */
import { z } from "zod";
import { ATTRIBUTE_NAMES } from "@/geo/types";
import { isKnownTimeZone } from "./local-day";
import { DEFAULT_OUTLIER_RULE } from "./outliers";

/** Things a breakdown can be grouped by: a record attribute, or "day" (planting day in the field's time zone). */
export const GROUP_NAMES = [...ATTRIBUTE_NAMES, "day"] as const;
export type GroupName = (typeof GROUP_NAMES)[number];

const metres = z.number().finite().positive();

/** Outlier rule parameters (see outliers.ts). */
export const outlierRuleSchema = z
  .object({
    /** Multiplier of the scaled MAD, default 3.5. */
    k: z.number().finite().positive().default(DEFAULT_OUTLIER_RULE.k),
    /** Smallest threshold, metres, default 0.001. */
    minThreshold: z.number().finite().nonnegative().default(DEFAULT_OUTLIER_RULE.minThreshold),
  })
  .strict();

/**
 * Audit options. Tolerances in metres; the row bearing in degrees clockwise from grid north.
 * Parse with `auditOptionsSchema.parse(input)`; defaults: confidence 0.95, groupBy [], outlier rule k 3.5, floor 1 mm.
 */
export const auditOptionsSchema = z
  .object({
    /** Largest acceptable radial error, metres. */
    toleranceRadial: metres.optional(),
    /** Largest acceptable |cross-row error|, metres (needs rowBearingDeg). */
    toleranceCross: metres.optional(),
    /** Largest acceptable |along-row error|, metres (needs rowBearingDeg). */
    toleranceAlong: metres.optional(),
    /** Confidence level of all intervals, 0 < c < 1. */
    confidence: z.number().gt(0).lt(1).default(0.95),
    /** Row direction, degrees clockwise from grid north (given by the user or derived by the caller). */
    rowBearingDeg: z.number().finite().optional(),
    /** Where rowBearingDeg came from; defaults to "given" when a bearing is present, else "none". */
    rowBearingSource: z.enum(["given", "derived", "none"]).optional(),
    /** Breakdowns to compute. */
    groupBy: z.array(z.enum(GROUP_NAMES)).default([]),
    /** IANA time zone of the field, e.g. "Europe/Amsterdam"; required when grouping by day. */
    timeZone: z.string().min(1).optional(),
    outlierRule: outlierRuleSchema.prefault({}),
  })
  .strict()
  .superRefine((o, ctx) => {
    const hasBearing = o.rowBearingDeg !== undefined;
    if (!hasBearing && (o.toleranceCross !== undefined || o.toleranceAlong !== undefined)) {
      ctx.addIssue({
        code: "custom",
        path: ["rowBearingDeg"],
        message: "toleranceCross/toleranceAlong need a row bearing",
      });
    }
    if (hasBearing && o.rowBearingSource === "none") {
      ctx.addIssue({
        code: "custom",
        path: ["rowBearingSource"],
        message: 'rowBearingSource is "none" but a bearing was given',
      });
    }
    if (!hasBearing && (o.rowBearingSource === "given" || o.rowBearingSource === "derived")) {
      ctx.addIssue({
        code: "custom",
        path: ["rowBearingDeg"],
        message: `rowBearingSource is "${o.rowBearingSource}" but no bearing was given`,
      });
    }
    if (new Set(o.groupBy).size !== o.groupBy.length) {
      ctx.addIssue({ code: "custom", path: ["groupBy"], message: "groupBy lists an attribute twice" });
    }
    if (o.groupBy.includes("day") && o.timeZone === undefined) {
      ctx.addIssue({
        code: "custom",
        path: ["timeZone"],
        message: 'grouping by "day" needs the field\'s time zone (IANA name)',
      });
    }
    if (o.timeZone !== undefined && !isKnownTimeZone(o.timeZone)) {
      ctx.addIssue({ code: "custom", path: ["timeZone"], message: `unknown time zone "${o.timeZone}"` });
    }
  });

/** Options as a caller passes them (defaults optional). */
export type AuditOptions = z.input<typeof auditOptionsSchema>;
/** Options after parsing (defaults filled in). */
export type ResolvedAuditOptions = z.output<typeof auditOptionsSchema>;

/**
 * Parses audit options, throwing `audit: invalid options: <path>: <message>; ...` on the first failure.
 *
 * @example parseAuditOptions({ toleranceRadial: 0.03 }).confidence // 0.95
 */
export function parseAuditOptions(input: AuditOptions | undefined): ResolvedAuditOptions {
  const result = auditOptionsSchema.safeParse(input ?? {});
  if (!result.success) {
    const text = result.error.issues.map((i) => `${i.path.join(".") || "(options)"}: ${i.message}`).join("; ");
    throw new Error(`audit: invalid options: ${text}`);
  }
  return result.data;
}
