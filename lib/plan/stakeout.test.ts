/** CSV quoting per RFC 4180 §2; GeoJSON coordinate order per RFC 7946 §3.1.1 (longitude, latitude). */
import { describe, expect, it } from "vitest";
import type { PlanPointDto } from "./dto";
import { stakeoutCsv, stakeoutGeoJson } from "./stakeout";

const P: PlanPointDto[] = [
  {
    seq: 1,
    name: "C0001-B1",
    plantId: "LA-1-1-0006",
    stratum: "bed 1",
    spare: false,
    e: 662410.12345,
    n: 5821330.5,
    crop: "lettuce",
    bed: "1",
    row: "1",
    arm: "1",
  },
  {
    seq: 2,
    name: "S0001-B1",
    plantId: 'odd,"id"',
    stratum: "bed 1",
    spare: true,
    e: 1,
    n: 2,
    crop: null,
    bed: "1",
    row: null,
    arm: null,
  },
];

describe("stakeoutCsv", () => {
  it("stakeoutCsv -- header, millimetre coordinates, quoting, CRLF", () => {
    expect(stakeoutCsv(P)).toBe(
      "point,easting,northing,plant_id,crop,bed,row,arm,kind\r\n" +
        "C0001-B1,662410.123,5821330.500,LA-1-1-0006,lettuce,1,1,1,checkpoint\r\n" +
        'S0001-B1,1.000,2.000,"odd,""id""",,1,,,spare\r\n', // RFC 4180 §2 rules 6–7
    );
  });
});

describe("stakeoutGeoJson", () => {
  it("stakeoutGeoJson -- longitude first, properties carry the grid coordinates", () => {
    const g = stakeoutGeoJson(
      P,
      [
        [5.3, 52.5],
        [5.4, 52.6],
      ],
      { plan: "x", crs: "EPSG:25831" },
    ) as {
      features: { geometry: { coordinates: number[] }; properties: Record<string, unknown> }[];
    };
    expect(g.features[0].geometry.coordinates).toEqual([5.3, 52.5]); // RFC 7946 §3.1.1
    expect(g.features[0].properties).toMatchObject({ point: "C0001-B1", easting: 662410.123, kind: "checkpoint" });
    expect(() => stakeoutGeoJson(P, [], { plan: "x", crs: "c" })).toThrow(/one longitude\/latitude per point/);
  });
});
