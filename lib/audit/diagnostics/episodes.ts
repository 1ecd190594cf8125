/**
 * Errors along the pass: the planting order of the records, stretches planted with a degraded fix (from every
 * record, so the plant range is exact) and jumps in error among the checkpoints, each listed by time, bed, row and
 * plant range.
 */
import type { CodedColumn, PointTable } from "@/geo/types";
import { median, medianAbsoluteDeviation } from "../quantiles";
import { type DiagnosticPair, fixClass } from "./types";

/** The as-planted records as the episode finder reads them (every record, not only the checkpoints). */
export interface PlantedTrack {
  length: number;
  /** Planting times, epoch ms (NaN = unknown); null when the file has none: file order is used. */
  time: Float64Array | null;
  id(i: number): string | null;
  fix(i: number): string | null;
  bed(i: number): string | null;
  row(i: number): string | null;
  arm(i: number): string | null;
}

function codedGetter(col: CodedColumn | undefined): (i: number) => string | null {
  if (!col) return () => null;
  return (i) => (col.codes[i] >= 0 ? col.values[col.codes[i]] : null);
}

/**
 * The track of an as-planted point table (geo/types.ts). Reads the table, does not copy it.
 *
 * @example trackFromTable(plantedTable).fix(0) // "rtk-fixed"
 */
export function trackFromTable(t: PointTable): PlantedTrack {
  const ids = t.id;
  return {
    length: t.length,
    time: t.time,
    id: ids ? (i) => ids.get(i) || null : () => null,
    fix: codedGetter(t.attrs.fix),
    bed: codedGetter(t.attrs.bed),
    row: codedGetter(t.attrs.row),
    arm: codedGetter(t.attrs.arm),
  };
}

/** The part of an episode in one bed and row. Times epoch ms (null without planting times). */
export interface EpisodePart {
  bed: string | null;
  row: string | null;
  arm: string | null;
  /** First and last plant of the stretch in planting order. */
  firstPlantId: string | null;
  lastPlantId: string | null;
  /** Records (degraded fix) or checkpoints (error jump) in the stretch. */
  count: number;
  start: number | null;
  end: number | null;
}

export interface Episode {
  kind: "degraded-fix" | "error-jump";
  start: number | null;
  end: number | null;
  parts: EpisodePart[];
  /** As-planted records in the episode (degraded fix) or checkpoints (error jump). */
  count: number;
  /** Checkpoints inside the episode and their mean radial error, m. */
  checkpoints: number;
  meanRadial: number | null;
  /** Fix qualities recorded in a degraded-fix episode. */
  fixValues: string[];
  /** For an error jump: whether it lies within a degraded-fix episode (the fix explains it). */
  duringDegradedFix: boolean;
}

interface Run {
  lane: string;
  bed: string | null;
  row: string | null;
  arm: string | null;
  /** Indices (records or pairs) in planting order. */
  members: number[];
  start: number | null;
  end: number | null;
}

const laneKey = (bed: string | null, row: string | null, arm: string | null) => JSON.stringify([bed, row, arm]);

/** Indices 0..n−1 grouped by lane, each lane in planting order (time, then file order; unknown times last). */
function lanesInOrder(n: number, time: (i: number) => number, lane: (i: number) => string): Map<string, number[]> {
  const lanes = new Map<string, number[]>();
  for (let i = 0; i < n; i++) {
    const k = lane(i);
    let l = lanes.get(k);
    if (!l) lanes.set(k, (l = []));
    l.push(i);
  }
  for (const l of lanes.values())
    l.sort((a, b) => {
      const ta = time(a);
      const tb = time(b);
      const fa = Number.isFinite(ta);
      const fb = Number.isFinite(tb);
      if (fa && fb && ta !== tb) return ta - tb;
      if (fa !== fb) return fa ? -1 : 1;
      return a - b;
    });
  return lanes;
}

/** Maximal runs of consecutive members of each lane for which `hit` holds, at least `minRun` long. */
function runsOf(
  lanes: Map<string, number[]>,
  hit: (i: number) => boolean,
  minRun: number,
  time: (i: number) => number,
  where: (i: number) => { bed: string | null; row: string | null; arm: string | null },
): Run[] {
  const runs: Run[] = [];
  for (const [lane, order] of lanes) {
    let cur: number[] = [];
    const flush = () => {
      if (cur.length >= minRun) {
        const ts = cur.map(time).filter(Number.isFinite);
        runs.push({
          lane,
          ...where(cur[0]),
          members: cur,
          start: ts.length ? Math.min(...ts) : null,
          end: ts.length ? Math.max(...ts) : null,
        });
      }
      cur = [];
    };
    for (const i of order) {
      if (hit(i)) cur.push(i);
      else flush();
    }
    flush();
  }
  return runs;
}

/** Runs of different lanes whose time spans overlap (or lie within `gapMs`) form one episode; no time, no merging. */
function mergeRuns(runs: Run[], gapMs: number): Run[][] {
  const timed = runs.filter((r) => r.start !== null).sort((a, b) => a.start! - b.start!);
  const groups: Run[][] = [];
  let cur: Run[] = [];
  let curEnd = -Infinity;
  for (const r of timed) {
    if (cur.length && r.start! > curEnd + gapMs) {
      groups.push(cur);
      cur = [];
      curEnd = -Infinity;
    }
    cur.push(r);
    curEnd = Math.max(curEnd, r.end!);
  }
  if (cur.length) groups.push(cur);
  for (const r of runs) if (r.start === null) groups.push([r]);
  return groups;
}

const collator = new Intl.Collator("en", { numeric: true });
const byPlace = (a: EpisodePart, b: EpisodePart) =>
  collator.compare(a.bed ?? "", b.bed ?? "") || collator.compare(a.row ?? "", b.row ?? "");

/**
 * Stretches of the pass planted with a degraded fix (float, DGNSS, autonomous…): per bed and row the maximal runs
 * of consecutive records in planting order whose fix is not RTK fixed, merged across rows when their times overlap
 * (within `gapMs`, default 60 s), so one receiver outage is one episode. Plant ranges come from every record, not
 * only the checkpoints. Checkpoints inside a run are matched by plant id. Ordered by start time. Inputs not modified.
 *
 * Source: common practice, no source (reading the recorded fix quality; NMEA 0183 GGA quality 4 = RTK fixed, from memory).
 *
 * @example degradedFixEpisodes(trackFromTable(planted), pairs)[0].parts[0] // { bed: "3", row: "2", firstPlantId: "LA-3-2-0031", lastPlantId: "LA-3-2-0110", count: 80, ... }
 */
export function degradedFixEpisodes(track: PlantedTrack, pairs: readonly DiagnosticPair[], gapMs = 60_000): Episode[] {
  const time = (i: number) => (track.time ? track.time[i] : Number.NaN);
  const where = (i: number) => ({ bed: track.bed(i), row: track.row(i), arm: track.arm(i) });
  const lanes = lanesInOrder(track.length, time, (i) => laneKey(track.bed(i), track.row(i), track.arm(i)));
  const runs = runsOf(lanes, (i) => fixClass(track.fix(i)) === "degraded", 1, time, where);
  const radialById = new Map<string, number>();
  for (const p of pairs) if (p.plantId !== null) radialById.set(p.plantId, p.radial);
  return mergeRuns(runs, gapMs).map((group) => {
    const fixValues = new Set<string>();
    let checkpoints = 0;
    let sum = 0;
    for (const r of group)
      for (const i of r.members) {
        const f = track.fix(i);
        if (f !== null) fixValues.add(f);
        const id = track.id(i);
        const radial = id === null ? undefined : radialById.get(id);
        if (radial !== undefined) {
          checkpoints++;
          sum += radial;
        }
      }
    const parts = group
      .map((r) => ({
        bed: r.bed,
        row: r.row,
        arm: r.arm,
        firstPlantId: track.id(r.members[0]),
        lastPlantId: track.id(r.members[r.members.length - 1]),
        count: r.members.length,
        start: r.start,
        end: r.end,
      }))
      .sort(byPlace);
    return episode("degraded-fix", parts, checkpoints, checkpoints ? sum / checkpoints : null, [...fixValues].sort());
  });
}

function episode(
  kind: Episode["kind"],
  parts: EpisodePart[],
  checkpoints: number,
  meanRadial: number | null,
  fixValues: string[],
): Episode {
  const starts = parts.map((p) => p.start).filter((t): t is number => t !== null);
  const ends = parts.map((p) => p.end).filter((t): t is number => t !== null);
  return {
    kind,
    start: starts.length ? Math.min(...starts) : null,
    end: ends.length ? Math.max(...ends) : null,
    parts,
    count: parts.reduce((s, p) => s + p.count, 0),
    checkpoints,
    meanRadial,
    fixValues,
    duringDegradedFix: false,
  };
}

/** Options of {@link errorJumps}. */
export interface JumpOptions {
  /** Multiplier of the scaled MAD above the median radial error (default 3). */
  k?: number;
  /** Floor of the threshold, metres (default 0.005: differences below survey noise are not jumps). */
  minThresholdM?: number;
  /** Consecutive checkpoints of one row needed (default 3). */
  minRun?: number;
  gapMs?: number;
}

/**
 * Jumps in error along the pass: per bed and row, runs of at least `minRun` consecutive checkpoints (planting order)
 * whose radial error exceeds median + k·1.4826·MAD of all radial errors (the Hampel identifier), merged across rows
 * whose times overlap. `degraded` episodes mark the jumps they explain. Ordered by start time. Inputs not modified.
 *
 * Source: Hampel, J. Amer. Statist. Assoc. 69 (1974) 383–393; Leys et al., J. Exp. Soc. Psychol. 49 (2013) 764–766
 * (median ± 3 scaled MAD; 1.4826 = 1/Φ⁻¹(0.75)).
 *
 * @example errorJumps(pairs, [])[0] // { kind: "error-jump", parts: [{ bed: "3", row: "2", count: 6, ... }], ... }
 */
export function errorJumps(
  pairs: readonly DiagnosticPair[],
  degraded: readonly Episode[],
  o: JumpOptions = {},
): Episode[] {
  const n = pairs.length;
  if (n < 4) return [];
  const k = o.k ?? 3;
  const radial = Float64Array.from(pairs, (p) => p.radial);
  const centre = median(radial);
  const threshold = Math.max(centre + k * 1.4826 * medianAbsoluteDeviation(radial, centre), o.minThresholdM ?? 0.005);
  const time = (i: number) => pairs[i].time ?? Number.NaN;
  const lanes = lanesInOrder(
    n,
    (i) => (pairs[i].time === null ? pairs[i].seq : pairs[i].time!),
    (i) => laneKey(pairs[i].bed, pairs[i].row, pairs[i].arm),
  );
  const runs = runsOf(
    lanes,
    (i) => pairs[i].radial > threshold,
    o.minRun ?? 3,
    time,
    (i) => ({
      bed: pairs[i].bed,
      row: pairs[i].row,
      arm: pairs[i].arm,
    }),
  );
  return mergeRuns(runs, o.gapMs ?? 60_000).map((group) => {
    let sum = 0;
    let count = 0;
    for (const r of group)
      for (const i of r.members) {
        sum += pairs[i].radial;
        count++;
      }
    const parts = group
      .map((r) => ({
        bed: r.bed,
        row: r.row,
        arm: r.arm,
        firstPlantId: pairs[r.members[0]].plantId,
        lastPlantId: pairs[r.members[r.members.length - 1]].plantId,
        count: r.members.length,
        start: r.start,
        end: r.end,
      }))
      .sort(byPlace);
    const e = episode("error-jump", parts, count, sum / count, []);
    e.duringDegradedFix = parts.every((p) =>
      degraded.some((d) =>
        d.parts.some(
          (q) =>
            q.bed === p.bed &&
            q.row === p.row &&
            p.start !== null &&
            q.start !== null &&
            p.start >= q.start &&
            p.end! <= q.end!,
        ),
      ),
    );
    return e;
  });
}

/** One checkpoint on the pass chart. */
export interface PassPoint {
  seq: number;
  /** Planting time, epoch ms; null when unknown. */
  time: number | null;
  bed: string | null;
  row: string | null;
  arm: string | null;
  along: number | null;
  cross: number | null;
  radial: number;
  degraded: boolean;
}

/**
 * The checkpoints in planting order (time, then pairing order; unknown times last), for the chart of errors along
 * the pass. Input not modified.
 *
 * @example passSeries(pairs)[0] // { seq: 0, time: 1776202800000, along: 0.001, cross: -0.0004, ... }
 */
export function passSeries(pairs: readonly DiagnosticPair[]): PassPoint[] {
  return [...pairs]
    .sort((a, b) => {
      if (a.time !== null && b.time !== null && a.time !== b.time) return a.time - b.time;
      if ((a.time === null) !== (b.time === null)) return a.time === null ? 1 : -1;
      return a.seq - b.seq;
    })
    .map((p) => ({
      seq: p.seq,
      time: p.time,
      bed: p.bed,
      row: p.row,
      arm: p.arm,
      along: p.along,
      cross: p.cross,
      radial: p.radial,
      degraded: fixClass(p.fix) === "degraded",
    }));
}
