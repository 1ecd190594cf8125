import { z } from "zod";
import { guardedRoute } from "@/lib/server/access";
import { findCrs, listCrs } from "@/geo";
import { ANY_ROLE } from "@/lib/roles";
import type { CrsDto } from "@/lib/api-types";
import { readQuery } from "@/lib/validation/request";

const Query = z.object({
  q: z.string().trim().max(80).default(""),
  lon: z.coerce.number().min(-180).max(180).optional(),
  lat: z.coerce.number().min(-90).max(90).optional(),
});

/** Search the bundled coordinate reference systems by code or name. */
export const GET = guardedRoute(ANY_ROLE, async ({ req }) => {
  const q = readQuery(req, Query);
  const near = q.lon !== undefined && q.lat !== undefined ? { lon: q.lon, lat: q.lat } : undefined;
  const hits = q.q ? findCrs(q.q, near) : listCrs();
  const crs: CrsDto[] = hits.slice(0, 50).map((e) => ({ code: e.code, name: e.name, kind: e.kind }));
  return Response.json({ crs });
});
