/**
 * The benchmark's synthetic field (fictional "Alder Bank" trial field; beds 3 m wide with 5 rows 0.5 m
 * apart, plants 0.25 m apart in the row, rows at a bearing of 28°) written as CSV in .bench/:
 *  - planted-N.csv: N as-planted records, plant_id, crop, bed, row, arm, fix, lat, lon (WGS 84, 9 decimals);
 *  - survey-N.csv: ~N survey points, easting/northing in WGS 84 / UTM 32N (4 decimals), no ids, in
 *    walking order; 2 % of plants not surveyed, 1 % extra points (weeds) added;
 *  - survey-N-every-K.csv (with `surveyEvery` K > 1): the same, but only every K-th plant is surveyed (a sampled
 *    check, as a technician walking the field with a rover would make one).
 * Error model (demo values; common practice, no source): record = truth + bias (2 mm E, −1 mm N) + 3 mm σ
 * per axis; survey = truth + 8 mm σ per axis; 2 % of records on RTK float with 40 mm σ.
 */
import { createWriteStream, existsSync, mkdirSync } from "node:fs";
import { once } from "node:events";
import proj4 from "proj4";
import { gaussian, mulberry32 } from "@/lib/random";

export const DIR = ".bench";
const UTM = "+proj=utm +zone=32 +datum=WGS84 +units=m +no_defs";
const WGS = "+proj=longlat +datum=WGS84 +no_defs";
const ORIGIN_E = 552_300,
  ORIGIN_N = 5_794_100; // near 52.3°N 9.77°E (fictional field)
const BEARING = (28 * Math.PI) / 180;

/** Deterministic uniform and normal random numbers. */
function rng(seed: number): { u: () => number; n: () => number } {
  const u = mulberry32(seed);
  return { u, n: gaussian(u) };
}

async function writeLines(path: string, gen: () => Generator<string>): Promise<void> {
  const out = createWriteStream(path);
  let buf: string[] = [];
  for (const line of gen()) {
    buf.push(line);
    if (buf.length === 8192) {
      if (!out.write(buf.join("\n") + "\n")) await once(out, "drain");
      buf = [];
    }
  }
  if (buf.length) out.write(buf.join("\n") + "\n");
  out.end();
  await once(out, "finish");
}

/** The survey file of a field of `n` plants when every `surveyEvery`-th plant is surveyed. */
const surveyPath = (n: number, surveyEvery: number) =>
  surveyEvery > 1 ? `${DIR}/survey-${n}-every-${surveyEvery}.csv` : `${DIR}/survey-${n}.csv`;

/** Writes planted-N.csv and the survey file (every plant, or every `surveyEvery`-th) for a field of N plants. */
export async function generate(n: number, surveyEvery = 1): Promise<void> {
  const rowsPerBed = 5,
    rowGap = 0.5,
    bedWidth = 3,
    spacing = 0.25;
  const perRow = Math.max(10, Math.round(Math.sqrt(n / 8)));
  const toGeo = proj4(UTM, WGS);
  const sinB = Math.sin(BEARING),
    cosB = Math.cos(BEARING);
  const r = rng(n);
  // Truth per plant, in walking order: bed, row within bed, position along the row.
  const te = new Float64Array(n),
    tn = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const rowIndex = Math.floor(i / perRow),
      k = i % perRow;
    const bed = Math.floor(rowIndex / rowsPerBed),
      row = rowIndex % rowsPerBed;
    const along = k * spacing,
      cross = bed * bedWidth + row * rowGap;
    te[i] = ORIGIN_E + along * sinB + cross * cosB;
    tn[i] = ORIGIN_N + along * cosB - cross * sinB;
  }
  const crops = ["lettuce", "celeriac", "leek"];
  await writeLines(`${DIR}/planted-${n}.csv`, function* () {
    yield "plant_id,crop,bed,row,arm,fix,lat,lon";
    const p = [0, 0];
    for (let i = 0; i < n; i++) {
      const rowIndex = Math.floor(i / perRow);
      const bed = Math.floor(rowIndex / rowsPerBed),
        row = (rowIndex % rowsPerBed) + 1;
      const float = r.u() < 0.02;
      const s = float ? 0.04 : 0.003;
      p[0] = te[i] + 0.002 + s * r.n();
      p[1] = tn[i] - 0.001 + s * r.n();
      const [lon, lat] = toGeo.forward(p);
      yield `AB-${String(i + 1).padStart(7, "0")},${crops[Math.floor(bed / 10) % 3]},B${bed + 1},${row},${row <= 3 ? "L" : "R"},${float ? 5 : 4},${lat.toFixed(9)},${lon.toFixed(9)}`;
    }
  });
  await writeLines(surveyPath(n, surveyEvery), function* () {
    yield "easting,northing,method";
    for (let i = 0; i < n; i++) {
      if (i % surveyEvery !== 0) continue; // not in the sample
      if (r.u() < 0.02) continue; // not surveyed / missing plant
      yield `${(te[i] + 0.008 * r.n()).toFixed(4)},${(tn[i] + 0.008 * r.n()).toFixed(4)},rtk`;
      if (r.u() < 0.01) {
        // a weed or volunteer half-way to the next plant
        yield `${(te[i] + 0.12 * sinB + 0.05 * r.n()).toFixed(4)},${(tn[i] + 0.12 * cosB + 0.05 * r.n()).toFixed(4)},rtk`;
      }
    }
  });
}

/**
 * Paths of the field of `n` plants, generated when missing (or when `regen`); with `surveyEvery` K > 1 only every
 * K-th plant is surveyed (the as-planted file is the same).
 */
export async function benchFiles(
  n: number,
  regen = false,
  surveyEvery = 1,
): Promise<{ planted: string; survey: string }> {
  const planted = `${DIR}/planted-${n}.csv`,
    survey = surveyPath(n, surveyEvery);
  if (regen || !existsSync(planted) || !existsSync(survey)) {
    mkdirSync(DIR, { recursive: true });
    const t = performance.now();
    await generate(n, surveyEvery);
    process.stderr.write(`generated ${n} in ${Math.round(performance.now() - t)} ms\n`);
  }
  return { planted, survey };
}
