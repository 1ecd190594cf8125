import KDBush from "kdbush";
import { indexIds, type IdColumn } from "../ids";
import { buildCellGrid } from "./cell-grid";
import { PAIRED_BY_ID, PAIRED_BY_POSITION, type Pairing } from "../types";

/** The part of a table pairing needs: positions in one metric CRS, and ids when present. */
export interface PairInput {
  length: number;
  x: Float64Array;
  y: Float64Array;
  id: IdColumn | null;
}

/** How to pair survey points with planted records. */
export type MatchMode = "auto" | "id" | "nearest";

/** Options of `pairPoints`. */
export interface PairOptions {
  /** "auto" (default): by id where the survey point's id is found among the records, by position for the rest. "id": ids only. "nearest": positions only, ids ignored. */
  mode?: MatchMode;
  /** Largest distance (metres) for pairing by position; also the threshold of the `beyondMaxDistance` flag for id pairs. Default 0.10 m. */
  maxDistanceM?: number;
  /** A survey point is ambiguous when its second-nearest free plant is within this factor of the nearest (default 1.2) … */
  ambiguityRatio?: number;
  /** … and also less than this many metres farther (default 0.01 m). */
  ambiguityGap?: number;
  /** At most this many nearest planted candidates are considered per survey point (default 16). */
  maxCandidates?: number;
  /** How candidates are found: "auto" (default) a uniform cell grid, or the k-d tree when points are spread too far for one; "kd-tree" always the tree. Results are the same; tests compare them. */
  spatialIndex?: "auto" | "kd-tree";
}

/** Counts that explain a pairing, for messages. */
export interface PairingNotes {
  /** Survey ids not found among the planted ids (paired by position in auto mode). */
  surveyIdsNotFound: number;
  /** Pairs formed by id / by position. */
  byId: number;
  byPosition: number;
}

/** Default largest distance for pairing by position, metres. */
export const DEFAULT_MAX_PAIR_DISTANCE_M = 0.1;

/**
 * Pairs each survey point with at most one as-planted record, and each record with at most one
 * survey point. Both tables must be in the same metric CRS. Inputs are not modified.
 *
 * **By id** (modes "auto" and "id"): a survey point whose non-empty id equals a record's id is paired
 * with it however far apart they are; pairs farther than `maxDistanceM` are flagged `beyondMaxDistance`
 * (a gross error the audit must show, not hide).
 *
 * **By position** (modes "auto" — for survey points without a matching id and records not paired by
 * id — and "nearest"): candidate edges are all (survey, plant) pairs within `maxDistanceM`, found with
 * a uniform cell grid (or a static k-d tree, kdbush, when the points are spread too far for one; at most
 * `maxCandidates` nearest per survey point). Edges are then taken
 * greedily in ascending distance; an edge is accepted when both ends are still free.
 * Guarantee: the result is the *stable* one-to-one matching — no survey point and plant that are not
 * paired with each other are nearer to each other than either is to its own partner (or unpaired),
 * so every pair is mutually nearest among the points left when it was formed, and the largest
 * distance is no larger than needed for those pairs. It is unique when distances are distinct.
 * It does not minimise the total distance or maximise the number of pairs in crowded conflicts
 * (where a global assignment might pair more points at larger distances); when plants are more than
 * twice `maxDistanceM` apart every component is a single edge and all these criteria coincide.
 * Edges whose survey point and plant have no other candidate are accepted without sorting, so the
 * cost is O(n log n) for the tree plus O(k log k) for the k contested edges.
 *
 * **Ambiguous**: when a survey point's turn comes (its nearest free plant at distance d1) and its
 * next free candidate lies at d2 with d2 < `ambiguityRatio`·d1 and d2 − d1 < `ambiguityGap`, the
 * survey point is left unpaired and listed in `ambiguousSurvey`; both plants stay available.
 *
 * **Ties** are broken by survey position (x, then y), then plant position, then row index, so the
 * result does not depend on the row order of either file unless two points share a position.
 *
 * @example
 * const p = pairPoints(planted, survey, { mode: "nearest", maxDistanceM: 0.1 });
 * // p.plantedIndex[k] ↔ p.surveyIndex[k], sorted by planted index
 */
export function pairPoints(
  planted: PairInput,
  survey: PairInput,
  options: PairOptions = {},
): Pairing & { notes: PairingNotes } {
  const mode = options.mode ?? "auto";
  const maxDistanceM = options.maxDistanceM ?? DEFAULT_MAX_PAIR_DISTANCE_M;
  const ratio = options.ambiguityRatio ?? 1.2;
  const gap = options.ambiguityGap ?? 0.01;
  const maxCand = Math.max(1, options.maxCandidates ?? 16);
  if (!(maxDistanceM > 0))
    throw new Error(`pairing: maxDistanceM must be a positive number of metres, got ${maxDistanceM}`);

  const np = planted.length,
    ns = survey.length;
  const px = planted.x,
    py = planted.y,
    sx = survey.x,
    sy = survey.y;
  const partnerOfPlanted = new Int32Array(np).fill(-1);
  const partnerOfSurvey = new Int32Array(ns).fill(-1);
  const pairMethod = new Uint8Array(np);
  const ambiguous = new Uint8Array(ns);
  const notes: PairingNotes = { surveyIdsNotFound: 0, byId: 0, byPosition: 0 };

  // 1. By id.
  const positionSurvey = new Uint8Array(ns); // 1 = may be paired by position
  if (mode === "nearest") positionSurvey.fill(1);
  if (mode !== "nearest") {
    const pid = planted.id,
      sid = survey.id;
    if (pid && sid) {
      const index = indexIds(pid);
      for (let s = 0; s < ns; s++) {
        const empty = sid.isEmpty(s);
        const found = empty ? -1 : index.lookupFrom(sid, s);
        const p = found < 0 ? undefined : found;
        if (p !== undefined && partnerOfPlanted[p] < 0) {
          partnerOfPlanted[p] = s;
          partnerOfSurvey[s] = p;
          pairMethod[p] = PAIRED_BY_ID;
          notes.byId++;
        } else {
          if (!empty && p === undefined) notes.surveyIdsNotFound++;
          positionSurvey[s] = 1;
        }
      }
    } else {
      positionSurvey.fill(1);
    }
  }

  // 2. By position.
  if (mode !== "id") {
    let nFree = 0;
    for (let i = 0; i < np; i++) if (partnerOfPlanted[i] < 0 && px[i] === px[i] && py[i] === py[i]) nFree++;
    const freeP = new Int32Array(nFree);
    for (let i = 0, j = 0; i < np; i++)
      if (partnerOfPlanted[i] < 0 && px[i] === px[i] && py[i] === py[i]) freeP[j++] = i;
    if (nFree > 0) pairByPosition();

    function pairByPosition(): void {
      const tree = (options.spatialIndex !== "kd-tree" && buildCellGrid(px, py, freeP, maxDistanceM)) || kdTree();
      function kdTree(): KDBush {
        // Leaves of 16: queries of a few centimetres touch fewer points than with the default 64.
        const t = new KDBush(freeP.length, 16, Float64Array);
        for (let j = 0; j < freeP.length; j++) t.add(px[freeP[j]], py[freeP[j]]);
        t.finish();
        return t;
      }

      // Candidate lists per survey point, nearest first. Survey points are visited in a spatial
      // order (coarse grid cells) so consecutive queries touch nearby tree nodes (cache-friendly).
      const visit = spatialOrder(sx, sy, positionSurvey);
      const start = new Int32Array(ns);
      const cnt = new Int32Array(ns);
      let cap = Math.max(1024, visit.length);
      let edgeP = new Int32Array(cap);
      let edgeD = new Float64Array(cap);
      let edgeS = new Int32Array(cap);
      let m = 0;
      const degree = new Int32Array(np);
      const out: number[] = [];
      let tmpP = new Int32Array(64),
        tmpD = new Float64Array(64);
      const r2 = maxDistanceM * maxDistanceM;
      for (let q = 0; q < visit.length; q++) {
        const s = visit[q];
        start[s] = m;
        const qx = sx[s],
          qy = sy[s];
        const k = tree.withinInto(qx, qy, maxDistanceM, out);
        if (k === 0) continue;
        if (k > tmpP.length) {
          tmpP = new Int32Array(k * 2);
          tmpD = new Float64Array(k * 2);
        }
        let c = 0;
        for (let j = 0; j < k; j++) {
          const p = freeP[out[j]];
          const dx = px[p] - qx,
            dy = py[p] - qy;
          const d2 = dx * dx + dy * dy;
          if (d2 > r2) continue;
          tmpP[c] = p;
          tmpD[c] = Math.sqrt(d2);
          c++;
        }
        if (c === 0) continue;
        let order: number[] | null = null;
        if (c > 1) {
          order = [];
          for (let j = 0; j < c; j++) order.push(j);
          const tp = tmpP,
            td = tmpD;
          order.sort((a, b) => td[a] - td[b] || cmpPlanted(tp[a], tp[b]));
          if (c > maxCand) c = maxCand;
        }
        if (m + c > cap) {
          cap = Math.max(cap * 2, m + c);
          const ep = new Int32Array(cap);
          ep.set(edgeP.subarray(0, m));
          edgeP = ep;
          const ed = new Float64Array(cap);
          ed.set(edgeD.subarray(0, m));
          edgeD = ed;
          const es = new Int32Array(cap);
          es.set(edgeS.subarray(0, m));
          edgeS = es;
        }
        for (let j = 0; j < c; j++) {
          const o = order ? order[j] : j;
          edgeP[m] = tmpP[o];
          edgeD[m] = tmpD[o];
          edgeS[m] = s;
          degree[tmpP[o]]++;
          m++;
        }
        cnt[s] = c;
      }

      // Isolated edges (the survey point's only candidate, and the plant's only one) are taken directly.
      const contested: number[] = [];
      for (let e = 0; e < m; ) {
        const s = edgeS[e],
          c = cnt[s];
        if (c === 1 && degree[edgeP[e]] === 1) {
          const p = edgeP[e];
          partnerOfPlanted[p] = s;
          partnerOfSurvey[s] = p;
          pairMethod[p] = PAIRED_BY_POSITION;
          notes.byPosition++;
        } else for (let f = e; f < e + c; f++) contested.push(f);
        e += c;
      }

      contested.sort((e, f) => edgeD[e] - edgeD[f] || cmpSurvey(edgeS[e], edgeS[f]) || cmpPlanted(edgeP[e], edgeP[f]));
      for (const e of contested) {
        const s = edgeS[e],
          p = edgeP[e];
        if (partnerOfSurvey[s] >= 0 || ambiguous[s] || partnerOfPlanted[p] >= 0) continue;
        // p is s's nearest free plant: earlier edges of s were skipped only because their plant was taken.
        const d1 = edgeD[e];
        let d2 = Infinity;
        for (let f = start[s], fEnd = start[s] + cnt[s]; f < fEnd; f++) {
          if (f === e || partnerOfPlanted[edgeP[f]] >= 0) continue;
          if (edgeD[f] >= d1) {
            d2 = edgeD[f];
            break;
          }
        }
        if (d2 < ratio * d1 && d2 - d1 < gap) {
          ambiguous[s] = 1;
          continue;
        }
        partnerOfPlanted[p] = s;
        partnerOfSurvey[s] = p;
        pairMethod[p] = PAIRED_BY_POSITION;
        notes.byPosition++;
      }
    }
  }

  function cmpPlanted(a: number, b: number): number {
    return px[a] - px[b] || py[a] - py[b] || a - b;
  }
  function cmpSurvey(a: number, b: number): number {
    return sx[a] - sx[b] || sy[a] - sy[b] || a - b;
  }

  // 3. Output, sorted by planted index.
  const count = notes.byId + notes.byPosition;
  const plantedIndex = new Int32Array(count);
  const surveyIndex = new Int32Array(count);
  const method = new Uint8Array(count);
  const beyond = new Uint8Array(count);
  const unmatchedPlanted = new Int32Array(np - count);
  let k = 0,
    u = 0;
  for (let p = 0; p < np; p++) {
    const s = partnerOfPlanted[p];
    if (s < 0) {
      unmatchedPlanted[u++] = p;
      continue;
    }
    plantedIndex[k] = p;
    surveyIndex[k] = s;
    method[k] = pairMethod[p];
    if (pairMethod[p] === PAIRED_BY_ID) {
      const d = Math.hypot(px[p] - sx[s], py[p] - sy[s]);
      beyond[k] = d > maxDistanceM || d !== d ? 1 : 0;
    }
    k++;
  }
  let nAmb = 0;
  for (let s = 0; s < ns; s++) if (ambiguous[s]) nAmb++;
  const ambiguousSurvey = new Int32Array(nAmb);
  const unmatchedSurvey = new Int32Array(ns - count - nAmb);
  let a = 0,
    b = 0;
  for (let s = 0; s < ns; s++) {
    if (ambiguous[s]) ambiguousSurvey[a++] = s;
    else if (partnerOfSurvey[s] < 0) unmatchedSurvey[b++] = s;
  }
  return {
    plantedIndex,
    surveyIndex,
    method,
    beyondMaxDistance: beyond,
    unmatchedPlanted,
    unmatchedSurvey,
    ambiguousSurvey,
    notes,
  };
}

/**
 * Indices of the survey points flagged in `use` (and with finite positions), kept in file order when
 * consecutive points are already close (median step under 1/1000 of the extent), else ordered by a coarse
 * 1024 × 1024 grid over the central 99.8 % of their extent (row-major; counting sort, stable by index). Only the
 * visiting order changes; results do not depend on it.
 */
function spatialOrder(x: Float64Array, y: Float64Array, use: Uint8Array): Int32Array {
  const n = x.length;
  let count = 0;
  for (let i = 0; i < n; i++) if (use[i] && x[i] === x[i] && y[i] === y[i]) count++;
  const idx = new Int32Array(count);
  let k = 0;
  for (let i = 0; i < n; i++) if (use[i] && x[i] === x[i] && y[i] === y[i]) idx[k++] = i;
  if (count < 4096) return idx;
  // Already in walking order (consecutive points close together, the usual survey file)? Keep it.
  const steps: number[] = [];
  const stride = Math.max(1, Math.floor(count / 2000));
  for (let j = 0; j + 1 < count; j += stride)
    steps.push(Math.hypot(x[idx[j + 1]] - x[idx[j]], y[idx[j + 1]] - y[idx[j]]));
  steps.sort((p, q) => p - q);
  const [x0, x1] = spread(x, idx),
    [y0, y1] = spread(y, idx);
  if (steps[steps.length >> 1] < Math.max(x1 - x0, y1 - y0) / 1000) return idx;
  const fx = x1 > x0 ? 1023 / (x1 - x0) : 0,
    fy = y1 > y0 ? 1023 / (y1 - y0) : 0;
  const cells = new Int32Array(count);
  const counts = new Int32Array(1024 * 1024 + 1);
  for (let j = 0; j < count; j++) {
    const i = idx[j];
    const cx = Math.min(1023, Math.max(0, Math.floor((x[i] - x0) * fx)));
    const cy = Math.min(1023, Math.max(0, Math.floor((y[i] - y0) * fy)));
    const c = cy * 1024 + cx;
    cells[j] = c;
    counts[c + 1]++;
  }
  for (let c = 1; c < counts.length; c++) counts[c] += counts[c - 1];
  const ordered = new Int32Array(count);
  for (let j = 0; j < count; j++) ordered[counts[cells[j]]++] = idx[j];
  return ordered;
}

/** 0.1 % and 99.9 % quantiles of `a` over `idx`, from at most ~10 000 samples. */
function spread(a: Float64Array, idx: Int32Array): [number, number] {
  const step = Math.max(1, Math.floor(idx.length / 10000));
  const s: number[] = [];
  for (let j = 0; j < idx.length; j += step) s.push(a[idx[j]]);
  s.sort((p, q) => p - q);
  return [s[Math.floor(s.length * 0.001)], s[Math.min(s.length - 1, Math.floor(s.length * 0.999))]];
}
