import "server-only";
import { convex, featureCollection, point, simplify } from "@turf/turf";
import { centreLonLat, deriveRowBearing, projectTable, resolveCrs, utmFor, convertArrays } from "@/geo";
import { getDb } from "@/db/client";
import { latestPlantedDatasetId, loadDatasetPoints } from "@/db/queries/datasets";
import type { FieldDerivedDto, FieldDto } from "@/lib/api-types";

const MAX_HULL_POINTS = 20_000;

/** Row bearing, boundary and a CRS suggestion from the field's latest as-planted records. */
export async function deriveFieldSuggestions(field: FieldDto, orgId: string): Promise<FieldDerivedDto> {
  const db = await getDb();
  const id = await latestPlantedDatasetId(db, { orgId, fieldId: field.id });
  const loaded = id ? await loadDatasetPoints(db, { id, orgId }) : null;
  if (!loaded) return { datasetId: null, rowBearingDeg: null, boundary: null, suggestedCrs: null };
  const from = resolveCrs(loaded.dto.crs);
  const [lon, lat] = centreLonLat(loaded.table, from);
  const utm = utmFor(lon, lat);
  let work = utm;
  try {
    const fieldCrs = resolveCrs(field.crs);
    if (fieldCrs.kind === "projected") work = fieldCrs;
  } catch {
    /* keep the UTM zone */
  }
  const bearing = deriveRowBearing(projectTable(loaded.table, from, work));
  // Boundary: convex hull of the records in lon/lat (every k-th point for very large files).
  const step = Math.max(1, Math.ceil(loaded.table.length / MAX_HULL_POINTS));
  const pts = [];
  const geographic =
    from.kind === "geographic" ? null : convertArrays(loaded.table.x, loaded.table.y, from, "EPSG:4326");
  for (let i = 0; i < loaded.table.length; i += step) {
    const x = geographic ? geographic[0][i] : loaded.table.x[i];
    const y = geographic ? geographic[1][i] : loaded.table.y[i];
    if (Number.isFinite(x) && Number.isFinite(y)) pts.push(point([x, y]));
  }
  const hull = pts.length >= 3 ? convex(featureCollection(pts)) : null;
  const boundary = hull ? (simplify(hull, { tolerance: 1e-7, highQuality: true }).geometry as GeoJSON.Polygon) : null;
  return {
    datasetId: loaded.dto.id,
    rowBearingDeg: Number.isFinite(bearing.bearingDeg) ? Math.round(bearing.bearingDeg * 100) / 100 : null,
    boundary,
    suggestedCrs: utm.code,
  };
}
