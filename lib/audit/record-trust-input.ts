/**
 * Builds the input of the trust by cause (record-trust.ts) from an audit's as-planted records (the point table as
 * read) and its stored pairs (columns of the per-plant rows). Pure.
 *
 * A pair takes the strata of its own record (found by plant id) so both sides share one dictionary; a pair whose
 * record cannot be found (no id, or an id the file repeats) keeps the texts of its stored row.
 */
import type { PointTable } from "@/geo";
import { indexIds } from "@/geo";
import { localDayCodes } from "./local-day";
import type { RecordTrustInput, StratumColumn, StratumDimension } from "./record-trust";
import { withinToleranceFlags } from "./tolerance";

/** Stored pairs as columns; texts "" when missing; errors in metres, NaN unknown; within 1, 0 or −1 unknown. */
export interface StoredPairColumns {
  count: number;
  plantId: readonly string[];
  fix: readonly string[];
  arm: readonly string[];
  day: readonly string[];
  bed: readonly string[];
  row: readonly string[];
  radial: ArrayLike<number>;
  cross: ArrayLike<number>;
  along: ArrayLike<number>;
  within: Int8Array;
}

/** Separates bed and row inside a bed × row key. */
const BED_ROW_SEP = "\u001f";

/**
 * A stratum in words.
 * @example stratumLabel("bedRow", "3\u001f2") // "bed 3, row 2"
 * @example stratumLabel("fix", "rtk-float") // "fix quality rtk-float"
 */
export function stratumLabel(dimension: StratumDimension, key: string): string {
  if (dimension === "fix") return `fix quality ${key}`;
  if (dimension === "arm") return `tool arm ${key}`;
  if (dimension === "day") return `planting day ${key}`;
  const [bed, row] = key.split(BED_ROW_SEP);
  return row === undefined ? `bed ${bed}` : `bed ${bed}, row ${row}`;
}

class Dictionary {
  values: string[] = [];
  private index = new Map<string, number>();
  constructor(values: readonly string[] = []) {
    for (const v of values) this.code(v);
  }
  code(v: string): number {
    if (v === "") return -1;
    let c = this.index.get(v);
    if (c === undefined) {
      c = this.values.length;
      this.values.push(v);
      this.index.set(v, c);
    }
    return c;
  }
}

/** Record codes of a stratum dimension and the text of each record (for pairs without their record). */
function recordKeys(
  table: PointTable,
  dimension: StratumDimension,
  timeZone: string,
): { dict: Dictionary; codes: Int32Array } | null {
  const n = table.length;
  if (dimension === "fix" || dimension === "arm") {
    const col = table.attrs[dimension];
    if (!col) return null;
    return { dict: new Dictionary(col.values), codes: Int32Array.from(col.codes) };
  }
  if (dimension === "day") {
    if (!table.time) return null;
    const days = localDayCodes(
      table.time,
      Int32Array.from({ length: n }, (_, i) => i),
      timeZone,
    );
    return { dict: new Dictionary(days.values), codes: days.codes };
  }
  const bed = table.attrs.bed;
  if (!bed) return null;
  const row = table.attrs.row;
  const dict = new Dictionary();
  const codes = new Int32Array(n);
  for (let i = 0; i < n; i++) {
    const b = bed.codes[i] >= 0 ? bed.values[bed.codes[i]] : "";
    const r = row && row.codes[i] >= 0 ? row.values[row.codes[i]] : "";
    codes[i] = b === "" ? -1 : dict.code(row ? `${b}${BED_ROW_SEP}${r}` : b);
  }
  return { dict, codes };
}

function pairText(pairs: StoredPairColumns, dimension: StratumDimension, i: number, rowsKnown: boolean): string {
  if (dimension !== "bedRow") return pairs[dimension][i];
  const b = pairs.bed[i];
  if (b === "") return "";
  return rowsKnown ? `${b}${BED_ROW_SEP}${pairs.row[i]}` : b;
}

/**
 * The input of recordTrust. With `limits`, each pair's within is judged again against those limits (metres; a
 * cross-row or along-row limit only where the pair has that error), for an operation other than the audit's own.
 *
 * @example recordTrustInput({ table, pairs, timeZone: "Europe/Amsterdam", profile }).strata.map((s) => s.dimension) // ["fix", "arm", "day", "bedRow"]
 */
export function recordTrustInput(input: {
  table: PointTable;
  pairs: StoredPairColumns;
  timeZone: string;
  profile: RecordTrustInput["profile"];
  rejudge?: boolean;
}): RecordTrustInput {
  const { table, pairs, timeZone, profile } = input;
  const ids = table.id ? indexIds(table.id) : null;
  const record = new Int32Array(pairs.count);
  for (let i = 0; i < pairs.count; i++) {
    const id = pairs.plantId[i];
    const r = ids && id !== "" ? ids.lookup(id) : -1;
    record[i] = r >= 0 && !ids?.duplicates?.has(id) ? r : -1;
  }
  const strata: StratumColumn[] = [];
  for (const dimension of ["fix", "arm", "day", "bedRow"] as const) {
    const keys = recordKeys(table, dimension, timeZone);
    if (!keys) continue;
    const pairCodes = new Int32Array(pairs.count);
    for (let i = 0; i < pairs.count; i++)
      pairCodes[i] =
        record[i] >= 0 ? keys.codes[record[i]] : keys.dict.code(pairText(pairs, dimension, i, !!table.attrs.row));
    strata.push({ dimension, values: keys.dict.values, pairCodes, recordCodes: keys.codes });
  }
  let within = pairs.within;
  if (input.rejudge) {
    const finite = (a: ArrayLike<number>) => Array.prototype.some.call(a, Number.isFinite) as boolean;
    const cross = finite(pairs.cross) ? Float64Array.from(pairs.cross) : null;
    const along = finite(pairs.along) ? Float64Array.from(pairs.along) : null;
    const limits = {
      radial: profile.radialM,
      cross: cross ? profile.crossM : null,
      along: along ? profile.alongM : null,
    };
    within =
      limits.radial === null && limits.cross === null && limits.along === null
        ? new Int8Array(pairs.count).fill(-1)
        : Int8Array.from(withinToleranceFlags({ radial: Float64Array.from(pairs.radial), cross, along, limits }));
  }
  return {
    recordCount: table.length,
    pairs: { within, radial: pairs.radial, cross: pairs.cross, along: pairs.along, record },
    strata,
    profile,
  };
}
