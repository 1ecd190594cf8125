import { describe, expect, it } from "vitest";
import { IdColumn } from "@/geo/ids";
import type { PointTable, ProjectedTable } from "@/geo/types";
import {
  decodePlantedNotFound,
  encodePlantedNotFound,
  plantedNotFoundPart,
  plantedNotFoundRows,
} from "./planted-not-found";
import { unpairedRecordRows, unpairedSurveyRows } from "./result-rows";

// Invented tables for the tests only.
function table(role: "planted" | "survey", n: number, shift = 0): PointTable {
  return {
    source: `${role}.csv`,
    role,
    length: n,
    x: Float64Array.from({ length: n }, (_, i) => 317_960 + i * 0.3 + shift),
    y: Float64Array.from({ length: n }, (_, i) => 5_816_690 + i * 0.1),
    line: Int32Array.from({ length: n }, (_, i) => i + 2),
    id: IdColumn.from(Array.from({ length: n }, (_, i) => (i === 3 ? "" : `P-${i}`))),
    attrs: {
      crop: { codes: Int32Array.from({ length: n }, (_, i) => (i % 4 === 1 ? -1 : 0)), values: ["lettuce"] },
      bed: { codes: Int32Array.from({ length: n }, (_, i) => i % 2), values: ["1", "2"] },
    },
    time: null,
    hdop: null,
    precision: null,
    rawX: null,
    rawY: null,
  };
}
const projected = (t: PointTable, dx = 0): ProjectedTable => ({
  ...t,
  x: dx ? t.x.map((v) => v + dx) : t.x,
  crs: "EPSG:25831",
});

describe("planted-not-found", () => {
  it("planted-not-found -- a set survives encode and decode, with and without positions", () => {
    for (const withPositions of [false, true]) {
      const p = {
        plants: 21,
        indices: Int32Array.of(0, 7, 8, 15, 16, 20),
        e: withPositions ? Float64Array.of(1, 2, 3, 4, 5, 6.5) : null,
        n: withPositions ? Float64Array.of(-1, -2, -3, -4, -5, -6.5) : null,
      };
      expect(decodePlantedNotFound(encodePlantedNotFound(p))).toEqual(p);
    }
    const none = { plants: 0, indices: new Int32Array(0), e: null, n: null };
    expect(decodePlantedNotFound(encodePlantedNotFound(none))).toEqual(none);
  });

  it("planted-not-found -- refuses indices out of order or range, and unreadable bytes", () => {
    const enc = (indices: number[], plants = 10) =>
      encodePlantedNotFound({ plants, indices: Int32Array.from(indices), e: null, n: null });
    expect(() => enc([3, 2])).toThrow("planted-not-found blob: index 2 is not ascending within 0…9");
    expect(() => enc([10])).toThrow("planted-not-found blob: index 10 is not ascending within 0…9");
    expect(() =>
      encodePlantedNotFound({
        plants: 4,
        indices: Int32Array.of(1),
        e: Float64Array.of(1, 2),
        n: Float64Array.of(1, 2),
      }),
    ).toThrow("planted-not-found blob: 2 positions for 1 records");
    expect(() => decodePlantedNotFound(new TextEncoder().encode("PPT2xxxx"))).toThrow(
      "planted-not-found blob: unknown format",
    );
    const good = enc([1, 4]);
    expect(() => decodePlantedNotFound(good.subarray(0, 6))).toThrow("planted-not-found blob:");
  });

  it("planted-not-found -- rows rebuilt from the compact form equal the rows of every unpaired point", () => {
    const planted = table("planted", 30);
    const survey = table("survey", 6, 0.01);
    const pairing = {
      unmatchedPlanted: Int32Array.of(0, 1, 3, 9, 17, 29),
      unmatchedSurvey: Int32Array.of(2, 4),
      ambiguousSurvey: Int32Array.of(5),
    };
    for (const dx of [0, 0.25]) {
      const pp = projected(planted, dx);
      const all = unpairedRecordRows(pairing, pp, projected(survey));
      const part = plantedNotFoundPart(pairing.unmatchedPlanted, planted, pp);
      // Positions are kept only when the projection moved them.
      expect(part.e === null).toBe(dx === 0);
      const back = decodePlantedNotFound(encodePlantedNotFound(part));
      const rebuilt = [...plantedNotFoundRows(back, planted), ...unpairedSurveyRows(pairing, projected(survey))];
      expect(rebuilt).toEqual(all);
      expect(plantedNotFoundRows(back, planted, 2, 4)).toEqual(all.slice(2, 4));
      expect(all[2]).toMatchObject({ seq: 2, kind: "planted-not-found", pointId: null, line: 5, crop: "lettuce" });
      expect(all[1].crop).toBeNull();
      expect(all[6]).toMatchObject({ seq: 6, kind: "surveyed-not-planted", pointId: "P-2" });
    }
  });

  it("planted-not-found -- inputs are not changed", () => {
    const planted = table("planted", 8);
    const before = structuredClone({ x: planted.x, y: planted.y });
    const idx = Int32Array.of(1, 5);
    plantedNotFoundPart(idx, planted, projected(planted, 1));
    expect({ x: planted.x, y: planted.y }).toEqual(before);
    expect(idx).toEqual(Int32Array.of(1, 5));
  });
});
