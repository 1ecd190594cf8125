/**
 * Test helpers for lib/audit: hand-built tables and pairings, a seeded PRNG and a simulated field.
 * Example data is a fictional farm ("Hollow Brook", beds of 4 rows at 0.5 m). Not used by production code.
 */
import type { AttributeName, CodedColumn, Pairing, ProjectedTable } from "@/geo/types";
import { PAIRED_BY_ID, PAIRED_BY_POSITION } from "@/geo/types";
import { IdColumn } from "@/geo/ids";
import { gaussian, mulberry32 } from "@/lib/random";
import type { DiagnosticPair } from "./diagnostics/types";

export { gaussian, mulberry32 };

/** Builds a dictionary-coded column from text values ("" = empty cell → code −1). */
export function coded(values: readonly string[]): CodedColumn {
  const dict: string[] = [];
  const index = new Map<string, number>();
  const codes = new Int32Array(values.length);
  values.forEach((v, i) => {
    if (v === "") {
      codes[i] = -1;
      return;
    }
    let c = index.get(v);
    if (c === undefined) {
      c = dict.length;
      dict.push(v);
      index.set(v, c);
    }
    codes[i] = c;
  });
  return { codes, values: dict };
}

/** Hand-built projected table. */
export function makeTable(spec: {
  role: "planted" | "survey";
  x: ArrayLike<number>;
  y: ArrayLike<number>;
  id?: string[];
  attrs?: Partial<Record<AttributeName, string[]>>;
  time?: ArrayLike<number>;
  rawX?: ArrayLike<number>;
  rawY?: ArrayLike<number>;
  crs?: string;
  source?: string;
}): ProjectedTable {
  const n = spec.x.length;
  const attrs: Partial<Record<AttributeName, CodedColumn>> = {};
  for (const [k, v] of Object.entries(spec.attrs ?? {})) attrs[k as AttributeName] = coded(v as string[]);
  return {
    source: spec.source ?? (spec.role === "planted" ? "planted.csv" : "survey.csv"),
    role: spec.role,
    length: n,
    x: Float64Array.from(spec.x),
    y: Float64Array.from(spec.y),
    line: Int32Array.from({ length: n }, (_, i) => i + 2),
    id: spec.id ? IdColumn.from(spec.id) : null,
    attrs,
    time: spec.time ? Float64Array.from(spec.time) : null,
    hdop: null,
    precision: null,
    rawX: spec.rawX ? Float64Array.from(spec.rawX) : null,
    rawY: spec.rawY ? Float64Array.from(spec.rawY) : null,
    crs: spec.crs ?? "EPSG:32631",
  };
}

/** Pairing from [plantedIndex, surveyIndex] pairs (method: by id unless `byPosition`). */
export function makePairing(
  pairs: Array<[number, number]>,
  extra: {
    byPosition?: boolean;
    beyond?: number[];
    unmatchedPlanted?: number[];
    unmatchedSurvey?: number[];
    ambiguousSurvey?: number[];
  } = {},
): Pairing {
  const beyond = new Set(extra.beyond ?? []);
  return {
    plantedIndex: Int32Array.from(pairs.map((p) => p[0])),
    surveyIndex: Int32Array.from(pairs.map((p) => p[1])),
    method: Uint8Array.from(pairs.map(() => (extra.byPosition ? PAIRED_BY_POSITION : PAIRED_BY_ID))),
    beyondMaxDistance: Uint8Array.from(pairs.map((_, i) => (beyond.has(i) ? 1 : 0))),
    unmatchedPlanted: Int32Array.from(extra.unmatchedPlanted ?? []),
    unmatchedSurvey: Int32Array.from(extra.unmatchedSurvey ?? []),
    ambiguousSurvey: Int32Array.from(extra.ambiguousSurvey ?? []),
  };
}

/** Identity pairing 0↔0, 1↔1, ... */
export function identityPairing(n: number): Pairing {
  return makePairing(Array.from({ length: n }, (_, i) => [i, i] as [number, number]));
}

/**
 * A simulated field: n plants on beds of 4 rows (0.5 m apart, rows running north) near a UTM origin, survey =
 * planted + bias + N(0, sigma²) per axis. Returns tables with identity pairing.
 */
export function simulateField(spec: {
  n: number;
  seed: number;
  biasE: number;
  biasN: number;
  sigmaE: number;
  sigmaN: number;
  originE?: number;
  originN?: number;
}): { planted: ProjectedTable; survey: ProjectedTable; pairing: Pairing } {
  const rng = mulberry32(spec.seed);
  const z = gaussian(rng);
  const e0 = spec.originE ?? 612_000;
  const n0 = spec.originN ?? 5_812_000;
  const px = new Float64Array(spec.n);
  const py = new Float64Array(spec.n);
  const sx = new Float64Array(spec.n);
  const sy = new Float64Array(spec.n);
  const arm: string[] = [];
  for (let i = 0; i < spec.n; i++) {
    const row = i % 4;
    const bed = Math.floor(i / 400);
    px[i] = e0 + bed * 3 + row * 0.5;
    py[i] = n0 + Math.floor((i % 400) / 4) * 0.3;
    sx[i] = px[i] + spec.biasE + spec.sigmaE * z();
    sy[i] = py[i] + spec.biasN + spec.sigmaN * z();
    arm.push(row < 2 ? "L" : "R");
  }
  return {
    planted: makeTable({ role: "planted", x: px, y: py, attrs: { arm } }),
    survey: makeTable({ role: "survey", x: sx, y: sy }),
    pairing: identityPairing(spec.n),
  };
}

/** Deep copy of a value with typed arrays, for checking that inputs are not mutated. */
export function snapshot<T>(value: T): T {
  return structuredClone(value);
}

// ---------------------------------------------------------------------------
// Diagnostics (lib/audit/diagnostics): simulated checkpoints of "Hollow Brook": rows running north, 4 arms, one
// checkpoint every 10th plant (0.3 m apart).
// ---------------------------------------------------------------------------

export interface SimOptions {
  seed?: number;
  rows?: number;
  checkpointsPerRow?: number;
  /** Cross-row bias per arm (arm = row index mod 4 + 1), metres. */
  armCross?: number[];
  sd?: number;
  /** Checkpoint indices k (per row) planted with a float fix, rows given. */
  float?: { rows: number[]; from: number; to: number; along: number; cross: number };
  /** Raw GNSS extra noise SD, metres; null = no raw positions. */
  rawSd?: number | null;
}

/** Rows run north (bearing 0): along = dN, cross = dE. Planting time: 3 s per plant, all rows side by side. */
export function simulatePairs(o: SimOptions = {}): DiagnosticPair[] {
  const g = gaussian(mulberry32(o.seed ?? 7));
  const rows = o.rows ?? 8;
  const per = o.checkpointsPerRow ?? 40;
  const sd = o.sd ?? 0.002;
  const pairs: DiagnosticPair[] = [];
  for (let r = 0; r < rows; r++) {
    for (let k = 0; k < per; k++) {
      const arm = String((r % 4) + 1);
      const isFloat = !!o.float && o.float.rows.includes(r + 1) && k >= o.float.from && k <= o.float.to;
      let along = g() * sd;
      let cross = (o.armCross?.[r % 4] ?? 0) + g() * sd;
      if (isFloat) {
        along += o.float!.along;
        cross += o.float!.cross;
      }
      const dE = cross;
      const dN = along;
      const rawDE = o.rawSd === null || o.rawSd === undefined ? null : dE + g() * o.rawSd;
      const rawDN = o.rawSd === null || o.rawSd === undefined ? null : dN + g() * o.rawSd;
      pairs.push({
        seq: pairs.length,
        plantId: `HB-${r + 1}-${String(k * 10 + 1).padStart(4, "0")}`,
        bed: String(Math.floor(r / 4) + 1),
        row: String((r % 4) + 1),
        arm,
        fix: isFloat ? "rtk-float" : "rtk-fixed",
        plantedE: 500_000 + r * 0.5,
        plantedN: 5_800_000 + k * 3,
        dE,
        dN,
        along,
        cross,
        radial: Math.hypot(dE, dN),
        outlier: false,
        time: Date.UTC(2026, 3, 14, 8) + (Math.floor(r / 4) * per + k) * 30_000,
        rawDE,
        rawDN,
      });
    }
  }
  return pairs;
}
