/**
 * Which plants a check survey measures: a stratified random selection, seeded so it can be reproduced, spread along
 * the rows with a minimum spacing between chosen plants, optionally leaving out the ends of each bed, with spare
 * plants per stratum for checkpoints found dead. Pure.
 *
 * Method (our rule, common practice, no source): plants are grouped into strata by the attributes the planner
 * chooses (bed, arm, crop, planting day, fix quality). The checkpoints are shared among strata in proportion to their
 * plants (largest remainder), never fewer than the minimum per stratum. Within a stratum the plants are ordered by
 * row and position along the row and cut into as many consecutive runs as plants to choose; one plant is drawn at
 * random from each run (systematic-stratified sampling), skipping plants nearer than the minimum spacing to any plant
 * already chosen. Random numbers come from mulberry32 (lib/random.ts) with the plan's seed.
 */
import { mulberry32 } from "@/lib/random";

export const STRATUM_ATTRIBUTES = ["bed", "arm", "crop", "day", "fix"] as const;
export type StratumAttribute = (typeof STRATUM_ATTRIBUTES)[number];
export const STRATUM_LABEL: Record<StratumAttribute, string> = {
  bed: "bed",
  arm: "arm",
  crop: "crop",
  day: "planting day",
  fix: "fix quality",
};

/** Longest point name a plan gives (field controllers commonly allow 16 characters; common practice, no source). */
export const POINT_NAME_MAX = 16;

/** One as-planted record the plan may choose. Coordinates in the field's projected CRS, metres. */
export interface PlanPlant {
  id: string;
  e: number;
  n: number;
  bed: string | null;
  row: string | null;
  arm: string | null;
  crop: string | null;
  /** Planting day in the field's time zone, YYYY-MM-DD. */
  day: string | null;
  fix: string | null;
}

export interface SelectOptions {
  /** Checkpoints to choose in all (from the sample size). */
  required: number;
  strataBy: readonly StratumAttribute[];
  /** Fewest checkpoints in every stratum. */
  minPerStratum: number;
  /** Spare plants per stratum, surveyed in place of a checkpoint found dead or missing. */
  sparesPerStratum: number;
  /** No two chosen plants nearer than this, metres (0 = no rule). */
  minSpacingM: number;
  /** Leave out plants this near either end of their bed, metres along the row (0 = keep all). */
  bedEndM: number;
  /** Row direction, degrees clockwise from grid north; null = the main direction of the points. */
  rowBearingDeg: number | null;
  seed: number;
}

export interface ChosenPoint {
  /** Our own point name, ≤ 16 characters: C0001-B3 for a checkpoint, S0001-B3 for a spare. */
  name: string;
  plantId: string;
  /** Index of the plant in the input. */
  index: number;
  stratum: string;
  spare: boolean;
  e: number;
  n: number;
  bed: string | null;
  row: string | null;
  arm: string | null;
  crop: string | null;
}

export interface StratumPlan {
  key: string;
  /** Plants of the stratum that could be chosen (after the bed ends are left out). */
  plants: number;
  checkpoints: number;
  spares: number;
  minimum: number;
}

export interface Selection {
  points: ChosenPoint[];
  strata: StratumPlan[];
  /** Plants left out for lying near a bed end. */
  excludedAtBedEnds: number;
  /** Plants that could be chosen. */
  eligible: number;
  /** Row bearing used for "along the row", degrees. */
  bearingDeg: number;
  /** Spares asked for but not available (a small stratum); 0 normally. */
  sparesShort: number;
}

const collator = new Intl.Collator("en", { numeric: true, sensitivity: "base" });
const cmp = (a: string | null, b: string | null) => collator.compare(a ?? "", b ?? "");

/** The stratum of a plant: "bed 3 · arm 2", or "all plants" with no attribute chosen. */
export function stratumKey(p: PlanPlant, by: readonly StratumAttribute[]): string {
  if (by.length === 0) return "all plants";
  return by.map((a) => `${STRATUM_LABEL[a]} ${p[a] ?? "–"}`).join(" · ");
}

/**
 * Our point names: "C" (checkpoint) or "S" (spare), a four-digit number, and the bed ("-B" + up to six letters and
 * digits of it) when known. At most 13 characters, within the 16 a field controller takes.
 *
 * @example pointName(false, 7, "3") // "C0007-B3"
 */
export function pointName(spare: boolean, seq: number, bed: string | null): string {
  if (!Number.isInteger(seq) || seq < 1 || seq > 9999) throw new Error(`plan: point number ${seq} outside 1–9999`);
  const b = (bed ?? "").replace(/[^A-Za-z0-9]/g, "").slice(0, 6);
  return `${spare ? "S" : "C"}${String(seq).padStart(4, "0")}${b ? `-B${b}` : ""}`;
}

/** Main direction of the points (principal axis), degrees clockwise from grid north in [0, 180). */
export function mainBearingDeg(plants: readonly PlanPlant[]): number {
  let me = 0;
  let mn = 0;
  for (const p of plants) {
    me += p.e;
    mn += p.n;
  }
  me /= plants.length || 1;
  mn /= plants.length || 1;
  let see = 0;
  let snn = 0;
  let sen = 0;
  for (const p of plants) {
    const de = p.e - me;
    const dn = p.n - mn;
    see += de * de;
    snn += dn * dn;
    sen += de * dn;
  }
  // Angle of the major axis from the east axis, then as a bearing from north.
  const fromEast = 0.5 * Math.atan2(2 * sen, see - snn);
  const bearing = 90 - (fromEast * 180) / Math.PI;
  return ((bearing % 180) + 180) % 180;
}

/** Spacing checks through a grid of cells the size of the spacing. */
class SpacingGrid {
  private cells = new Map<string, { e: number; n: number }[]>();
  constructor(private readonly d: number) {}
  private key(i: number, j: number) {
    return `${i},${j}`;
  }
  fits(e: number, n: number): boolean {
    if (!(this.d > 0)) return true;
    const i = Math.floor(e / this.d);
    const j = Math.floor(n / this.d);
    for (let di = -1; di <= 1; di++)
      for (let dj = -1; dj <= 1; dj++)
        for (const q of this.cells.get(this.key(i + di, j + dj)) ?? [])
          if (Math.hypot(q.e - e, q.n - n) < this.d) return false;
    return true;
  }
  add(e: number, n: number) {
    const k = this.key(Math.floor(e / (this.d || 1)), Math.floor(n / (this.d || 1)));
    const list = this.cells.get(k);
    if (list) list.push({ e, n });
    else this.cells.set(k, [{ e, n }]);
  }
}

function shuffled<T>(items: readonly T[], rand: () => number): T[] {
  const a = items.slice();
  for (let i = a.length - 1; i > 0; i--) {
    const j = Math.floor(rand() * (i + 1));
    [a[i], a[j]] = [a[j], a[i]];
  }
  return a;
}

/**
 * Share `total` among strata in proportion to their sizes (largest remainder), at least `min` each, never more than
 * a stratum holds.
 */
export function allocate(sizes: readonly number[], total: number, min: number): number[] {
  const out = sizes.map((s) => Math.min(s, min));
  let left = total - out.reduce((s, x) => s + x, 0);
  if (left <= 0) return out;
  const room = sizes.map((s, i) => s - out[i]);
  const pool = sizes.reduce((s, x) => s + x, 0);
  const quota = sizes.map((s) => (left * s) / pool);
  for (let i = 0; i < sizes.length; i++) {
    const add = Math.min(room[i], Math.floor(quota[i]));
    out[i] += add;
    room[i] -= add;
  }
  left = total - out.reduce((s, x) => s + x, 0);
  // What is left goes by largest remainder, then to any stratum with room, until the total is reached.
  const order = sizes
    .map((_, i) => i)
    .sort((a, b) => quota[b] - Math.floor(quota[b]) - (quota[a] - Math.floor(quota[a])) || a - b);
  while (left > 0 && room.some((r) => r > 0)) {
    for (const i of order) {
      if (left === 0) break;
      if (room[i] > 0) {
        out[i]++;
        room[i]--;
        left--;
      }
    }
  }
  return out;
}

function fmt(m: number): string {
  return `${Number(m.toFixed(2))} m`;
}

/**
 * Choose the plants of a check survey. Throws a message naming the numbers when the dataset has fewer plants than
 * the plan needs, a stratum has fewer plants than its minimum, or the spacing leaves too little room. The same
 * plants, options and seed give the same selection.
 *
 * @example selectCheckpoints(plants, { required: 30, strataBy: ["bed"], minPerStratum: 3, sparesPerStratum: 1, minSpacingM: 1, bedEndM: 2, rowBearingDeg: 22.5, seed: 7 })
 */
export function selectCheckpoints(plants: readonly PlanPlant[], o: SelectOptions): Selection {
  if (!Number.isInteger(o.required) || o.required < 1)
    throw new Error(`plan: the checkpoints to choose must be a whole number ≥ 1, got ${o.required}`);
  for (const [name, v] of [
    ["minimum per stratum", o.minPerStratum],
    ["spares per stratum", o.sparesPerStratum],
  ] as const)
    if (!Number.isInteger(v) || v < 0) throw new Error(`plan: the ${name} must be a whole number ≥ 0, got ${v}`);
  if (!(o.minSpacingM >= 0) || !(o.bedEndM >= 0))
    throw new Error("plan: the minimum spacing and the bed-end margin must be 0 m or more");
  if (plants.length === 0) throw new Error("plan: the as-planted dataset has no plants to choose from");

  const bearingDeg = o.rowBearingDeg ?? mainBearingDeg(plants);
  const th = (bearingDeg * Math.PI) / 180;
  const ue = Math.sin(th);
  const un = Math.cos(th);
  const along = plants.map((p) => p.e * ue + p.n * un);

  // Leave out the bed ends: per bed, the first and last `bedEndM` metres along the row.
  const eligible: number[] = [];
  if (o.bedEndM > 0) {
    const ext = new Map<string, { lo: number; hi: number }>();
    plants.forEach((p, i) => {
      const k = p.bed ?? "";
      const x = ext.get(k);
      if (!x) ext.set(k, { lo: along[i], hi: along[i] });
      else {
        x.lo = Math.min(x.lo, along[i]);
        x.hi = Math.max(x.hi, along[i]);
      }
    });
    plants.forEach((p, i) => {
      const x = ext.get(p.bed ?? "")!;
      if (along[i] >= x.lo + o.bedEndM && along[i] <= x.hi - o.bedEndM) eligible.push(i);
    });
  } else for (let i = 0; i < plants.length; i++) eligible.push(i);
  const excludedAtBedEnds = plants.length - eligible.length;

  if (eligible.length < o.required)
    throw new Error(
      `plan: the profile needs ${o.required} checkpoints but the as-planted dataset has ${plants.length} plants` +
        (excludedAtBedEnds > 0 ? ` (${eligible.length} after leaving out ${fmt(o.bedEndM)} at each bed end)` : ""),
    );

  // Strata, in natural order of their keys; plants within ordered by row, along the row, then id.
  const groups = new Map<string, number[]>();
  for (const i of eligible) {
    const k = stratumKey(plants[i], o.strataBy);
    const g = groups.get(k);
    if (g) g.push(i);
    else groups.set(k, [i]);
  }
  const keys = [...groups.keys()].sort((a, b) => collator.compare(a, b));
  const small = keys.filter((k) => groups.get(k)!.length < o.minPerStratum);
  if (small.length > 0) {
    const list = small
      .slice(0, 5)
      .map((k) => `${k} has ${groups.get(k)!.length}`)
      .join("; ");
    throw new Error(
      `plan: ${small.length} stratum(s) have fewer plants than the minimum of ${o.minPerStratum} per stratum: ${list}${small.length > 5 ? "; …" : ""}. Lower the minimum or choose fewer stratum attributes`,
    );
  }
  const sizes = keys.map((k) => groups.get(k)!.length);
  const total = Math.max(o.required, o.minPerStratum * keys.length);
  if (total > eligible.length)
    throw new Error(
      `plan: ${keys.length} strata × ${o.minPerStratum} checkpoints = ${total}, more than the ${eligible.length} plants that can be chosen`,
    );
  const alloc = allocate(sizes, total, o.minPerStratum);

  const rand = mulberry32(o.seed);
  const grid = new SpacingGrid(o.minSpacingM);
  const picked: { index: number; stratum: string; spare: boolean }[] = [];
  const strata: StratumPlan[] = [];
  let sparesShort = 0;

  keys.forEach((key, s) => {
    const members = groups
      .get(key)!
      .slice()
      .sort((a, b) => cmp(plants[a].row, plants[b].row) || along[a] - along[b] || cmp(plants[a].id, plants[b].id));
    const taken = new Set<number>();
    const take = (count: number, spare: boolean): number => {
      const free = members.filter((i) => !taken.has(i));
      let got = 0;
      for (let c = 0; c < count; c++) {
        const lo = Math.floor((c * free.length) / count);
        const hi = Math.floor(((c + 1) * free.length) / count);
        let choice = shuffled(free.slice(lo, hi), rand).find(
          (i) => !taken.has(i) && grid.fits(plants[i].e, plants[i].n),
        );
        if (choice === undefined)
          choice = shuffled(free, rand).find((i) => !taken.has(i) && grid.fits(plants[i].e, plants[i].n));
        if (choice === undefined) break;
        taken.add(choice);
        grid.add(plants[choice].e, plants[choice].n);
        picked.push({ index: choice, stratum: key, spare });
        got++;
      }
      return got;
    };
    const checkpoints = take(alloc[s], false);
    if (checkpoints < alloc[s])
      throw new Error(
        `plan: only ${checkpoints} of the ${alloc[s]} checkpoints of ${key} fit with a minimum spacing of ${fmt(o.minSpacingM)} (${members.length} plants); lower the spacing`,
      );
    const spares = take(o.sparesPerStratum, true);
    sparesShort += o.sparesPerStratum - spares;
    strata.push({ key, plants: members.length, checkpoints, spares, minimum: o.minPerStratum });
  });

  // Numbered in walking order: bed, row, along the row; checkpoints and spares counted apart.
  picked.sort(
    (a, b) =>
      cmp(plants[a.index].bed, plants[b.index].bed) ||
      cmp(plants[a.index].row, plants[b.index].row) ||
      along[a.index] - along[b.index] ||
      a.index - b.index,
  );
  let cSeq = 0;
  let sSeq = 0;
  const points: ChosenPoint[] = picked.map(({ index, stratum, spare }) => {
    const p = plants[index];
    const name = pointName(spare, spare ? ++sSeq : ++cSeq, p.bed);
    return {
      name,
      plantId: p.id,
      index,
      stratum,
      spare,
      e: p.e,
      n: p.n,
      bed: p.bed,
      row: p.row,
      arm: p.arm,
      crop: p.crop,
    };
  });
  return { points, strata, excludedAtBedEnds, eligible: eligible.length, bearingDeg, sparesShort };
}
