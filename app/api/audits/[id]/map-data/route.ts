/**
 * GET /api/audits/:id/map-data — the map of an audit.
 *
 * Without parameters: every pair and unpaired point as one binary payload (`application/octet-stream`), laid out as
 * documented in lib/map/binary.ts: "PPMD", u32 header length, JSON header (work CRS, local origin, boundary, field
 * geometry, profile, dictionaries, array table), then 8-byte-aligned typed arrays — Float32 x/y relative to the
 * origin, Float32 dE/dN/along/cross, Uint8 flags and kinds, Uint16 dictionary codes, and the pairs' plant ids as
 * UTF-8. An ETag allows 304 answers. The body is not compressed here (Next.js passes route handler bodies through
 * uncompressed and drops a Content-Encoding set by the handler); a reverse proxy that gzips application/octet-stream
 * halves it (see lib/map/bench-map.ts).
 *
 * `?pair=<seq>` answers `{ pair }` (ResidualRowDto) and `?unpaired=<seq>` answers `{ unpaired }` (UnpairedRowDto):
 * the full record of one point for the map's side panel.
 *
 * 401 without a session, 404 for an audit of another organisation, 409 while the audit has no results.
 */
import { createHash } from "node:crypto";
import { z } from "zod";
import { guardedRoute } from "@/lib/server/access";
import { getDb } from "@/db/client";
import { getMapContext, getMapExtent, getMapPair, getMapUnpaired, loadMapColumns } from "@/db/queries/map";
import { AppError, notFound } from "@/lib/errors";
import { ANY_ROLE } from "@/lib/roles";
import { auditForViewer } from "@/lib/server/audits/audit-access";
import { buildMapArrays } from "@/lib/map/build";
import { encodeMapPayload, MAP_CONTENT_TYPE } from "@/lib/map/binary";
import { mapMeta, originFor, projectBoundary } from "@/lib/map/payload";
import { readQuery } from "@/lib/validation/request";
import { DICT_NAMES } from "@/lib/map/types";

const Query = z
  .object({
    pair: z.coerce.number().int().min(0).optional(),
    unpaired: z.coerce.number().int().min(0).optional(),
  })
  .refine((q) => q.pair === undefined || q.unpaired === undefined, {
    message: "Ask for a pair or an unpaired point, not both.",
  });

const RESULT_STATES = new Set(["computed", "submitted", "signed_off", "returned"]);

/** Encoded payloads by content key; an audit's results never change once computed, so only memory limits the cache. */
const g = globalThis as unknown as { __plotproofMapCache?: Map<string, Uint8Array> };
const cache = (g.__plotproofMapCache ??= new Map());
const CACHE_BYTES = 256 * 1024 * 1024;

/** Keep `bytes` under `key`, most recently used last; drop the least recently used above the byte budget. */
function remember(key: string, bytes: Uint8Array) {
  cache.delete(key);
  cache.set(key, bytes);
  let total = 0;
  for (const e of cache.values()) total += e.byteLength;
  for (const [k, e] of cache) {
    if (total <= CACHE_BYTES || k === key) break;
    cache.delete(k);
    total -= e.byteLength;
  }
}

export const GET = guardedRoute<{ id: string }>(ANY_ROLE, async ({ req, viewer, params }) => {
  const audit = await auditForViewer(viewer, params);
  const q = readQuery(req, Query);
  if (!RESULT_STATES.has(audit.state)) {
    throw new AppError(
      "conflict",
      audit.state === "failed"
        ? "The audit could not be computed, so there is nothing to map."
        : "The audit is still computing; try again when it has finished.",
    );
  }
  const db = await getDb();
  const orgId = viewer.orgId;
  if (q.pair !== undefined) {
    const pair = await getMapPair(db, { auditId: audit.id, orgId, seq: q.pair });
    if (!pair) throw notFound("Pair");
    return Response.json({ pair });
  }
  if (q.unpaired !== undefined) {
    const unpaired = await getMapUnpaired(db, { auditId: audit.id, orgId, seq: q.unpaired });
    if (!unpaired) throw notFound("Unpaired point");
    return Response.json({ unpaired });
  }

  const context = await getMapContext(db, { auditId: audit.id, orgId });
  if (!context) throw notFound("Audit");
  // Everything the payload depends on; field settings may change after the audit was computed.
  const key = createHash("sha256")
    .update(JSON.stringify([audit.id, audit.computedAt, audit.state, audit.title, audit.settings, context]))
    .digest("base64url")
    .slice(0, 27);
  const etag = `"map-${key}"`;
  const headers = { "content-type": MAP_CONTENT_TYPE, "cache-control": "private, no-cache", etag };
  if (req.headers.get("if-none-match") === etag) return new Response(null, { status: 304, headers });

  let body = cache.get(key);
  if (!body) {
    const workCrs = audit.settings?.workCrs ?? audit.field.crs;
    const boundaryEN = projectBoundary(context.boundary, workCrs);
    const origin = originFor(await getMapExtent(db, { auditId: audit.id, orgId }), boundaryEN);
    const columns = await loadMapColumns(db, { auditId: audit.id, orgId, origin, textColumns: DICT_NAMES });
    const { arrays, dict } = buildMapArrays(columns.pairs, columns.unpaired);
    body = encodeMapPayload(mapMeta({ audit, field: context, origin, boundaryEN, arrays, dict }), arrays);
  }
  remember(key, body);
  return new Response(body as Uint8Array<ArrayBuffer>, { headers });
});
