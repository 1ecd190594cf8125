/**
 * Coverage of a survey made from a plan: which planned points were surveyed, which are missing (reported dead or not
 * found, or simply absent), which survey points the plan did not ask for, and whether every stratum still has its
 * minimum. Also the three kinds of unpaired points an audit of such a survey tells apart. Pure; our own rules.
 */

export interface PlanPointRef {
  name: string;
  plantId: string;
  stratum: string;
  spare: boolean;
}

export const MISSING_STATUSES = ["dead", "not found"] as const;
export type MissingStatus = (typeof MISSING_STATUSES)[number];

export interface MissingPoint {
  name: string;
  plantId: string;
  stratum: string;
  /** Reported by the surveyor, or "absent" when the survey neither holds nor reports it. */
  status: MissingStatus | "absent";
  /** The survey file's line that recorded it (its status column), when the file did rather than the upload form. */
  line?: number;
}

export interface StratumCoverage {
  key: string;
  minimum: number;
  /** Checkpoints and spares of the stratum that were surveyed. */
  surveyed: number;
  meets: boolean;
}

export interface Coverage {
  planned: number;
  /** Planned checkpoints (not spares) surveyed. */
  checkpointsSurveyed: number;
  /** Spares surveyed (in place of missing checkpoints). */
  sparesSurveyed: number;
  /** Planned checkpoints not surveyed. */
  missing: MissingPoint[];
  /** Survey point ids the plan did not ask for (first 50), and how many there are, unnamed points included. */
  extra: { count: number; unnamed: number; ids: string[] };
  strata: StratumCoverage[];
  /** Every stratum has at least its minimum. */
  allStrataMeet: boolean;
}

/**
 * Coverage of a survey against its plan. A survey point counts for a plan point when its id is the plan point's name
 * or its plant id. `reported` are the points recorded dead or not found, by the file's status column (with its `line`)
 * or the upload form; a later report of the same point wins. Throws (with the numbers) when named survey points exist but none matches the plan.
 *
 * @example surveyCoverage(points, [{ key: "bed 1", minimum: 3 }], ["C0001-B1", "LA-1-2-0017", ""], [])
 */
export function surveyCoverage(
  points: readonly PlanPointRef[],
  strata: readonly { key: string; minimum: number }[],
  surveyIds: readonly (string | null)[],
  reported: readonly { name: string; status: MissingStatus; line?: number }[],
): Coverage {
  const byKey = new Map<string, PlanPointRef>();
  for (const p of points) {
    byKey.set(p.name, p);
    byKey.set(p.plantId, p);
  }
  const surveyed = new Set<string>();
  const extraIds: string[] = [];
  let extra = 0;
  let unnamed = 0;
  let named = 0;
  for (const raw of surveyIds) {
    const id = raw?.trim() ?? "";
    if (!id) {
      unnamed++;
      extra++;
      continue;
    }
    named++;
    const p = byKey.get(id);
    if (p) surveyed.add(p.name);
    else {
      extra++;
      if (extraIds.length < 50) extraIds.push(id);
    }
  }
  if (named > 0 && surveyed.size === 0) {
    const examples = points
      .slice(0, 2)
      .map((p) => `${p.name} / ${p.plantId}`)
      .join(", ");
    throw new Error(
      `coverage: none of the ${named} named survey points matches a point of the plan (${points.length} points, e.g. ${examples}); the survey's id column should hold the plan's point names or plant ids. Was the right plan chosen?`,
    );
  }
  const report = new Map(reported.map((r) => [r.name, r]));
  const missing: MissingPoint[] = points
    .filter((p) => !p.spare && !surveyed.has(p.name))
    .map((p) => {
      const r = report.get(p.name) ?? report.get(p.plantId);
      const out: MissingPoint = { name: p.name, plantId: p.plantId, stratum: p.stratum, status: r?.status ?? "absent" };
      if (r?.line !== undefined) out.line = r.line;
      return out;
    });
  const strataOut: StratumCoverage[] = strata.map((s) => {
    const count = points.filter((p) => p.stratum === s.key && surveyed.has(p.name)).length;
    return { key: s.key, minimum: s.minimum, surveyed: count, meets: count >= s.minimum };
  });
  return {
    planned: points.filter((p) => !p.spare).length,
    checkpointsSurveyed: points.filter((p) => !p.spare && surveyed.has(p.name)).length,
    sparesSurveyed: points.filter((p) => p.spare && surveyed.has(p.name)).length,
    missing,
    extra: { count: extra, unnamed, ids: extraIds },
    strata: strataOut,
    allStrataMeet: strataOut.every((s) => s.meets),
  };
}

/** The unpaired points of an audit of a planned survey, in three kinds (and the engine's ambiguous ones). */
export const UNPAIRED_SPLIT = ["not-sampled", "sampled-not-found", "surveyed-no-record", "ambiguous"] as const;
export type UnpairedSplit = (typeof UNPAIRED_SPLIT)[number];

export const UNPAIRED_SPLIT_TITLE: Record<UnpairedSplit, string> = {
  "not-sampled": "Not sampled",
  "sampled-not-found": "Sampled, not found",
  "surveyed-no-record": "Surveyed, no record",
  ambiguous: "Ambiguous",
};

/**
 * Which of the split kinds an unpaired point is: an as-planted record the plan did not choose is "not sampled"; one it
 * chose is "sampled but not found"; a survey point with no record is "surveyed but no record".
 *
 * @example unpairedSplit("planted-not-found", false) // "not-sampled"
 */
export function unpairedSplit(
  kind: "planted-not-found" | "surveyed-not-planted" | "ambiguous",
  inPlan: boolean,
): UnpairedSplit {
  if (kind === "planted-not-found") return inPlan ? "sampled-not-found" : "not-sampled";
  return kind === "surveyed-not-planted" ? "surveyed-no-record" : "ambiguous";
}
