/**
 * Demo survey made from a survey plan: the technician walks the planned points of a demo field, finds a few planted
 * plants dead and surveys a spare of the same bed instead, and checks the instrument on the field's control mark
 * before and after. Invented data, for the demo only; deterministic (seeded).
 *
 * Error model: survey point = true plant position (recomputed from the plant id and the field's layout, as in
 * generate.ts) + N(0, 1.5 mm) per axis, stated precision 2 mm; 5 % of planned checkpoints are missing (every third of
 * them not found, the others dead), written as rows of the file's status column with the point name and no position;
 * the mark is measured within about 1 mm of its known position.
 */
import { gaussian, mulberry32 } from "@/lib/random";
import type { DemoFieldSpec } from "./farm";

/** The demo field that gets a survey plan and a survey made from it (lib/demo/plan-seed.ts), and the plan's name. */
export const PLAN_DEMO_FIELD = "Willow Strip";
export const PLAN_DEMO_NAME = "Willow Strip check survey, May 2026";

/** The control mark the demo gives a field: 2 m before the first row's start, on the row line. */
export function demoControlMark(spec: DemoFieldSpec) {
  const th = (spec.bearingDeg * Math.PI) / 180;
  return {
    name: `${spec.idPrefix}-CM1`,
    e: Math.round((spec.originE - Math.sin(th) * 2) * 1000) / 1000,
    n: Math.round((spec.originN - Math.cos(th) * 2) * 1000) / 1000,
    h: 1.42,
    description: "Brass pin in a concrete block at the headland, 2 m before the first row",
    source: "Demo: farm's own RTK static occupation, 2026",
  };
}

/** True position of a demo plant from its id `${prefix}-${bed}-${row}-${k}` and the field's layout; null if not one. */
export function demoTruePosition(spec: DemoFieldSpec, plantId: string): [number, number] | null {
  const m = new RegExp(`^${spec.idPrefix}-(\\d+)-(\\d+)-(\\d+)$`).exec(plantId);
  if (!m) return null;
  const [bed, row, k] = [Number(m[1]), Number(m[2]), Number(m[3]) - 1];
  const th = (spec.bearingDeg * Math.PI) / 180;
  const along = [Math.sin(th), Math.cos(th)];
  const right = [Math.cos(th), -Math.sin(th)];
  const a = k * spec.plantSpacingM;
  const offset = (bed - 1) * spec.bedSpacingM + (row - 1) * spec.rowSpacingM;
  return [spec.originE + along[0] * a + right[0] * offset, spec.originN + along[1] * a + right[1] * offset];
}

export interface StakeoutPoint {
  name: string;
  plantId: string;
  bed: string | null;
  spare: boolean;
}

export interface PlanSurvey {
  csv: string;
  /** Planned checkpoints found dead or not found, recorded in the file's status column (no position). */
  missing: { name: string; status: "dead" | "not found" }[];
  surveyed: number;
  /** The control mark as measured before and after the survey. */
  before: { e: number; n: number; h: number };
  after: { e: number; n: number; h: number };
}

/**
 * Survey rows for a plan's points: each checkpoint measured (id = plant id) unless missing, then a status row (id =
 * point name, status dead or not found, no position) and the next unused spare of its bed measured instead.
 *
 * @example generatePlanSurvey(DEMO_FIELDS[1], stakeoutPoints, 7).csv.split("\n")[0] // "id,status,method,precision_m,easting,northing,observed_at"
 */
export function generatePlanSurvey(spec: DemoFieldSpec, points: readonly StakeoutPoint[], seed: number): PlanSurvey {
  const rand = mulberry32(seed);
  const g = gaussian(rand);
  const start = Date.parse(spec.startUtc) + 7 * 86_400_000;
  const rows = ["id,status,method,precision_m,easting,northing,observed_at"];
  const missing: PlanSurvey["missing"] = [];
  let measured = 0;
  const usedSpares = new Set<string>();
  const measure = (p: StakeoutPoint) => {
    const t = demoTruePosition(spec, p.plantId);
    if (!t) throw new Error(`demo: ${p.plantId} is not a plant of ${spec.name}`);
    const obs = new Date(start + (rows.length - 1) * 45_000).toISOString();
    measured++;
    rows.push(
      [
        p.plantId,
        "",
        "total-station",
        "0.002",
        (t[0] + g() * 0.0015).toFixed(4),
        (t[1] + g() * 0.0015).toFixed(4),
        obs,
      ].join(","),
    );
  };
  for (const p of points) {
    if (p.spare) continue;
    if (rand() < 0.05) {
      const status = missing.length % 3 === 2 ? "not found" : "dead";
      missing.push({ name: p.name, status });
      rows.push([p.name, status, "", "", "", "", ""].join(","));
      const spare = points.find((s) => s.spare && s.bed === p.bed && !usedSpares.has(s.name));
      if (spare) {
        usedSpares.add(spare.name);
        measure(spare);
      }
      continue;
    }
    measure(p);
  }
  const mark = demoControlMark(spec);
  const near = (s: number) => ({
    e: Number((mark.e + g() * s).toFixed(4)),
    n: Number((mark.n + g() * s).toFixed(4)),
    h: Number((mark.h + g() * s).toFixed(4)),
  });
  return { csv: `${rows.join("\n")}\n`, missing, surveyed: measured, before: near(0.0007), after: near(0.0007) };
}

/** Read a stakeout CSV (lib/plan/stakeout.ts columns) back into points; plain cells only, as the demo writes them. */
export function readStakeoutCsv(text: string): StakeoutPoint[] {
  const [header, ...lines] = text.split(/\r?\n/).filter((l) => l !== "");
  const cols = header.split(",");
  const at = (name: string) => cols.indexOf(name);
  return lines.map((l) => {
    const c = l.split(",");
    return {
      name: c[at("point")],
      plantId: c[at("plant_id")],
      bed: c[at("bed")] || null,
      spare: c[at("kind")] === "spare",
    };
  });
}
