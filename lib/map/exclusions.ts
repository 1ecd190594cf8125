/**
 * The exclusion list for the next pass: the as-planted records not to rely on for an operation, as CSV and as
 * GeoJSON, with the audit, the profile and the sign-off hash they come from, the rule, the row stretches and the
 * caution. Coordinates in the field's CRS. Pure.
 */
import { csvNumberFormatter, csvText } from "@/lib/audit/residuals-csv";

/** One record of the list. */
export interface ExclusionRecord {
  plantId: string;
  crop: string;
  bed: string;
  row: string;
  arm: string;
  fix: string;
  /** Planting time, ISO 8601 UTC; "" when unknown. */
  plantedUtc: string;
  /** Easting/longitude and northing/latitude in the field's CRS. */
  x: number;
  y: number;
  judgement: "do not rely" | "not yet shown";
  reason: string;
}

/** A run of records not to rely on, one after another in a bed's row (in the file's order). */
export interface RowStretch {
  bed: string;
  row: string;
  firstPlantId: string;
  lastPlantId: string;
  records: number;
}

/** What the list comes from, stated in the file. */
export interface ExclusionContext {
  fieldName: string;
  crs: string;
  /** Coordinates are longitude/latitude in degrees (else easting/northing in metres). */
  geographic: boolean;
  audit: { id: string; title: string; revision: number; state: string };
  profileName: string;
  /** SHA-256 of the signed audit; null when it is not signed off. */
  signoffHash: string | null;
  rule: string;
  stretches: readonly RowStretch[];
}

/** Shown in both files: what the list is and is not. Common practice, no source. */
export const EXCLUSION_CAUTION =
  "This list says which plant records are not accurate enough for the operation named; it does not say a machine is " +
  "safe to run. Before anyone enters the beds, stop and lock out the machine and keep clear of tool arms and blades; " +
  "follow local rules and the machine maker's instructions.";

/**
 * Runs of consecutive excluded records in each bed × row, walking the records in file order: a record of the same
 * bed × row that is not excluded ends a run.
 *
 * @example rowStretches({ bedRow: Int32Array.of(0, 0, 0), excluded: Uint8Array.of(1, 1, 0), ... }) // one stretch of 2
 */
export function rowStretches(input: {
  bedRow: Int32Array;
  keys: readonly { bed: string; row: string }[];
  excluded: Uint8Array;
  plantId: (i: number) => string;
}): RowStretch[] {
  const open = new Map<number, RowStretch>();
  const out: RowStretch[] = [];
  for (let i = 0; i < input.bedRow.length; i++) {
    const k = input.bedRow[i];
    if (k < 0) continue;
    const run = open.get(k);
    if (input.excluded[i]) {
      if (run) {
        run.lastPlantId = input.plantId(i);
        run.records++;
      } else {
        const s = { ...input.keys[k], firstPlantId: input.plantId(i), lastPlantId: input.plantId(i), records: 1 };
        open.set(k, s);
        out.push(s);
      }
    } else if (run) open.delete(k);
  }
  return out;
}

const COLUMNS = ["plant_id", "crop", "bed", "row", "arm", "fix", "planted_utc", "judgement", "reason"] as const;

function header(ctx: ExclusionContext): string[] {
  const signed = ctx.signoffHash
    ? `signed off; SHA-256 ${ctx.signoffHash}`
    : `not signed off (state: ${ctx.audit.state}); no hash yet`;
  return [
    `Records not to rely on for ${ctx.profileName} — ${ctx.fieldName}`,
    `Audit: ${ctx.audit.title}${ctx.audit.revision > 1 ? ` (revision ${ctx.audit.revision})` : ""}, id ${ctx.audit.id}, ${signed}`,
    `Coordinates: ${ctx.crs}, ${ctx.geographic ? "longitude and latitude in degrees" : "easting and northing in metres"}`,
    `Rule: ${ctx.rule}`,
    ...ctx.stretches.map(
      (s) => `Stretch: bed ${s.bed}, row ${s.row} — ${s.firstPlantId} to ${s.lastPlantId} (${s.records} records)`,
    ),
    `Caution: ${EXCLUSION_CAUTION}`,
  ];
}

/**
 * The list as CSV: lines starting with "#" state the audit, profile, hash, CRS, rule, stretches and the caution, then
 * a header row and one row per record. Text cells are neutralised for spreadsheets.
 */
export function exclusionCsv(ctx: ExclusionContext, records: readonly ExclusionRecord[]): string {
  const num = csvNumberFormatter(ctx.geographic ? 9 : 4);
  const [xName, yName] = ctx.geographic ? ["longitude", "latitude"] : ["easting", "northing"];
  const lines = header(ctx).map((l) => `# ${l.replace(/[\r\n]+/g, " ")}`);
  lines.push([...COLUMNS.slice(0, 7), xName, yName, ...COLUMNS.slice(7)].join(","));
  for (const r of records)
    lines.push(
      [
        csvText(r.plantId),
        csvText(r.crop),
        csvText(r.bed),
        csvText(r.row),
        csvText(r.arm),
        csvText(r.fix),
        r.plantedUtc,
        num(r.x),
        num(r.y),
        r.judgement,
        csvText(r.reason),
      ].join(","),
    );
  return `${lines.join("\n")}\n`;
}

/**
 * The list as a GeoJSON FeatureCollection of points. The coordinates are in the field's CRS (named in `crs` and in
 * the `plotproof` member), by arrangement with the user as RFC 7946 §4 allows — not WGS 84 unless the field's CRS is.
 */
export function exclusionGeoJson(ctx: ExclusionContext, records: readonly ExclusionRecord[]) {
  return {
    type: "FeatureCollection" as const,
    crs: { type: "name", properties: { name: ctx.crs } },
    plotproof: {
      field: ctx.fieldName,
      audit: ctx.audit,
      profile: ctx.profileName,
      signoffSha256: ctx.signoffHash,
      coordinates: ctx.geographic ? "longitude, latitude (degrees)" : "easting, northing (metres)",
      rule: ctx.rule,
      stretches: ctx.stretches,
      caution: EXCLUSION_CAUTION,
    },
    features: records.map((r) => ({
      type: "Feature" as const,
      geometry: { type: "Point" as const, coordinates: [r.x, r.y] },
      properties: {
        plant_id: r.plantId,
        crop: r.crop,
        bed: r.bed,
        row: r.row,
        arm: r.arm,
        fix: r.fix,
        planted_utc: r.plantedUtc,
        judgement: r.judgement,
        reason: r.reason,
      },
    })),
  };
}
