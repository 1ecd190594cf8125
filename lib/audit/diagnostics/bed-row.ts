/**
 * A bed × row table of the errors: where in the field the records are off.
 */
import { mean } from "../rmse";
import { type DiagnosticPair, fixClass } from "./types";

/** One cell of the bed × row table. Metres. */
export interface BedRowCell {
  bed: string | null;
  row: string | null;
  pairs: number;
  /** Pairs planted with a degraded fix. */
  degraded: number;
  meanAlong: number | null;
  meanCross: number | null;
  /** sqrt(mean(dE² + dN²)). */
  rmseR: number;
}

const collator = new Intl.Collator("en", { numeric: true });
const order = (a: string | null, b: string | null) =>
  a === null ? (b === null ? 0 : 1) : b === null ? -1 : collator.compare(a, b);

/**
 * Pairs grouped by bed and row: count, degraded-fix count, mean along/cross error and horizontal RMSE
 * (FGDC-STD-007.3-1998 Appendix 3-A form). Cells ordered by bed then row in natural order. Input not modified.
 *
 * @example bedRowTable(pairs) // [{ bed: "1", row: "1", pairs: 13, meanCross: 0.0004, ... }, ...]
 */
export function bedRowTable(pairs: readonly DiagnosticPair[]): BedRowCell[] {
  const cells = new Map<string, { bed: string | null; row: string | null; list: DiagnosticPair[] }>();
  for (const p of pairs) {
    const key = JSON.stringify([p.bed, p.row]);
    let c = cells.get(key);
    if (!c) cells.set(key, (c = { bed: p.bed, row: p.row, list: [] }));
    c.list.push(p);
  }
  return [...cells.values()]
    .sort((a, b) => order(a.bed, b.bed) || order(a.row, b.row))
    .map(({ bed, row, list }) => {
      const along = list.filter((p) => p.along !== null).map((p) => p.along!);
      const cross = list.filter((p) => p.cross !== null).map((p) => p.cross!);
      let ss = 0;
      for (const p of list) ss += p.dE * p.dE + p.dN * p.dN;
      return {
        bed,
        row,
        pairs: list.length,
        degraded: list.filter((p) => fixClass(p.fix) === "degraded").length,
        meanAlong: along.length ? mean(along) : null,
        meanCross: cross.length ? mean(cross) : null,
        rmseR: Math.sqrt(ss / list.length),
      };
    });
}
