import { IdColumn } from "../ids";
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { PAIRED_BY_ID, PAIRED_BY_POSITION } from "../types";
import { pairPoints, type PairInput } from "./index";

// Checks are by construction (hand-placed points whose correct pairing is known), plus an
// independent oracle: a brute-force O(n·m) greedy over all pairs, and the stability property of
// the greedy (stable) matching — Gale & Shapley, "College admissions and the stability of
// marriage", Amer. Math. Monthly 69 (1962): with symmetric distances the stable matching is the
// one built by repeatedly taking the closest free pair (from memory).
const pts = (xy: number[][], id: string[] | null = null): PairInput => ({
  length: xy.length,
  x: Float64Array.from(xy.map((p) => p[0])),
  y: Float64Array.from(xy.map((p) => p[1])),
  id: id ? IdColumn.from(id) : null,
});
const pairsOf = (r: ReturnType<typeof pairPoints>) => Array.from(r.plantedIndex, (p, k) => [p, r.surveyIndex[k]]);

/** Brute force greedy: all pairs within maxDistanceM sorted by distance, then by survey and planted position. */
function bruteGreedy(p: PairInput, s: PairInput, maxDistanceM: number): Set<string> {
  const edges: [number, number, number][] = [];
  for (let i = 0; i < s.length; i++)
    for (let j = 0; j < p.length; j++) {
      const d = Math.hypot(p.x[j] - s.x[i], p.y[j] - s.y[i]);
      if (d <= maxDistanceM) edges.push([d, i, j]);
    }
  edges.sort(
    (a, b) =>
      a[0] - b[0] ||
      s.x[a[1]] - s.x[b[1]] ||
      s.y[a[1]] - s.y[b[1]] ||
      a[1] - b[1] ||
      p.x[a[2]] - p.x[b[2]] ||
      p.y[a[2]] - p.y[b[2]] ||
      a[2] - b[2],
  );
  const us = new Set<number>(),
    up = new Set<number>(),
    out = new Set<string>();
  for (const [, i, j] of edges) {
    if (us.has(i) || up.has(j)) continue;
    us.add(i);
    up.add(j);
    out.add(`${j}:${i}`);
  }
  return out;
}

describe("pairing", () => {
  it("pairPoints -- nearest within max distance, one to one", () => {
    const planted = pts([
      [0, 0],
      [1, 0],
      [2, 0],
      [3, 0],
    ]);
    const survey = pts([
      [1.02, 0.01],
      [0.05, 0],
      [2.5, 0],
      [9, 9],
    ]);
    const r = pairPoints(planted, survey, { mode: "nearest", maxDistanceM: 0.1 });
    expect(pairsOf(r)).toEqual([
      [0, 1],
      [1, 0],
    ]);
    expect(Array.from(r.method)).toEqual([PAIRED_BY_POSITION, PAIRED_BY_POSITION]);
    expect(Array.from(r.unmatchedPlanted)).toEqual([2, 3]);
    expect(Array.from(r.unmatchedSurvey)).toEqual([2, 3]);
    expect(r.ambiguousSurvey.length).toBe(0);
  });

  it("pairPoints -- two survey points never claim one plant", () => {
    // plant A at 0, plant B at 0.12; survey s0 at 0.03 (nearest A), s1 at 0.05 (nearest A too, B at 0.07)
    const r = pairPoints(
      pts([
        [0, 0],
        [0.12, 0],
      ]),
      pts([
        [0.03, 0],
        [0.05, 0],
      ]),
      { mode: "nearest", maxDistanceM: 0.1, ambiguityGap: 0 },
    );
    expect(pairsOf(r)).toEqual([
      [0, 0],
      [1, 1],
    ]);
  });

  it("pairPoints -- ambiguous survey point is left unpaired", () => {
    // survey at 0.050 between plants at 0 and 0.105: d1 = 0.050, d2 = 0.055 < 1.2·d1 and gap 5 mm < 10 mm
    const r = pairPoints(
      pts([
        [0, 0],
        [0.105, 0],
      ]),
      pts([[0.05, 0]]),
      { mode: "nearest", maxDistanceM: 0.1 },
    );
    expect(r.plantedIndex.length).toBe(0);
    expect(Array.from(r.ambiguousSurvey)).toEqual([0]);
    expect(r.unmatchedSurvey.length).toBe(0);
    expect(Array.from(r.unmatchedPlanted)).toEqual([0, 1]);
    // clearly nearer to one plant: paired
    const q = pairPoints(
      pts([
        [0, 0],
        [0.105, 0],
      ]),
      pts([[0.02, 0]]),
      { mode: "nearest", maxDistanceM: 0.1 },
    );
    expect(pairsOf(q)).toEqual([[0, 0]]);
  });

  it("pairPoints -- by id regardless of distance, flagged beyond max distance", () => {
    const planted = pts(
      [
        [0, 0],
        [1, 0],
        [2, 0],
      ],
      ["A", "B", "C"],
    );
    const survey = pts(
      [
        [0.01, 0],
        [1.5, 0],
        [2.01, 0],
      ],
      ["A", "B", ""],
    );
    const r = pairPoints(planted, survey, { mode: "auto", maxDistanceM: 0.1 });
    expect(pairsOf(r)).toEqual([
      [0, 0],
      [1, 1],
      [2, 2],
    ]);
    expect(Array.from(r.method)).toEqual([PAIRED_BY_ID, PAIRED_BY_ID, PAIRED_BY_POSITION]);
    expect(Array.from(r.beyondMaxDistance)).toEqual([0, 1, 0]);
    const idOnly = pairPoints(planted, survey, { mode: "id" });
    expect(pairsOf(idOnly)).toEqual([
      [0, 0],
      [1, 1],
    ]);
    expect(Array.from(idOnly.unmatchedSurvey)).toEqual([2]);
  });

  it("pairPoints -- auto: unknown survey ids are paired by position and counted", () => {
    const r = pairPoints(
      pts(
        [
          [0, 0],
          [1, 0],
        ],
        ["A", "B"],
      ),
      pts(
        [
          [0.01, 0],
          [1.01, 0],
        ],
        ["pt1", "pt2"],
      ),
      { mode: "auto" },
    );
    expect(pairsOf(r)).toEqual([
      [0, 0],
      [1, 1],
    ]);
    expect(r.notes).toEqual({ surveyIdsNotFound: 2, byId: 0, byPosition: 2 });
    const nearest = pairPoints(pts([[0, 0]], ["A"]), pts([[5, 5]], ["A"]), { mode: "nearest" });
    expect(nearest.plantedIndex.length).toBe(0);
  });

  it("pairPoints -- rejects a non-positive max distance", () => {
    expect(() => pairPoints(pts([]), pts([]), { maxDistanceM: 0 })).toThrow(
      /pairing: maxDistanceM must be a positive number of metres/,
    );
  });

  it("pairPoints -- equals a brute-force greedy and is stable (random crowded fields)", () => {
    const coord = fc.integer({ min: 0, max: 400 }).map((v) => v / 1024);
    const cloud = fc.uniqueArray(fc.tuple(coord, coord), {
      minLength: 0,
      maxLength: 60,
      selector: (p) => `${p[0]},${p[1]}`,
    });
    fc.assert(
      fc.property(cloud, cloud, (a, b) => {
        const p = pts(a),
          s = pts(b);
        const maxDistanceM = 0.08;
        const r = pairPoints(p, s, {
          mode: "nearest",
          maxDistanceM: maxDistanceM,
          ambiguityRatio: 1,
          ambiguityGap: 0,
          maxCandidates: 1000,
        });
        const got = new Set(pairsOf(r).map(([i, j]) => `${i}:${j}`));
        expect(got).toEqual(bruteGreedy(p, s, maxDistanceM));
        // stability: no unpaired-or-worse couple nearer to each other than to their partners
        const partnerD = (arr: Int32Array, other: Int32Array, idx: number, fromPlanted: boolean) => {
          const k = arr.indexOf(idx);
          if (k < 0) return Infinity;
          const pi = fromPlanted ? idx : other[k],
            si = fromPlanted ? other[k] : idx;
          return Math.hypot(p.x[pi] - s.x[si], p.y[pi] - s.y[si]);
        };
        for (let i = 0; i < p.length; i++)
          for (let j = 0; j < s.length; j++) {
            const d = Math.hypot(p.x[i] - s.x[j], p.y[i] - s.y[j]);
            if (d > maxDistanceM) continue;
            const dp = partnerD(r.plantedIndex, r.surveyIndex, i, true),
              ds = partnerD(r.surveyIndex, r.plantedIndex, j, false);
            expect(d < dp && d < ds).toBe(false);
          }
      }),
      { numRuns: 150 },
    );
  });

  it("pairPoints -- shuffling rows or translating both files gives the same pairs", () => {
    // Coordinates on a 1/1024 m grid and integer shifts keep every difference exact, so ties break the same way.
    const coord = fc.integer({ min: 0, max: 300 }).map((v) => v / 1024);
    const cloud = fc.uniqueArray(fc.tuple(coord, coord), {
      minLength: 1,
      maxLength: 50,
      selector: (p) => `${p[0]},${p[1]}`,
    });
    fc.assert(
      fc.property(
        cloud,
        cloud,
        fc.integer({ min: -2_000_000, max: 2_000_000 }),
        fc.integer({ min: 0, max: 9_000_000 }),
        fc.integer(),
        (a, b, dx, dy, seed) => {
          const opts = { mode: "nearest" as const, maxDistanceM: 0.06 };
          const key = (r: ReturnType<typeof pairPoints>, pa: number[][], sb: number[][]) =>
            new Set(pairsOf(r).map(([i, j]) => `${pa[i]}|${sb[j]}`));
          const base = key(pairPoints(pts(a), pts(b), opts), a, b);
          const shuffle = <T>(arr: T[]) => {
            const out = arr.slice();
            let h = seed | 0;
            for (let i = out.length - 1; i > 0; i--) {
              h = (Math.imul(h, 1103515245) + 12345) | 0;
              const j = Math.abs(h) % (i + 1);
              [out[i], out[j]] = [out[j], out[i]];
            }
            return out;
          };
          const a2 = shuffle(a),
            b2 = shuffle(b);
          expect(key(pairPoints(pts(a2), pts(b2), opts), a2, b2)).toEqual(base);
          const a3 = a.map(([x, y]) => [x + dx, y + dy]),
            b3 = b.map(([x, y]) => [x + dx, y + dy]);
          const moved = key(pairPoints(pts(a3), pts(b3), opts), a, b);
          expect(moved).toEqual(base);
        },
      ),
      { numRuns: 150 },
    );
  });

  it("pairPoints -- does not modify its inputs", () => {
    fc.assert(
      fc.property(
        fc.array(fc.tuple(fc.double({ min: 0, max: 1, noNaN: true }), fc.double({ min: 0, max: 1, noNaN: true })), {
          maxLength: 40,
        }),
        (a) => {
          const p = pts(
              a,
              a.map((_, i) => `P${i}`),
            ),
            s = pts(
              a.map(([x, y]) => [x + 0.01, y]),
              a.map((_, i) => (i % 2 ? `P${i}` : "")),
            );
          const before = structuredClone({ p, s });
          pairPoints(p, s, { mode: "auto", maxDistanceM: 0.05 });
          expect({ p, s }).toEqual(before);
        },
      ),
      { numRuns: 50 },
    );
  });

  it("pairPoints -- a large field pairs everything once (spatial visiting order path)", () => {
    // 20 000 plants on a 0.25 m × 0.5 m grid, survey 4 mm off each, rows reversed: all pairs found by construction
    const n = 20000;
    const planted = pts(
      Array.from({ length: n }, (_, i) => [500000 + (i % 200) * 0.25, 5700000 + Math.floor(i / 200) * 0.5]),
    );
    const survey = pts(
      Array.from({ length: n }, (_, i) => [planted.x[n - 1 - i] + 0.004, planted.y[n - 1 - i] - 0.003]),
    );
    const r = pairPoints(planted, survey, { mode: "nearest" });
    expect(r.plantedIndex.length).toBe(n);
    for (let k = 0; k < n; k++) expect(r.surveyIndex[k]).toBe(n - 1 - r.plantedIndex[k]);
    // the same survey in scattered order (visited in grid order internally): same pairs
    const perm = Array.from({ length: n }, (_, i) => (i * 7919) % n);
    const scattered = pts(perm.map((j) => [planted.x[j] + 0.004, planted.y[j] - 0.003]));
    const q = pairPoints(planted, scattered, { mode: "nearest" });
    expect(q.plantedIndex.length).toBe(n);
    for (let k = 0; k < n; k++) expect(perm[q.surveyIndex[k]]).toBe(q.plantedIndex[k]);
  });
});

describe("pairing -- cell grid and k-d tree", () => {
  // Oracle: the same pairing with candidates from kdbush's k-d tree (a general-purpose index from the npm registry).
  it("pairing -- the cell grid gives the same pairs, ambiguous points and unpaired lists as the k-d tree, on crowded random fields", () => {
    fc.assert(
      fc.property(
        fc.array(fc.tuple(fc.double({ min: 0, max: 3, noNaN: true }), fc.double({ min: 0, max: 1, noNaN: true })), {
          minLength: 1,
          maxLength: 400,
        }),
        fc.array(
          fc.tuple(
            fc.double({ min: -0.05, max: 0.05, noNaN: true }),
            fc.double({ min: -0.05, max: 0.05, noNaN: true }),
          ),
        ),
        fc.double({ min: 0.02, max: 0.3, noNaN: true }),
        (plants, jitter, maxDistanceM) => {
          const planted = pts(plants.map(([e, n]) => [400_000 + e, 6_000_000 + n]));
          const survey = pts(
            plants.map(([e, n], i) => [400_000 + e + (jitter[i]?.[0] ?? 0.01), 6_000_000 + n + (jitter[i]?.[1] ?? 0)]),
          );
          const grid = pairPoints(planted, survey, { mode: "nearest", maxDistanceM });
          const tree = pairPoints(planted, survey, { mode: "nearest", maxDistanceM, spatialIndex: "kd-tree" });
          expect(pairsOf(grid)).toEqual(pairsOf(tree));
          expect(Array.from(grid.ambiguousSurvey)).toEqual(Array.from(tree.ambiguousSurvey));
          expect(Array.from(grid.unmatchedPlanted)).toEqual(Array.from(tree.unmatchedPlanted));
          expect(Array.from(grid.unmatchedSurvey)).toEqual(Array.from(tree.unmatchedSurvey));
        },
      ),
      { numRuns: 200 },
    );
  });
});
