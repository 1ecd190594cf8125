import "server-only";
import { and, eq, type SQL } from "drizzle-orm";
import type { DB } from "@/db/client";
import { decodePoints } from "@/db/points-blob";
import { audit, auditPlantedNotFound, dataset } from "@/db/schema";
import type { PointTable } from "@/geo/types";
import type { UnpairedRowDto } from "@/lib/api-types";
import { decodePlantedNotFound, plantedNotFoundRows, type PlantedNotFound } from "@/lib/review/planted-not-found";

/*
 * The planted records nobody surveyed ("planted-not-found", unpaired seq 0…count−1) of audits that store them
 * compactly (audit_planted_not_found, issue 16): rebuilt from that value and the planted dataset's points blob.
 * Audits without such a value keep every unpaired point as a row of audit_unpaired; every reader of unpaired
 * points asks here first and falls back to the rows.
 */

/** The planted records nobody surveyed of one audit, rebuilt. */
export interface PlantedNotFoundSet {
  /** Unpaired points with seq 0…count−1. */
  count: number;
  /** The rows with seq `from`…`to`−1, exactly as the rows of audit_unpaired would read. */
  rows(from?: number, to?: number): UnpairedRowDto[];
  /** Easting and northing of each (seq order; work CRS, metres). */
  e: Float64Array;
  n: Float64Array;
  /** The planted records as read, and the compact value (for readers that go column by column). */
  planted: PointTable;
  part: PlantedNotFound;
}

/** Rebuilt sets of the last audits read, keyed by audit id and computation time (a recomputation changes it). */
const CACHE_SIZE = 2;
const cache = new Map<string, PlantedNotFoundSet>();

async function findPart(
  db: DB,
  { auditId, orgId }: { auditId: string; orgId?: string },
): Promise<{ count: number; plantedDatasetId: string; orgId: string; computedAt: Date | null } | null> {
  const where: SQL[] = [eq(audit.id, auditId)];
  if (orgId) where.push(eq(audit.orgId, orgId));
  const [row] = await db
    .select({
      count: auditPlantedNotFound.count,
      plantedDatasetId: audit.plantedDatasetId,
      orgId: audit.orgId,
      computedAt: audit.computedAt,
    })
    .from(audit)
    .innerJoin(auditPlantedNotFound, eq(auditPlantedNotFound.auditId, audit.id))
    .where(and(...where));
  return row?.plantedDatasetId ? { ...row, plantedDatasetId: row.plantedDatasetId } : null;
}

/**
 * How many planted records nobody surveyed an audit stores compactly; null when it keeps them as rows (or is not
 * in `orgId`, when given). Reads no blob.
 */
export async function countPlantedNotFound(
  db: DB,
  { auditId, orgId }: { auditId: string; orgId?: string },
): Promise<number | null> {
  return (await findPart(db, { auditId, orgId }))?.count ?? null;
}

/**
 * The planted records nobody surveyed of an audit that stores them compactly, rebuilt; null when the audit keeps
 * them as rows (or is not in `orgId`, when given). `orgId` may be left out only by callers that have checked the
 * audit's organisation already.
 */
export async function loadPlantedNotFound(
  db: DB,
  { auditId, orgId }: { auditId: string; orgId?: string },
): Promise<PlantedNotFoundSet | null> {
  const found = await findPart(db, { auditId, orgId });
  if (!found) return null;
  const key = found.computedAt ? `${auditId}|${found.computedAt.toISOString()}` : null;
  const hit = key ? cache.get(key) : undefined;
  if (hit) {
    cache.delete(key!);
    cache.set(key!, hit);
    return hit;
  }
  const [stored] = await db
    .select({ bytes: auditPlantedNotFound.bytes })
    .from(auditPlantedNotFound)
    .where(eq(auditPlantedNotFound.auditId, auditId));
  const [ds] = await db
    .select({ points: dataset.points })
    .from(dataset)
    .where(and(eq(dataset.id, found.plantedDatasetId), eq(dataset.orgId, found.orgId)));
  if (!stored || !ds?.points) throw new Error(`audit ${auditId}: the planted records nobody surveyed cannot be read`);
  const part = decodePlantedNotFound(stored.bytes);
  const planted = decodePoints(ds.points);
  if (part.plants !== planted.length || part.indices.length !== found.count)
    throw new Error(
      `audit ${auditId}: the stored unpaired records (${part.indices.length} of ${part.plants}) do not fit the planted dataset (${planted.length} records)`,
    );
  const e = part.e ?? Float64Array.from(part.indices, (i) => planted.x[i]);
  const n = part.n ?? Float64Array.from(part.indices, (i) => planted.y[i]);
  const set: PlantedNotFoundSet = {
    count: part.indices.length,
    rows: (from = 0, to = part.indices.length) =>
      plantedNotFoundRows(part, planted, from, to).map((r) => ({ ...r, kind: "planted-not-found" as const })),
    e,
    n,
    planted,
    part,
  };
  if (key) {
    cache.set(key, set);
    while (cache.size > CACHE_SIZE) cache.delete(cache.keys().next().value!);
  }
  return set;
}

/** Forget the rebuilt sets (tests that change stored values underneath). */
export function clearPlantedNotFoundCache(): void {
  cache.clear();
}
