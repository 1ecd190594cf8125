import { readFileSync, writeFileSync } from "node:fs";
import path from "node:path";
import { describe, expect, it } from "vitest";
import { decodeMapPayload, encodeMapPayload } from "./binary";
import {
  buildMapArrays,
  chooseOrigin,
  encodeCodes,
  naturalDictionary,
  pairFlags,
  type PairColumns,
  type UnpairedColumns,
} from "./build";
import { DICT_NAMES, NO_CODE, PAIR_FLAG, type DictName, type MapMeta } from "./types";

const E0 = 662_431,
  N0 = 5_821_352;

/** Three pairs and three unpaired points of a small field, absolute coordinates in metres (EPSG:25831). */
function sample() {
  const abs = { e: [662_410.5712, 662_411.9531, 662_452.0004], n: [5_821_331.3858, 5_821_334.71, 5_821_372.9999] };
  const text = (v: string[]) => v;
  const pairs: PairColumns = {
    count: 3,
    x: Float32Array.from(abs.e, (e) => e - E0),
    y: Float32Array.from(abs.n, (n) => n - N0),
    dE: Float32Array.of(0.0012, -0.0301, 0.004),
    dN: Float32Array.of(-0.0004, 0.011, 0),
    along: Float32Array.of(0.001, -0.03, Number.NaN),
    cross: Float32Array.of(0.0002, 0.012, Number.NaN),
    flags: Uint8Array.of(
      pairFlags({ within: true, outlier: false, pairedBy: "id", beyondMaxDistance: false }),
      pairFlags({ within: false, outlier: true, pairedBy: "position", beyondMaxDistance: false }),
      pairFlags({ within: null, outlier: false, pairedBy: "id", beyondMaxDistance: true }),
    ),
    plantId: ["LA-1-1-0006", "", "LA-10-2-0018"],
    text: {
      crop: text(["lettuce", "lettuce", ""]),
      bed: text(["1", "10", "2"]),
      row: text(["1", "2", "2"]),
      arm: text(["1", "2", "2"]),
      fix: text(["rtk-fixed", "rtk-float", "rtk-fixed"]),
      day: text(["2026-04-14", "2026-04-15", "2026-04-14"]),
    },
  };
  const unpaired: UnpairedColumns = {
    count: 3,
    x: Float32Array.of(-3, 4, 5.5),
    y: Float32Array.of(1, 2, -7.25),
    kind: ["planted-not-found", "surveyed-not-planted", "ambiguous"],
    text: { crop: ["lettuce", "", ""], bed: ["3", "", ""], row: ["5", "", ""] },
  };
  return { abs, pairs, unpaired };
}

function meta(pairs: number, unpaired: number, dict: Record<DictName, string[]>): MapMeta {
  return {
    audit: {
      id: "a",
      title: "Long Acre",
      state: "computed",
      fieldId: "f",
      fieldName: "Long Acre",
      computedAt: "2026-04-20T12:00:00.000Z",
    },
    crs: "EPSG:25831",
    origin: [E0, N0],
    gridConvergenceDeg: 1.9,
    rowBearingDeg: 22.5,
    field: { bedSpacingM: 3, rowsPerBed: 5, rowSpacingM: 0.5 },
    boundary: { source: "records", ring: [0, 0, 1, 0, 1, 1] },
    profile: null,
    pairs,
    unpaired,
    dict,
  };
}

describe("map payload", () => {
  it("encodeMapPayload -- round trip keeps every value, and coordinates to well under a millimetre", () => {
    const { abs, pairs, unpaired } = sample();
    const { arrays, dict } = buildMapArrays(pairs, unpaired);
    const bytes = encodeMapPayload(meta(3, 3, dict), arrays);
    const back = decodeMapPayload(bytes);
    expect(back.meta.origin).toEqual([E0, N0]);
    expect(back.meta.dict.bed).toEqual(["1", "2", "3", "10"]); // natural order, shared with unpaired points
    for (let i = 0; i < 3; i++) {
      // Float32 relative to a local origin: |x| < 64 m → step 2⁻¹⁸ m ≈ 4 µm (IEEE 754 binary32).
      expect(Math.abs(back.arrays.pairXY[2 * i] + E0 - abs.e[i])).toBeLessThan(1e-5);
      expect(Math.abs(back.arrays.pairXY[2 * i + 1] + N0 - abs.n[i])).toBeLessThan(1e-5);
    }
    expect(Array.from(back.arrays.pairD)).toEqual(Array.from(arrays.pairD));
    expect(back.arrays.pairAlong[1]).toBeCloseTo(-0.03, 7);
    expect(Number.isNaN(back.arrays.pairCross[2])).toBe(true);
    expect(Array.from(back.arrays.pairFlags)).toEqual([
      PAIR_FLAG.WITHIN_KNOWN | PAIR_FLAG.WITHIN,
      PAIR_FLAG.WITHIN_KNOWN | PAIR_FLAG.OUTLIER | PAIR_FLAG.BY_POSITION,
      PAIR_FLAG.BEYOND_MAX,
    ]);
    expect(back.arrays.pairIds).toEqual(["LA-1-1-0006", "", "LA-10-2-0018"]);
    expect(back.meta.dict.bed[back.arrays.pairCodes.bed[1]]).toBe("10");
    expect(back.arrays.pairCodes.crop[2]).toBe(NO_CODE);
    expect(Array.from(back.arrays.unpairedKind)).toEqual([0, 1, 2]);
    expect(back.meta.dict.row[back.arrays.unpairedCodes.row[0]]).toBe("5");
    expect(back.arrays.unpairedCodes.bed[1]).toBe(NO_CODE);
    expect(Array.from(back.arrays.unpairedXY)).toEqual([-3, 1, 4, 2, 5.5, -7.25]);
  });

  it("decodeMapPayload -- typed arrays are views into the received buffer, 8-byte aligned", () => {
    const { pairs, unpaired } = sample();
    const { arrays, dict } = buildMapArrays(pairs, unpaired);
    const bytes = encodeMapPayload(meta(3, 3, dict), arrays);
    const buffer = (bytes.buffer as ArrayBuffer).slice(bytes.byteOffset, bytes.byteOffset + bytes.byteLength);
    const back = decodeMapPayload(buffer);
    expect(back.arrays.pairXY.buffer).toBe(buffer);
    expect(back.arrays.pairCodes.day.buffer).toBe(buffer);
    for (const a of [
      back.arrays.pairXY,
      back.arrays.pairD,
      back.arrays.pairAlong,
      back.arrays.pairCodes.arm,
      back.arrays.unpairedXY,
    ]) {
      expect(a.byteOffset % 8).toBe(0);
    }
    // The layout's fixed start: magic, then the header length as u32 little-endian.
    expect(new TextDecoder().decode(bytes.subarray(0, 4))).toBe("PPMD");
    const headerLength = new DataView(buffer).getUint32(4, true);
    expect(JSON.parse(new TextDecoder().decode(bytes.subarray(8, 8 + headerLength))).format).toBe("plotproof-map");
  });

  it("decodeMapPayload -- an unaligned input is copied, not misread", () => {
    const { pairs, unpaired } = sample();
    const { arrays, dict } = buildMapArrays(pairs, unpaired);
    const bytes = encodeMapPayload(meta(3, 3, dict), arrays);
    const shifted = new Uint8Array(bytes.byteLength + 3);
    shifted.set(bytes, 3);
    expect(Array.from(decodeMapPayload(shifted.subarray(3)).arrays.pairD)).toEqual(Array.from(arrays.pairD));
  });

  it("encodeMapPayload -- an empty audit encodes and decodes", () => {
    const empty = (): UnpairedColumns => ({
      count: 0,
      x: new Float32Array(0),
      y: new Float32Array(0),
      kind: [],
      text: { crop: [], bed: [], row: [] },
    });
    const noPairs: PairColumns = {
      count: 0,
      x: new Float32Array(0),
      y: new Float32Array(0),
      dE: new Float32Array(0),
      dN: new Float32Array(0),
      along: new Float32Array(0),
      cross: new Float32Array(0),
      flags: new Uint8Array(0),
      plantId: [],
      text: Object.fromEntries(DICT_NAMES.map((c) => [c, []])) as unknown as Record<DictName, string[]>,
    };
    const { arrays, dict } = buildMapArrays(noPairs, empty());
    const back = decodeMapPayload(encodeMapPayload(meta(0, 0, dict), arrays));
    expect(back.arrays.pairIds).toEqual([]);
    expect(back.arrays.pairXY.length).toBe(0);
  });

  it("decodeMapPayload -- rejects other formats and truncated payloads with a clear message", () => {
    const { pairs, unpaired } = sample();
    const { arrays, dict } = buildMapArrays(pairs, unpaired);
    const bytes = encodeMapPayload(meta(3, 3, dict), arrays);
    expect(() => decodeMapPayload(new TextEncoder().encode("PPT1....{}"))).toThrow(
      "map payload: not a Plotproof map payload",
    );
    expect(() => decodeMapPayload(bytes.slice(0, bytes.byteLength - 16))).toThrow(
      /map payload: array .* (outside the payload|wrong length)/,
    );
    expect(() => decodeMapPayload(bytes.slice(0, 12))).toThrow("map payload: truncated header");
  });

  it("encodeMapPayload -- refuses arrays that do not match the counts", () => {
    const { pairs, unpaired } = sample();
    const { arrays, dict } = buildMapArrays(pairs, unpaired);
    expect(() => encodeMapPayload(meta(4, 3, dict), arrays)).toThrow(/map payload: pair\.xy has 24 bytes, expected 32/);
  });

  it("encodeMapPayload -- a line break inside a plant id cannot shift the ids", () => {
    const { pairs, unpaired } = sample();
    pairs.plantId = ["A\nB", "C", ""];
    const { arrays, dict } = buildMapArrays(pairs, unpaired);
    expect(decodeMapPayload(encodeMapPayload(meta(3, 3, dict), arrays)).arrays.pairIds).toEqual(["A B", "C", ""]);
  });
});

describe("map payload bytes", () => {
  it("encodeMapPayload -- writes the bytes of the golden payload", () => {
    // fixtures/map-payload.bin was written by the encoder as it stood before the shared framing
    // (lib/binary-frame.ts); REGEN=1 rewrites it, on purpose only, and the diff is reviewed.
    const golden = path.join(import.meta.dirname, "fixtures", "map-payload.bin");
    const { pairs, unpaired } = sample();
    const { arrays, dict } = buildMapArrays(pairs, unpaired);
    const bytes = encodeMapPayload(meta(3, 3, dict), arrays);
    if (process.env.REGEN) writeFileSync(golden, bytes);
    expect(Buffer.from(bytes)).toEqual(readFileSync(golden));
    const back = decodeMapPayload(new Uint8Array(readFileSync(golden)));
    expect(back.arrays.pairIds).toEqual(["LA-1-1-0006", "", "LA-10-2-0018"]);
    expect(Array.from(back.arrays.pairD)).toEqual(Array.from(arrays.pairD));
    expect(Array.from(back.arrays.unpairedCodes.bed)).toEqual(Array.from(arrays.unpairedCodes.bed));
  });
});

describe("map payload builder", () => {
  it("naturalDictionary -- numbers in numeric order, empties left out", () => {
    expect(naturalDictionary([["10", "2", "", "B", "a"], ["1"]])).toEqual(["1", "2", "10", "a", "B"]);
  });

  it("encodeCodes -- unknown and empty values get NO_CODE", () => {
    expect(Array.from(encodeCodes(["b", "", "x", "a"], ["a", "b"]))).toEqual([1, NO_CODE, NO_CODE, 0]);
  });

  it("chooseOrigin -- centre of the box rounded to whole metres", () => {
    expect(chooseOrigin({ minE: 662400.2, maxE: 662460.8, minN: 5821300, maxN: 5821350 })).toEqual([662431, 5821325]);
    expect(chooseOrigin(null)).toEqual([0, 0]);
  });

  it("pairFlags -- one bit per stored boolean", () => {
    expect(pairFlags({ within: false, outlier: true, pairedBy: "id", beyondMaxDistance: false })).toBe(5);
    expect(pairFlags({ within: true, outlier: false, pairedBy: "position", beyondMaxDistance: true })).toBe(
      1 | 2 | 8 | 16,
    );
    expect(pairFlags({ within: null, outlier: false, pairedBy: "id", beyondMaxDistance: false })).toBe(0);
  });

  it("buildMapArrays -- refuses an unknown unpaired kind", () => {
    const { pairs, unpaired } = sample();
    unpaired.kind[1] = "weed";
    expect(() => buildMapArrays(pairs, unpaired)).toThrow('map payload: unknown unpaired kind "weed"');
  });

  it("buildMapArrays -- does not change its inputs", () => {
    const { pairs, unpaired } = sample();
    const before = JSON.stringify([Array.from(pairs.x), pairs.text, Array.from(unpaired.y), unpaired.kind]);
    buildMapArrays(pairs, unpaired);
    expect(JSON.stringify([Array.from(pairs.x), pairs.text, Array.from(unpaired.y), unpaired.kind])).toBe(before);
  });
});
