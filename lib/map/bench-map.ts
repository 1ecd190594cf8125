/**
 * Payload size and encode/decode time of the map's binary format for large synthetic fields.
 *
 *   npx tsx lib/map/bench-map.ts                 # 100,000 and 1,000,000 plants
 *   npx tsx lib/map/bench-map.ts --out /tmp/map  # also write the payloads (for the browser's first-draw measurement)
 *
 * The synthetic field follows the demo's geometry (beds 3 m apart, 5 rows 0.5 m apart, plants 0.3 m apart, rows at
 * 22.5°) and its survey ratio (every 12th plant a checkpoint); the "all paired" case surveys every plant.
 * Errors are N(0, 2.5 mm) per axis with one stretch 30 mm off along the row. Invented data.
 */
import fs from "node:fs";
import path from "node:path";
import { gzipSync } from "node:zlib";
import { mulberry32 } from "@/lib/random";
import { buildMapArrays, type PairColumns, type UnpairedColumns } from "./build";
import { decodeMapPayload, encodeMapPayload } from "./binary";
import { convexHull } from "./geometry";
import { DICT_NAMES, PAIR_FLAG, type DictName, type MapMeta } from "./types";

export interface SyntheticField {
  plants: number;
  pairs: PairColumns;
  unpaired: UnpairedColumns;
  meta: Omit<MapMeta, "pairs" | "unpaired" | "dict">;
}

/** A field of `plants` plants in `beds` beds of 5 rows; every `surveyEvery`-th plant of a row is a checkpoint. */
export function syntheticField(plants: number, surveyEvery = 12, seed = 7): SyntheticField {
  const rand = mulberry32(seed); // seeded: every run draws the same field
  const g = () => Math.sqrt(-2 * Math.log(Math.max(rand(), 1e-12))) * Math.cos(2 * Math.PI * rand());
  const rowsPerBed = 5,
    rowSpacing = 0.5,
    bedSpacing = 3,
    plantSpacing = 0.3;
  const beds = Math.max(1, Math.round(Math.sqrt(plants / rowsPerBed / 20)));
  const perRow = Math.ceil(plants / (beds * rowsPerBed));
  const th = (22.5 * Math.PI) / 180;
  const u = [Math.sin(th), Math.cos(th)],
    r = [Math.cos(th), -Math.sin(th)];
  const halfA = (perRow * plantSpacing) / 2,
    halfC = (beds * bedSpacing) / 2;
  const pairsCap = Math.ceil(plants / surveyEvery) + beds * rowsPerBed;
  const px = new Float32Array(pairsCap),
    py = new Float32Array(pairsCap),
    dE = new Float32Array(pairsCap),
    dN = new Float32Array(pairsCap);
  const along = new Float32Array(pairsCap),
    cross = new Float32Array(pairsCap),
    flags = new Uint8Array(pairsCap);
  const ux = new Float32Array(plants),
    uy = new Float32Array(plants);
  const pairText: Record<DictName, string[]> = Object.fromEntries(DICT_NAMES.map((c) => [c, [] as string[]])) as Record<
    DictName,
    string[]
  >;
  const plantId: string[] = [];
  const uText = { crop: [] as string[], bed: [] as string[], row: [] as string[] };
  let np = 0,
    nu = 0,
    made = 0;
  for (let b = 1; b <= beds && made < plants; b++) {
    for (let k = 1; k <= rowsPerBed && made < plants; k++) {
      const c = (b - 1) * bedSpacing + (k - 1) * rowSpacing - halfC;
      for (let i = 0; i < perRow && made < plants; i++, made++) {
        const a = i * plantSpacing - halfA;
        const x = u[0] * a + r[0] * c,
          y = u[1] * a + r[1] * c;
        if (i % surveyEvery === surveyEvery - 1) {
          const float = b === 3 && (k === 2 || k === 3) && i > perRow / 5 && i < (2 * perRow) / 5;
          const da = g() * 0.0025 + (float ? 0.03 : 0),
            dc = g() * 0.0025;
          px[np] = x;
          py[np] = y;
          dE[np] = u[0] * da + r[0] * dc;
          dN[np] = u[1] * da + r[1] * dc;
          along[np] = da;
          cross[np] = dc;
          const within = Math.hypot(da, dc) <= 0.01 && Math.abs(dc) <= 0.008 && Math.abs(da) <= 0.01;
          flags[np] = PAIR_FLAG.WITHIN_KNOWN | (within ? PAIR_FLAG.WITHIN : 0);
          plantId.push(`SY-${b}-${k}-${String(i + 1).padStart(5, "0")}`);
          pairText.crop.push("lettuce");
          pairText.bed.push(String(b));
          pairText.row.push(String(k));
          pairText.arm.push(String(k));
          pairText.fix.push(float ? "rtk-float" : "rtk-fixed");
          pairText.day.push(i < perRow / 2 ? "2026-04-14" : "2026-04-15");
          np++;
        } else {
          ux[nu] = x;
          uy[nu] = y;
          uText.crop.push("lettuce");
          uText.bed.push(String(b));
          uText.row.push(String(k));
          nu++;
        }
      }
    }
  }
  const hull = convexHull(Float32Array.from({ length: 2 * nu }, (_, j) => (j % 2 ? uy[j >> 1] : ux[j >> 1])));
  return {
    plants: made,
    pairs: {
      count: np,
      x: px.slice(0, np),
      y: py.slice(0, np),
      dE: dE.slice(0, np),
      dN: dN.slice(0, np),
      along: along.slice(0, np),
      cross: cross.slice(0, np),
      flags: flags.slice(0, np),
      plantId,
      text: pairText,
    },
    unpaired: {
      count: nu,
      x: ux.slice(0, nu),
      y: uy.slice(0, nu),
      kind: new Array<string>(nu).fill("planted-not-found"),
      text: uText,
    },
    meta: {
      audit: {
        id: "00000000-0000-4000-8000-000000000000",
        title: `Synthetic field of ${made} plants`,
        state: "computed",
        fieldId: "00000000-0000-4000-8000-000000000001",
        fieldName: "Synthetic",
        computedAt: null,
      },
      crs: "EPSG:25831",
      origin: [662_400, 5_821_300],
      gridConvergenceDeg: 1.9,
      rowBearingDeg: 22.5,
      field: { bedSpacingM: bedSpacing, rowsPerBed, rowSpacingM: rowSpacing },
      boundary: { source: "records", ring: hull.flat() },
      profile: {
        name: "In-row weeding around plants",
        operation: null,
        radialM: 0.01,
        crossM: 0.008,
        alongM: 0.01,
        requiredShare: 0.95,
        confidence: 0.95,
        minCheckpoints: 50,
      },
    },
  };
}

/** Encoded payload of a synthetic field. */
export function syntheticPayload(field: SyntheticField): Uint8Array {
  const { arrays, dict } = buildMapArrays(field.pairs, field.unpaired);
  return encodeMapPayload({ ...field.meta, pairs: field.pairs.count, unpaired: field.unpaired.count, dict }, arrays);
}

function time<T>(fn: () => T): [T, number] {
  const t = performance.now();
  const v = fn();
  return [v, performance.now() - t];
}

const mb = (n: number) => `${(n / 1e6).toFixed(2)} MB`;

function main() {
  const outAt = process.argv.indexOf("--out");
  const outDir = outAt > 0 ? process.argv[outAt + 1] : null;
  if (outDir) fs.mkdirSync(outDir, { recursive: true });
  console.log(
    "plants     | survey   | pairs   | unpaired | payload   | gzip -4   | B/plant | build+encode | gzip -4 | decode",
  );
  for (const [plants, every] of [
    [100_000, 12],
    [1_000_000, 12],
    [100_000, 1],
    [1_000_000, 1],
  ] as const) {
    const field = syntheticField(plants, every);
    const [bytes, tEncode] = time(() => syntheticPayload(field));
    const [gz, tGzip] = time(() => gzipSync(bytes, { level: 4 }));
    const [decoded, tDecode] = time(() => decodeMapPayload(bytes));
    if (decoded.meta.pairs !== field.pairs.count) throw new Error("bench: round trip lost pairs");
    console.log(
      [
        String(field.plants).padEnd(10),
        (every === 1 ? "all" : `1 in ${every}`).padEnd(8),
        String(field.pairs.count).padEnd(7),
        String(field.unpaired.count).padEnd(8),
        mb(bytes.byteLength).padEnd(9),
        mb(gz.byteLength).padEnd(9),
        (bytes.byteLength / field.plants).toFixed(1).padEnd(7),
        `${tEncode.toFixed(0)} ms`.padEnd(12),
        `${tGzip.toFixed(0)} ms`.padEnd(7),
        `${tDecode.toFixed(1)} ms`,
      ].join(" | "),
    );
    if (outDir) fs.writeFileSync(path.join(outDir, `map-${plants}-${every === 1 ? "all" : `1in${every}`}.bin`), bytes);
  }
}

if (process.argv[1] && path.resolve(process.argv[1]) === path.resolve(import.meta.filename ?? "")) main();
