import "server-only";
import { residualCols } from "./audits";
import { and, asc, desc, eq, gt, inArray, isNotNull } from "drizzle-orm";
import type { DB } from "@/db/client";
import { audit, auditResidual, auditUnpaired, field } from "@/db/schema";
import type { ResidualRowDto, UnpairedRowDto } from "@/lib/api-types";
import type { DictName } from "@/lib/map/types";
import type { PairColumns, UnpairedColumns } from "@/lib/map/build";
import { loadPlantedNotFound, type PlantedNotFoundSet } from "./unpaired";

/*
 * Queries of the map. Every function takes the audit (or field) id together with the caller's organisation and
 * only reads rows of an audit of that organisation, even though the route has already checked it.
 *
 * The per-plant columns are read as one aggregate per column (bytea of big-endian float4 / int2, or text joined by
 * U+001F) instead of one JS object per row: with PGlite this is several times faster for a million rows.
 */

/** Audits whose results are stored (computed, and any later review state). */
const RESULT_STATES = ["computed", "submitted", "signed_off", "returned"];

const SEP = "\u001f";

/** Field settings and audit facts the map header needs; null when the audit is not in this organisation. */
export async function getMapContext(db: DB, { auditId, orgId }: { auditId: string; orgId: string }) {
  const [row] = await db
    .select({
      fieldId: field.id,
      fieldName: field.name,
      bedSpacingM: field.bedSpacingM,
      rowsPerBed: field.rowsPerBed,
      rowSpacingM: field.rowSpacingM,
      fieldRowBearingDeg: field.rowBearingDeg,
      boundary: field.boundary,
    })
    .from(audit)
    .innerJoin(field, and(eq(field.id, audit.fieldId), eq(field.orgId, audit.orgId)))
    .where(and(eq(audit.id, auditId), eq(audit.orgId, orgId)));
  return row ? { ...row, boundary: (row.boundary as GeoJSON.Polygon | null) ?? null } : null;
}

/** Bounding box (work CRS, metres) of the planted positions of the pairs and of the unpaired points. */
export async function getMapExtent(db: DB, { auditId, orgId }: { auditId: string; orgId: string }) {
  const res = await db.$client.query<{
    min_e: number | null;
    max_e: number | null;
    min_n: number | null;
    max_n: number | null;
  }>(
    `select min(e) min_e, max(e) max_e, min(n) min_n, max(n) max_n from (
       select planted_e e, planted_n n from audit_residual r where r.audit_id = $1
       union all select e, n from audit_unpaired u where u.audit_id = $1
     ) p where exists (select 1 from audit a where a.id = $1 and a.org_id = $2)`,
    [auditId, orgId],
  );
  const r = res.rows[0];
  const box = r && r.min_e !== null ? { minE: r.min_e, maxE: r.max_e!, minN: r.min_n!, maxN: r.max_n! } : null;
  const compact = await loadPlantedNotFound(db, { auditId, orgId });
  if (!compact || compact.count === 0) return box;
  // PostgreSQL orders NaN above every number: max is NaN if any is, min only if all are. The same here.
  const first = { minE: compact.e[0], maxE: compact.e[0], minN: compact.n[0], maxN: compact.n[0] };
  let { minE, maxE, minN, maxN } = box ?? first;
  for (let k = 0; k < compact.count; k++) {
    const e = compact.e[k],
      n = compact.n[k];
    minE = pgMin(minE, e);
    maxE = pgMax(maxE, e);
    minN = pgMin(minN, n);
    maxN = pgMax(maxN, n);
  }
  return { minE, maxE, minN, maxN };
}

/** min and max as PostgreSQL orders float8: NaN above every number. */
const pgMin = (a: number, b: number) => (a !== a ? b : b !== b ? a : Math.min(a, b));
const pgMax = (a: number, b: number) => (a !== a || b !== b ? NaN : Math.max(a, b));

function floatsBE(bytes: Uint8Array | null, count: number): Float32Array {
  const out = new Float32Array(count);
  if (!bytes || count === 0) return out;
  if (bytes.byteLength !== count * 4)
    throw new Error(`map query: expected ${count * 4} bytes of float4, got ${bytes.byteLength}`);
  const dv = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength);
  for (let i = 0; i < count; i++) out[i] = dv.getFloat32(4 * i, false);
  return out;
}

function lowBytesBE(bytes: Uint8Array | null, count: number): Uint8Array {
  const out = new Uint8Array(count);
  if (!bytes || count === 0) return out;
  if (bytes.byteLength !== count * 2)
    throw new Error(`map query: expected ${count * 2} bytes of int2, got ${bytes.byteLength}`);
  for (let i = 0; i < count; i++) out[i] = bytes[2 * i + 1];
  return out;
}

function texts(joined: string | null, count: number): string[] {
  if (count === 0) return [];
  const parts = (joined ?? "").split(SEP);
  if (parts.length !== count) throw new Error(`map query: expected ${count} text values, got ${parts.length}`);
  return parts;
}

const textAgg = (col: string, alias: string) =>
  `string_agg(replace(coalesce(${col}, ''), E'\\x1f', ' '), E'\\x1f' order by seq) "${alias}"`;
const f4Agg = (expr: string, alias: string) =>
  `string_agg(float4send((${expr})::real), ''::bytea order by seq) "${alias}"`;

/**
 * Every pair and unpaired point of an audit as columns, coordinates minus `origin` (subtracted in double precision
 * before rounding to float4). `textColumns` are the pair text columns to read (the map's DICT_NAMES, each a column of
 * audit_residual). Empty when the audit is not in this organisation.
 */
export async function loadMapColumns(
  db: DB,
  {
    auditId,
    orgId,
    origin,
    textColumns,
  }: { auditId: string; orgId: string; origin: [number, number]; textColumns: readonly DictName[] },
): Promise<{ pairs: PairColumns; unpaired: UnpairedColumns }> {
  const scope = `audit_id = $1 and exists (select 1 from audit a where a.id = $1 and a.org_id = $2)`;
  const flags = `int2send((
      (case when within is not null then 1 else 0 end) | (case when within then 2 else 0 end) | (case when outlier then 4 else 0 end)
    | (case when paired_by = 'position' then 8 else 0 end) | (case when beyond_max_distance then 16 else 0 end))::int2)`;
  const p = await db.$client.query<Record<string, unknown>>(
    `select count(*)::int n,
       ${f4Agg("planted_e - $3", "x")}, ${f4Agg("planted_n - $4", "y")}, ${f4Agg("de", "de")}, ${f4Agg("dn", "dn")},
       ${f4Agg("coalesce(along, 'NaN'::float8)", "along")}, ${f4Agg("coalesce(\"cross\", 'NaN'::float8)", "cross")},
       string_agg(${flags}, ''::bytea order by seq) flags,
       ${textAgg("plant_id", "plant_id")}, ${textColumns.map((c) => textAgg(`"${c}"`, `t_${c}`)).join(", ")},
       min(seq) min_seq, max(seq) max_seq
     from audit_residual where ${scope}`,
    [auditId, orgId, origin[0], origin[1]],
  );
  const u = await db.$client.query<Record<string, unknown>>(
    `select count(*)::int n, ${f4Agg("e - $3", "x")}, ${f4Agg("n - $4", "y")},
       ${textAgg("kind", "kind")}, ${textAgg("crop", "t_crop")}, ${textAgg("bed", "t_bed")}, ${textAgg('"row"', "t_row")},
       min(seq) min_seq, max(seq) max_seq
     from audit_unpaired where ${scope}`,
    [auditId, orgId, origin[0], origin[1]],
  );
  const pr = p.rows[0],
    ur = u.rows[0];
  const n = Number(pr.n),
    m = Number(ur.n);
  // Planted records nobody surveyed stored compactly are seq 0…lead−1, ahead of the rows.
  const compact = await loadPlantedNotFound(db, { auditId, orgId });
  const lead = compact?.count ?? 0;
  // Index i of the payload is seq i: the engine numbers rows 0…count−1.
  if (n && (pr.min_seq !== 0 || pr.max_seq !== n - 1)) throw new Error("map query: pair seq numbers are not 0…n−1");
  if (m && (ur.min_seq !== lead || ur.max_seq !== lead + m - 1))
    throw new Error("map query: unpaired seq numbers are not 0…m−1");
  const bytes = (v: unknown) => (v as Uint8Array | null) ?? null;
  const stored: UnpairedColumns = {
    count: m,
    x: floatsBE(bytes(ur.x), m),
    y: floatsBE(bytes(ur.y), m),
    kind: texts(ur.kind as string | null, m),
    text: {
      crop: texts(ur.t_crop as string | null, m),
      bed: texts(ur.t_bed as string | null, m),
      row: texts(ur.t_row as string | null, m),
    },
  };
  return {
    pairs: {
      count: n,
      x: floatsBE(bytes(pr.x), n),
      y: floatsBE(bytes(pr.y), n),
      dE: floatsBE(bytes(pr.de), n),
      dN: floatsBE(bytes(pr.dn), n),
      along: floatsBE(bytes(pr.along), n),
      cross: floatsBE(bytes(pr.cross), n),
      flags: lowBytesBE(bytes(pr.flags), n),
      plantId: texts(pr.plant_id as string | null, n),
      text: Object.fromEntries(textColumns.map((c) => [c, texts(pr[`t_${c}`] as string | null, n)])) as Record<
        DictName,
        string[]
      >,
    },
    unpaired: compact ? joinUnpaired(compactColumns(compact, origin), stored) : stored,
  };
}

/** Map text of a value as the SQL of `textAgg` gives it: "" for none, the separator replaced by a space. */
const mapText = (v: string | null) => (v ?? "").replaceAll(SEP, " ");

/** The compactly stored planted records nobody surveyed as map columns, as the SQL above would give their rows. */
function compactColumns(set: PlantedNotFoundSet, origin: [number, number]): UnpairedColumns {
  const { count, planted, part } = set;
  const x = new Float32Array(count),
    y = new Float32Array(count);
  // float4 of the difference in double precision, as (e - origin)::real
  for (let k = 0; k < count; k++) {
    x[k] = set.e[k] - origin[0];
    y[k] = set.n[k] - origin[1];
  }
  const text = (name: "crop" | "bed" | "row") => {
    const col = planted.attrs[name];
    const out = new Array<string>(count);
    for (let k = 0; k < count; k++) {
      const c = col ? col.codes[part.indices[k]] : -1;
      out[k] = mapText(c >= 0 ? col!.values[c] : null);
    }
    return out;
  };
  return {
    count,
    x,
    y,
    kind: new Array<string>(count).fill("planted-not-found"),
    text: { crop: text("crop"), bed: text("bed"), row: text("row") },
  };
}

function joinUnpaired(a: UnpairedColumns, b: UnpairedColumns): UnpairedColumns {
  const cat = (p: Float32Array, q: Float32Array) => {
    const out = new Float32Array(p.length + q.length);
    out.set(p);
    out.set(q, p.length);
    return out;
  };
  return {
    count: a.count + b.count,
    x: cat(a.x, b.x),
    y: cat(a.y, b.y),
    kind: [...a.kind, ...b.kind],
    text: {
      crop: [...a.text.crop, ...b.text.crop],
      bed: [...a.text.bed, ...b.text.bed],
      row: [...a.text.row, ...b.text.row],
    },
  };
}

const auditInOrg = (auditId: string, orgId: string) => and(eq(audit.id, auditId), eq(audit.orgId, orgId));

/** One pair with everything stored for it (the side panel); null when absent or not in this organisation. */
export async function getMapPair(
  db: DB,
  { auditId, orgId, seq }: { auditId: string; orgId: string; seq: number },
): Promise<ResidualRowDto | null> {
  const [row] = await db
    .select(residualCols)
    .from(auditResidual)
    .innerJoin(audit, eq(audit.id, auditResidual.auditId))
    .where(and(auditInOrg(auditId, orgId), eq(auditResidual.auditId, auditId), eq(auditResidual.seq, seq)));
  return row ? { ...row, pairedBy: row.pairedBy as ResidualRowDto["pairedBy"] } : null;
}

/** One unpaired point; null when absent or not in this organisation. */
export async function getMapUnpaired(
  db: DB,
  { auditId, orgId, seq }: { auditId: string; orgId: string; seq: number },
): Promise<UnpairedRowDto | null> {
  const compact = await loadPlantedNotFound(db, { auditId, orgId });
  if (compact && seq < compact.count) return seq >= 0 ? compact.rows(seq, seq + 1)[0] : null;
  const [row] = await db
    .select({
      seq: auditUnpaired.seq,
      kind: auditUnpaired.kind,
      pointId: auditUnpaired.pointId,
      line: auditUnpaired.line,
      e: auditUnpaired.e,
      n: auditUnpaired.n,
      crop: auditUnpaired.crop,
      bed: auditUnpaired.bed,
      row: auditUnpaired.row,
    })
    .from(auditUnpaired)
    .innerJoin(audit, eq(audit.id, auditUnpaired.auditId))
    .where(and(auditInOrg(auditId, orgId), eq(auditUnpaired.auditId, auditId), eq(auditUnpaired.seq, seq)));
  return row ? { ...row, kind: row.kind as UnpairedRowDto["kind"] } : null;
}

/** The most recently computed audit of a field that has stored results; null when there is none. */
export async function getLatestMappedAudit(
  db: DB,
  { fieldId, orgId }: { fieldId: string; orgId: string },
): Promise<{ id: string } | null> {
  const [row] = await db
    .select({ id: audit.id })
    .from(audit)
    .where(
      and(
        eq(audit.fieldId, fieldId),
        eq(audit.orgId, orgId),
        inArray(audit.state, RESULT_STATES),
        isNotNull(audit.computedAt),
      ),
    )
    .orderBy(desc(audit.computedAt), asc(audit.id))
    .limit(1);
  return row ?? null;
}

/**
 * The latest signed-off audit of a field with stored results (most recently computed); null when none is signed.
 * What the grower is told derives from this audit only.
 */
export async function getLatestSignedAudit(
  db: DB,
  { fieldId, orgId }: { fieldId: string; orgId: string },
): Promise<{ id: string; computedAt: Date } | null> {
  const [row] = await db
    .select({ id: audit.id, computedAt: audit.computedAt })
    .from(audit)
    .where(
      and(
        eq(audit.fieldId, fieldId),
        eq(audit.orgId, orgId),
        eq(audit.state, "signed_off"),
        isNotNull(audit.computedAt),
      ),
    )
    .orderBy(desc(audit.computedAt), asc(audit.id))
    .limit(1);
  return row?.computedAt ? { id: row.id, computedAt: row.computedAt } : null;
}

/** States of an audit with results that is waiting for sign-off. */
const PENDING_STATES = ["computed", "submitted"];

/**
 * The newest audit of a field with results that is not yet signed off (computed or submitted) and was computed after
 * `after` (any time when null); null when there is none.
 */
export async function getNewestPendingAudit(
  db: DB,
  { fieldId, orgId, after }: { fieldId: string; orgId: string; after: Date | null },
): Promise<{ id: string; title: string; state: string } | null> {
  const [row] = await db
    .select({ id: audit.id, title: audit.title, state: audit.state })
    .from(audit)
    .where(
      and(
        eq(audit.fieldId, fieldId),
        eq(audit.orgId, orgId),
        inArray(audit.state, PENDING_STATES),
        isNotNull(audit.computedAt),
        after ? gt(audit.computedAt, after) : undefined,
      ),
    )
    .orderBy(desc(audit.computedAt), asc(audit.id))
    .limit(1);
  return row ?? null;
}

/** Per-pair columns of the per-bed summary: bed label, radial, cross, along (NaN unknown), within (1, 0, −1 unknown). */
export async function loadBedColumns(db: DB, { auditId, orgId }: { auditId: string; orgId: string }) {
  const res = await db.$client.query<{
    n: number;
    bed: string | null;
    radial: Uint8Array | null;
    cross: Uint8Array | null;
    along: Uint8Array | null;
    within: string | null;
  }>(
    `select count(*)::int n, ${textAgg("bed", "bed")}, ${f4Agg("radial", "radial")},
       ${f4Agg("coalesce(\"cross\", 'NaN'::float8)", "cross")}, ${f4Agg("coalesce(along, 'NaN'::float8)", "along")},
       string_agg(case when within is null then 'u' when within then 'w' else 'o' end, '' order by seq) "within"
     from audit_residual where audit_id = $1 and exists (select 1 from audit a where a.id = $1 and a.org_id = $2)`,
    [auditId, orgId],
  );
  const r = res.rows[0];
  const n = Number(r.n);
  const w = r.within ?? "";
  return {
    bed: texts(r.bed, n),
    radial: floatsBE(r.radial, n),
    cross: floatsBE(r.cross, n),
    along: floatsBE(r.along, n),
    within: Int8Array.from({ length: n }, (_, i) => (w[i] === "w" ? 1 : w[i] === "o" ? 0 : -1)),
  };
}

/**
 * Per-pair columns the trust by cause needs: the planted plant id and the strata texts ("" when missing), the errors
 * (metres, NaN unknown; float4 like the map) and within (1, 0, −1 unknown). Empty when the audit is not in this
 * organisation.
 */
export async function loadTrustColumns(db: DB, { auditId, orgId }: { auditId: string; orgId: string }) {
  const res = await db.$client.query<Record<string, string | Uint8Array | number | null>>(
    `select count(*)::int n, ${textAgg("plant_id", "plant_id")}, ${textAgg("fix", "fix")}, ${textAgg("arm", "arm")},
       ${textAgg("day", "day")}, ${textAgg("bed", "bed")}, ${textAgg("row", "row")}, ${f4Agg("radial", "radial")},
       ${f4Agg("coalesce(\"cross\", 'NaN'::float8)", "cross")}, ${f4Agg("coalesce(along, 'NaN'::float8)", "along")},
       string_agg(case when within is null then 'u' when within then 'w' else 'o' end, '' order by seq) "within"
     from audit_residual where audit_id = $1 and exists (select 1 from audit a where a.id = $1 and a.org_id = $2)`,
    [auditId, orgId],
  );
  const r = res.rows[0];
  const n = Number(r.n);
  const text = (k: string) => texts(r[k] as string | null, n);
  const w = (r.within as string | null) ?? "";
  return {
    count: n,
    plantId: text("plant_id"),
    fix: text("fix"),
    arm: text("arm"),
    day: text("day"),
    bed: text("bed"),
    row: text("row"),
    radial: floatsBE(r.radial as Uint8Array | null, n),
    cross: floatsBE(r.cross as Uint8Array | null, n),
    along: floatsBE(r.along as Uint8Array | null, n),
    within: Int8Array.from({ length: n }, (_, i) => (w[i] === "w" ? 1 : w[i] === "o" ? 0 : -1)),
  };
}
