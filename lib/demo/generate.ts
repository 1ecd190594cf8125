/**
 * Deterministic demo files for a field: the planting machine's as-planted records and a
 * technician's total-station survey of a sample of them. Invented data, for the demo only.
 *
 * Error model (what an audit of these files should find):
 *  - true plant positions lie on straight rows at the field's bearing, evenly spaced;
 *  - camera-corrected record = true position + arm bias + N(0, 2 mm) per axis (RTK fixed);
 *    arm 3 is miscalibrated: +3 mm cross-row (to the right of the row direction);
 *  - in bed 3, rows 2–3, plants 30–109 were planted while the fix was RTK float: an extra
 *    offset of 30 mm along-row and 12 mm cross-row plus noise (6 mm along, 4 mm cross);
 *  - raw GNSS position (before camera correction) = record + slowly drifting GNSS error
 *    (about 20 mm amplitude) + N(0, 12 mm);
 *  - survey point = true position + N(0, 1.5 mm) (total station, stated precision 2 mm);
 *  - every `surveyEvery`-th plant of each row is surveyed; 3 % of those plants are dead and
 *    cannot be surveyed; 6 weeds are surveyed by mistake (no plant id); 5 % of surveyed
 *    plants carry no id (their tag was lost) and must be paired by position.
 */
import { mulberry32 } from "@/lib/random";
import proj4 from "proj4";
import { DEMO_CRS, type DemoFieldSpec } from "./farm";

const UTM31_ETRS89 = "+proj=utm +zone=31 +ellps=GRS80 +towgs84=0,0,0,0,0,0,0 +units=m +no_defs";
const toLonLat = proj4(UTM31_ETRS89, "WGS84");

function gaussian(rand: () => number) {
  return () => {
    const u = Math.max(rand(), 1e-12);
    return Math.sqrt(-2 * Math.log(u)) * Math.cos(2 * Math.PI * rand());
  };
}

const ARM_CROSS_BIAS_M = [0.0004, -0.0005, 0.003, 0.0002, -0.0003, 0.0001];

export interface DemoFiles {
  plantedCsv: string;
  surveyCsv: string;
  plantCount: number;
  checkpointCount: number;
}

export function generateDemoFiles(spec: DemoFieldSpec): DemoFiles {
  const rand = mulberry32(spec.seed); // the same files on every machine
  const g = gaussian(rand);
  const th = (spec.bearingDeg * Math.PI) / 180;
  const along = [Math.sin(th), Math.cos(th)]; // unit vector (E, N) along the row
  const right = [Math.cos(th), -Math.sin(th)]; // unit vector to the right of the row direction
  const start = Date.parse(spec.startUtc);

  const planted = ["plant_id,crop,bed,row,arm,fix,hdop,planted_at,lat,lon,raw_lat,raw_lon"];
  const survey = ["plant_id,method,precision_m,easting,northing,observed_at"];
  let plantCount = 0;
  let checkpointCount = 0;
  // The check survey six days later, in daylight (09:30 UTC), whatever time of day the planting was.
  const surveyStart = Math.floor(start / 86_400_000) * 86_400_000 + 6 * 86_400_000 + 9.5 * 3_600_000;

  for (let bed = 1; bed <= spec.beds; bed++) {
    for (let row = 1; row <= spec.rowsPerBed; row++) {
      const offset = (bed - 1) * spec.bedSpacingM + (row - 1) * spec.rowSpacingM;
      const driftPhase = rand() * Math.PI * 2;
      for (let k = 0; k < spec.plantsPerRow; k++) {
        const a = k * spec.plantSpacingM;
        const trueE = spec.originE + along[0] * a + right[0] * offset;
        const trueN = spec.originN + along[1] * a + right[1] * offset;
        const arm = row;
        const float = bed === 3 && (row === 2 || row === 3) && k >= 30 && k < 110;
        let dAlong = g() * 0.002;
        let dCross = ARM_CROSS_BIAS_M[arm - 1] + g() * 0.002;
        if (float) {
          dAlong += 0.03 + g() * 0.006;
          dCross += 0.012 + g() * 0.004;
        }
        const recE = trueE + along[0] * dAlong + right[0] * dCross + (spec.shiftE ?? 0);
        const recN = trueN + along[1] * dAlong + right[1] * dCross + (spec.shiftN ?? 0);
        const drift = 0.02 * Math.sin(driftPhase + k / 25);
        const rawE = recE + drift + g() * 0.012;
        const rawN = recN + 0.6 * drift + g() * 0.012;
        const [lon, lat] = toLonLat.forward([recE, recN]);
        const [rawLon, rawLat] = toLonLat.forward([rawE, rawN]);
        const id = `${spec.idPrefix}-${bed}-${row}-${String(k + 1).padStart(4, "0")}`;
        // Arms work side by side, so plants of one pass share their time; beds are planted in turn.
        const t = new Date(start + ((bed - 1) * spec.plantsPerRow + k) * spec.secondsPerPlant * 1000);
        const hdop = (float ? 1.6 + rand() * 0.8 : 0.6 + rand() * 0.3).toFixed(1);
        planted.push(
          [
            id,
            spec.crop,
            bed,
            row,
            arm,
            float ? "rtk-float" : "rtk-fixed",
            hdop,
            t.toISOString(),
            lat.toFixed(9),
            lon.toFixed(9),
            rawLat.toFixed(9),
            rawLon.toFixed(9),
          ].join(","),
        );
        plantCount++;

        if (k % spec.surveyEvery === 5) {
          if (rand() < 0.03) continue; // dead plant: nothing to survey
          const sE = trueE + g() * 0.0015;
          const sN = trueN + g() * 0.0015;
          const tagLost = rand() < 0.05;
          const obs = new Date(surveyStart + checkpointCount * 40_000).toISOString();
          survey.push([tagLost ? "" : id, "total-station", "0.002", sE.toFixed(4), sN.toFixed(4), obs].join(","));
          checkpointCount++;
        }
      }
    }
  }
  // Weeds surveyed by mistake: between rows, no plant id.
  for (let w = 0; w < 6; w++) {
    const bed = 1 + Math.floor(rand() * spec.beds);
    const a = (10 + rand() * (spec.plantsPerRow - 20)) * spec.plantSpacingM;
    const offset = (bed - 1) * spec.bedSpacingM + (0.5 + Math.floor(rand() * (spec.rowsPerBed - 1))) * spec.rowSpacingM;
    const e = spec.originE + along[0] * a + right[0] * offset;
    const n = spec.originN + along[1] * a + right[1] * offset;
    const obs = new Date(surveyStart + (checkpointCount + w) * 40_000).toISOString();
    survey.push(["", "total-station", "0.002", e.toFixed(4), n.toFixed(4), obs].join(","));
  }
  return { plantedCsv: planted.join("\n") + "\n", surveyCsv: survey.join("\n") + "\n", plantCount, checkpointCount };
}

export const DEMO_SURVEY_CRS = DEMO_CRS;
export const DEMO_PLANTED_CRS = "EPSG:4326";
