import "server-only";
import { getDb } from "@/db/client";
import { getFieldById } from "@/db/queries/fields";
import { getMachineById } from "@/db/queries/machines";
import { listFieldSeason, listMachineSeason, type SeasonAuditRow } from "@/db/queries/diagnostics";
import { notFound } from "@/lib/errors";
import type { Viewer } from "@/lib/server/access";
import { diagnosticsOf } from "@/lib/server/audits/diagnostics";
import { routeId } from "@/lib/validation/request";
import type { FieldSeason, MachineSeason, SeasonPoint } from "@/lib/season-types";

export type { FieldSeason, MachineSeason, SeasonPoint } from "@/lib/season-types";

/** Each audit's headline and per-arm figures from its diagnostics, in planting order. */
async function seasonPoints(orgId: string, rows: SeasonAuditRow[]): Promise<SeasonPoint[]> {
  const points: SeasonPoint[] = [];
  for (const r of rows) {
    const d = await diagnosticsOf(orgId, {
      id: r.id,
      plantedDatasetId: r.plantedDatasetId,
      crs: r.summary.crs,
      confidence: r.summary.confidence,
    });
    const days = (r.summary.groups?.day ?? []).map((g) => g.key).filter((k): k is string => !!k);
    days.sort();
    points.push({
      auditId: r.id,
      title: r.title,
      fieldName: r.fieldName,
      state: r.state,
      signed: r.state === "signed_off",
      passed: r.passed,
      day: days[0] ?? (r.computedAt ?? r.createdAt).toISOString().slice(0, 10),
      rmseR: d.headline.rmseR,
      arms: d.arms.map((a) => ({
        arm: a.arm,
        cross: a.cross.mean,
        along: a.along.mean,
        significant: a.suggestion.cross !== null || a.suggestion.along !== null,
      })),
    });
  }
  points.sort((a, b) => (a.day < b.day ? -1 : a.day > b.day ? 1 : 0));
  return points;
}

/** The season of one field: its audits with results in planting order, each with its diagnostics' per-arm figures. */
export async function fieldSeason(viewer: Viewer, params: { fieldId: string }): Promise<FieldSeason> {
  const fieldId = routeId(params, "fieldId", "Field");
  const db = await getDb();
  const field = await getFieldById(db, { id: fieldId, orgId: viewer.orgId });
  if (!field) throw notFound("Field");
  const rows = await listFieldSeason(db, { orgId: viewer.orgId, fieldId });
  return {
    field: { id: field.id, name: field.name, timeZone: field.timeZone },
    points: await seasonPoints(viewer.orgId, rows),
  };
}

/** The season of one machine: the audits of its as-planted uploads on any field, in planting order. */
export async function machineSeason(viewer: Viewer, params: { id: string }): Promise<MachineSeason> {
  const id = routeId(params, "id", "Machine");
  const db = await getDb();
  const machine = await getMachineById(db, { id, orgId: viewer.orgId });
  if (!machine) throw notFound("Machine");
  const rows = await listMachineSeason(db, { orgId: viewer.orgId, machineId: id });
  return {
    machine: { id: machine.id, name: machine.name, toolArms: machine.toolArms },
    points: await seasonPoints(viewer.orgId, rows),
  };
}
