import "server-only";
import { type DB, getDb } from "@/db/client";
import { logActivity } from "@/db/queries/activity";
import { loadDatasetPoints } from "@/db/queries/datasets";
import { loadTrustColumns } from "@/db/queries/map";
import { getProfileById } from "@/db/queries/profiles";
import { getSignoff } from "@/db/queries/review";
import { convertArrays, resolveCrs, type PointTable } from "@/geo";
import { RECORD_CLASS, RECORD_REASON, recordTrust, type RecordTrust } from "@/lib/audit/record-trust";
import { recordTrustInput, stratumLabel } from "@/lib/audit/record-trust-input";
import type { AuditDto } from "@/lib/api-types";
import { AppError } from "@/lib/errors";
import { STATE_NAME } from "@/lib/review/lifecycle";
import {
  type ExclusionContext,
  type ExclusionRecord,
  exclusionCsv,
  exclusionGeoJson,
  rowStretches,
} from "@/lib/map/exclusions";
import { contentDisposition, fileSlug } from "@/lib/http";
import { auditFileName } from "@/lib/server/audits/report-download";
import type { RecordTrustQuery } from "@/lib/validation/audit";
import { recordTrustDto, type RecordTrustDto } from "@/lib/map/record-guidance";

/** A computed record trust and what it was computed from. */
export interface AuditRecordTrust {
  dto: RecordTrustDto;
  trust: RecordTrust;
  table: PointTable;
  /** CRS of the table's coordinates (the as-planted file's). */
  tableCrs: string;
}

// Results of an audit never change once computed (a recomputation gives a new computedAt), so a few are kept.
const cache = new Map<string, AuditRecordTrust>();
const CACHE_SIZE = 4;

function cacheKey(audit: AuditDto, orgId: string, profileId: string | null): string {
  return `${orgId}:${audit.id}:${audit.computedAt}:${profileId ?? "own"}`;
}

/**
 * The trust by cause of every as-planted record of an audit (lib/audit/record-trust.ts), for the audit's own profile
 * or, with `profileId`, another tolerance profile of the organisation (its limits applied to the stored errors).
 */
export async function auditRecordTrust(
  db: DB,
  { audit, orgId, profileId = null }: { audit: AuditDto; orgId: string; profileId?: string | null },
): Promise<AuditRecordTrust> {
  if (!audit.summary || !audit.planted || !audit.settings)
    throw new AppError(
      "conflict",
      audit.state === "failed" ? `This audit failed: ${audit.error}` : "This audit has no results yet.",
    );
  const key = cacheKey(audit, orgId, profileId);
  const hit = cache.get(key);
  if (hit) return hit;

  const other = profileId ? await getProfileById(db, { id: profileId, orgId }) : null;
  if (profileId && !other) throw new AppError("not_found", "Tolerance profile not found.");
  const profile = other ?? audit.profile;
  if (!profile)
    throw new AppError("conflict", "This audit was computed without a tolerance profile; choose one to judge it by.");
  const points = await loadDatasetPoints(db, { id: audit.planted.id, orgId });
  if (!points) throw new AppError("conflict", "The as-planted records of this audit are no longer readable.");
  const pairs = await loadTrustColumns(db, { auditId: audit.id, orgId });
  const input = recordTrustInput({
    table: points.table,
    pairs,
    timeZone: audit.settings.timeZone,
    profile,
    rejudge: other !== null,
  });
  const trust = recordTrust(input);
  const dto = recordTrustDto(trust, {
    audit: { id: audit.id, title: audit.title, revision: audit.revision, state: STATE_NAME[audit.state] },
    profile: { id: other?.id ?? null, name: profile.name, own: other === null },
  });
  const result = { dto, trust, table: points.table, tableCrs: points.dto.crs };
  cache.set(key, result);
  if (cache.size > CACHE_SIZE) cache.delete(cache.keys().next().value!);
  return result;
}

/** Positions of the records not relied on or not yet shown, in `crs`, with their class (1 or 2). */
export function recordMarks(r: AuditRecordTrust, crs: string): { x: number[]; y: number[]; cls: number[] } {
  const idx: number[] = [];
  for (let i = 0; i < r.trust.recordClass.length; i++) if (r.trust.recordClass[i] !== RECORD_CLASS.RELY) idx.push(i);
  const [x, y] = convertArrays(
    Float64Array.from(idx, (i) => r.table.x[i]),
    Float64Array.from(idx, (i) => r.table.y[i]),
    r.tableCrs,
    crs,
  );
  return { x: Array.from(x), y: Array.from(y), cls: idx.map((i) => r.trust.recordClass[i]) };
}

function text(t: PointTable, name: "crop" | "bed" | "row" | "arm" | "fix", i: number): string {
  const c = t.attrs[name];
  return c && c.codes[i] >= 0 ? c.values[c.codes[i]] : "";
}

/** The records of the exclusion list (not relied on; with `notShown` also not yet shown) and the file's context. */
export async function exclusionList(
  db: DB,
  r: AuditRecordTrust,
  { audit, orgId, notShown }: { audit: AuditDto; orgId: string; notShown: boolean },
): Promise<{ ctx: ExclusionContext; records: ExclusionRecord[] }> {
  const { table, trust } = r;
  const take = (c: number) => c === RECORD_CLASS.DO_NOT_RELY || (notShown && c === RECORD_CLASS.NOT_SHOWN);
  const idx: number[] = [];
  for (let i = 0; i < table.length; i++) if (take(trust.recordClass[i])) idx.push(i);
  const crs = audit.field.crs;
  const [x, y] = convertArrays(
    Float64Array.from(idx, (i) => table.x[i]),
    Float64Array.from(idx, (i) => table.y[i]),
    r.tableCrs,
    crs,
  );
  const reasonOf = (i: number): string => {
    const m = trust.recordReason[i];
    if (m >= 0) {
      const j = trust.named[m];
      return `${stratumLabel(j.dimension, j.key)}: ${j.trust.outside} of ${j.trust.n} checkpoints out of tolerance`;
    }
    if (m === RECORD_REASON.OWN_CHECKPOINT) return "its own checkpoint is out of tolerance";
    if (m === RECORD_REASON.UNTESTED) return "no checkpoint shares its fix quality, tool arm or planting day";
    return r.dto.remainder?.word === "does not meet"
      ? "the remaining checkpoints do not meet the tolerance"
      : "too few checkpoints to show the tolerance is met";
  };
  const records: ExclusionRecord[] = idx.map((i, k) => ({
    plantId: table.id?.get(i) ?? "",
    crop: text(table, "crop", i),
    bed: text(table, "bed", i),
    row: text(table, "row", i),
    arm: text(table, "arm", i),
    fix: text(table, "fix", i),
    plantedUtc: table.time && Number.isFinite(table.time[i]) ? new Date(table.time[i]).toISOString() : "",
    x: x[k],
    y: y[k],
    judgement: trust.recordClass[i] === RECORD_CLASS.DO_NOT_RELY ? "do not rely" : "not yet shown",
    reason: reasonOf(i),
  }));
  // Row stretches of the records not relied on, by bed and row in file order.
  const keys: { bed: string; row: string }[] = [];
  const keyIndex = new Map<string, number>();
  const bedRow = new Int32Array(table.length);
  for (let i = 0; i < table.length; i++) {
    const bed = text(table, "bed", i);
    if (bed === "") {
      bedRow[i] = -1;
      continue;
    }
    const row = text(table, "row", i);
    const k = `${bed}\u001f${row}`;
    let code = keyIndex.get(k);
    if (code === undefined) {
      code = keys.length;
      keys.push({ bed, row });
      keyIndex.set(k, code);
    }
    bedRow[i] = code;
  }
  const excluded = Uint8Array.from(trust.recordClass, (c) => (take(c) ? 1 : 0));
  const stretches = rowStretches({
    bedRow,
    keys,
    excluded,
    plantId: (i) => table.id?.get(i) ?? `line ${table.line[i]}`,
  });
  const signoff = audit.state === "signed_off" ? await getSignoff(db, { auditId: audit.id, orgId }) : null;
  const geographic = resolveCrs(crs).kind === "geographic";
  return {
    ctx: {
      fieldName: audit.field.name,
      crs,
      geographic,
      audit: r.dto.audit,
      profileName: r.dto.profile.name,
      signoffHash: signoff?.sha256 ?? null,
      rule: r.dto.rule,
      stretches,
    },
    records,
  };
}

/** Everything a route of the trust by cause answers with, after the access check. */
export async function recordTrustResponse(
  viewer: { orgId: string; userId: string },
  audit: AuditDto,
  query: RecordTrustQuery,
  format: "json" | "csv" | "geojson",
): Promise<Response> {
  const db = await getDb();
  const r = await auditRecordTrust(db, { audit, orgId: viewer.orgId, profileId: query.profile ?? null });
  if (format === "json") {
    const marks = query.marks ? { crs: audit.settings!.workCrs, ...recordMarks(r, audit.settings!.workCrs) } : null;
    return Response.json({ ...r.dto, marks });
  }
  const { ctx, records } = await exclusionList(db, r, { audit, orgId: viewer.orgId, notShown: !!query.include });
  await logActivity(db, {
    orgId: viewer.orgId,
    actorId: viewer.userId,
    action: "report.downloaded",
    subjectType: "audit",
    subjectId: audit.id,
    detail: { kind: `exclusions.${format}`, profile: r.dto.profile.name, records: String(records.length) },
  });
  const name = auditFileName(audit, `do-not-rely_${fileSlug(r.dto.profile.name)}`, format);
  const body =
    format === "csv" ? `\uFEFF${exclusionCsv(ctx, records)}` : JSON.stringify(exclusionGeoJson(ctx, records));
  return new Response(body, {
    headers: {
      "content-type": format === "csv" ? "text/csv; charset=utf-8" : "application/geo+json; charset=utf-8",
      "content-disposition": contentDisposition(name),
      "cache-control": "no-store",
    },
  });
}
