/**
 * The map's SQL (db/queries/map.ts) and the field summary built on it (lib/server/map/field-map.ts) against an
 * in-memory database with the real migrations: the aggregated columns must equal the stored rows, stay inside the
 * organisation, and feed the same guidance as the pure helpers.
 */
import { eq } from "drizzle-orm";
import { beforeAll, describe, expect, it } from "vitest";
import { openDb, type DB } from "@/db/client";
import { audit, auditResidual, auditUnpaired, field, organization } from "@/db/schema";
import {
  getLatestMappedAudit,
  getLatestSignedAudit,
  getMapContext,
  getMapExtent,
  getMapPair,
  getMapUnpaired,
  loadBedColumns,
  loadMapColumns,
} from "@/db/queries/map";
import { getFieldMapSummary, listGrowerFields } from "@/lib/server/map/field-map";
import { buildMapArrays, pairFlags } from "@/lib/map/build";
import { decodeMapPayload, encodeMapPayload } from "@/lib/map/binary";
import { bedGuidance, bedStats } from "@/lib/map/guidance";
import { DICT_NAMES } from "@/lib/map/types";

const ORG = "org-kestrel",
  OTHER = "org-saltings";
const FIELD = "00000000-0000-4000-8000-00000000f001";
const AUDIT = "00000000-0000-4000-8000-00000000a001";
const OLDER = "00000000-0000-4000-8000-00000000a002";
const PROFILE = {
  id: "p",
  name: "In-row weeding around plants",
  operation: "Tools that close between plants in the row",
  radialM: 0.01,
  crossM: 0.008,
  alongM: 0.01,
  requiredShare: 0.95,
  confidence: 0.95,
  minCheckpoints: 50,
};

const FIELD_ROW = {
  id: FIELD,
  orgId: ORG,
  name: "Long Acre",
  farm: "Kestrel Fen",
  crs: "EPSG:25831",
  timeZone: "Europe/Amsterdam",
  rowBearingDeg: 22.5,
  bedSpacingM: 3,
  rowsPerBed: 5,
  rowSpacingM: 0.5,
};
const SETTINGS = {
  match: "auto",
  maxDistanceM: 0.1,
  rowBearingDeg: 22.5,
  timeZone: "Europe/Amsterdam",
  workCrs: "EPSG:25831",
};

interface Pair {
  seq: number;
  plantId: string | null;
  bed: string | null;
  row: string;
  arm: string;
  fix: string;
  day: string;
  plantedE: number;
  plantedN: number;
  dE: number;
  dN: number;
  along: number | null;
  cross: number | null;
  within: boolean | null;
  outlier: boolean;
  pairedBy: "id" | "position";
  beyondMaxDistance: boolean;
}

// Invented checkpoints of a small Kestrel Fen bed layout: bed 1 clean, bed 3 with two plants 30 mm off along the row.
const PAIRS: Pair[] = Array.from({ length: 12 }, (_, seq) => {
  const bed = seq < 6 ? "1" : "3";
  const off = seq === 8 || seq === 9;
  const dA = off ? 0.031 : 0.001 * ((seq % 3) - 1),
    dC = 0.0005 * (seq % 2 ? 1 : -1);
  return {
    seq,
    plantId: seq === 4 ? null : `LA-${bed}-${(seq % 5) + 1}-${String(seq * 12).padStart(4, "0")}`,
    bed: seq === 11 ? null : bed,
    row: String((seq % 5) + 1),
    arm: String((seq % 5) + 1),
    fix: off ? "rtk-float" : "rtk-fixed",
    day: seq < 4 ? "2026-04-14" : "2026-04-15",
    plantedE: 662_410.5712 + seq * 0.3,
    plantedN: 5_821_331.3858 + seq * 0.7,
    dE: dA * 0.3827 + dC * 0.9239,
    dN: dA * 0.9239 - dC * 0.3827,
    along: seq === 10 ? null : dA,
    cross: seq === 10 ? null : dC,
    within: seq === 10 ? null : !off,
    outlier: off,
    pairedBy: seq === 5 ? "position" : "id",
    beyondMaxDistance: seq === 7,
  };
});

let db: DB;

beforeAll(async () => {
  db = await openDb("memory://");
  await db.insert(organization).values([
    { id: ORG, name: "Kestrel Fen Growers", slug: "kestrel" },
    { id: OTHER, name: "Saltings Field Services", slug: "saltings" },
  ]);
  await db.insert(field).values(FIELD_ROW);
  const settings = SETTINGS;
  await db.insert(audit).values([
    {
      id: AUDIT,
      orgId: ORG,
      fieldId: FIELD,
      title: "Long Acre spring check",
      state: "computed",
      profileSnapshot: PROFILE,
      settings,
      computedAt: new Date("2026-04-21T10:00:00Z"),
    },
    {
      id: OLDER,
      orgId: ORG,
      fieldId: FIELD,
      title: "Older check",
      state: "signed_off",
      profileSnapshot: PROFILE,
      settings,
      computedAt: new Date("2026-04-01T10:00:00Z"),
    },
  ]);
  await db.insert(auditResidual).values(
    PAIRS.map((p) => ({
      auditId: AUDIT,
      seq: p.seq,
      plantId: p.plantId,
      surveyId: null,
      crop: "lettuce",
      bed: p.bed,
      row: p.row,
      arm: p.arm,
      fix: p.fix,
      day: p.day,
      plantedE: p.plantedE,
      plantedN: p.plantedN,
      surveyE: p.plantedE + p.dE,
      surveyN: p.plantedN + p.dN,
      dE: p.dE,
      dN: p.dN,
      along: p.along,
      cross: p.cross,
      radial: Math.hypot(p.dE, p.dN),
      within: p.within,
      outlier: p.outlier,
      pairedBy: p.pairedBy,
      beyondMaxDistance: p.beyondMaxDistance,
    })),
  );
  await db.insert(auditUnpaired).values([
    {
      auditId: AUDIT,
      seq: 0,
      kind: "planted-not-found",
      pointId: "LA-1-1-0001",
      line: 2,
      e: 662_409.9,
      n: 5_821_330.2,
      crop: "lettuce",
      bed: "1",
      row: "1",
    },
    {
      auditId: AUDIT,
      seq: 1,
      kind: "surveyed-not-planted",
      pointId: null,
      line: 377,
      e: 662_415.25,
      n: 5_821_340.5,
      crop: null,
      bed: null,
      row: null,
    },
    {
      auditId: AUDIT,
      seq: 2,
      kind: "ambiguous",
      pointId: null,
      line: 378,
      e: 662_416,
      n: 5_821_342,
      crop: null,
      bed: null,
      row: null,
    },
  ]);
}, 120_000); // an in-memory PGlite with migrations takes a few seconds on a busy machine

describe("map queries", () => {
  it("loadMapColumns -- every stored value comes back, relative to the origin, in seq order", async () => {
    const origin: [number, number] = [662_412, 5_821_335];
    const { pairs, unpaired } = await loadMapColumns(db, {
      auditId: AUDIT,
      orgId: ORG,
      origin,
      textColumns: DICT_NAMES,
    });
    expect(pairs.count).toBe(12);
    PAIRS.forEach((p, i) => {
      expect(pairs.x[i]).toBeCloseTo(p.plantedE - origin[0], 5);
      expect(pairs.y[i]).toBeCloseTo(p.plantedN - origin[1], 5);
      expect(pairs.dE[i]).toBeCloseTo(p.dE, 7);
      expect(pairs.dN[i]).toBeCloseTo(p.dN, 7);
      if (p.along === null) expect(Number.isNaN(pairs.along[i])).toBe(true);
      else expect(pairs.along[i]).toBeCloseTo(p.along, 7);
      expect(pairs.flags[i]).toBe(pairFlags(p)); // the SQL bit arithmetic equals the documented flags
      expect(pairs.plantId[i]).toBe(p.plantId ?? "");
      expect(pairs.text.bed[i]).toBe(p.bed ?? "");
      expect(pairs.text.day[i]).toBe(p.day);
    });
    expect(unpaired.count).toBe(3);
    expect(unpaired.kind).toEqual(["planted-not-found", "surveyed-not-planted", "ambiguous"]);
    expect(unpaired.x[1]).toBeCloseTo(3.25, 5);
    expect(unpaired.text.row).toEqual(["1", "", ""]);
    // And it encodes: the same columns survive the binary payload.
    const { arrays, dict } = buildMapArrays(pairs, unpaired);
    const ctx = await getMapContext(db, { auditId: AUDIT, orgId: ORG });
    expect(ctx).toMatchObject({ fieldName: "Long Acre", bedSpacingM: 3, rowsPerBed: 5 });
    const back = decodeMapPayload(
      encodeMapPayload(
        {
          audit: { id: AUDIT, title: "t", state: "computed", fieldId: FIELD, fieldName: "Long Acre", computedAt: null },
          crs: "EPSG:25831",
          origin,
          gridConvergenceDeg: null,
          rowBearingDeg: 22.5,
          field: { bedSpacingM: 3, rowsPerBed: 5, rowSpacingM: 0.5 },
          boundary: { source: "none", ring: [] },
          profile: null,
          pairs: 12,
          unpaired: 3,
          dict,
        },
        arrays,
      ),
    );
    expect(back.meta.dict.bed).toEqual(["1", "3"]);
  });

  it("loadMapColumns -- another organisation reads nothing", async () => {
    const { pairs, unpaired } = await loadMapColumns(db, {
      auditId: AUDIT,
      orgId: OTHER,
      origin: [0, 0],
      textColumns: DICT_NAMES,
    });
    expect(pairs.count).toBe(0);
    expect(unpaired.count).toBe(0);
    expect(await getMapExtent(db, { auditId: AUDIT, orgId: OTHER })).toBeNull();
    expect(await getMapContext(db, { auditId: AUDIT, orgId: OTHER })).toBeNull();
    expect(await getMapPair(db, { auditId: AUDIT, orgId: OTHER, seq: 0 })).toBeNull();
    expect(await getMapUnpaired(db, { auditId: AUDIT, orgId: OTHER, seq: 0 })).toBeNull();
    expect(await getFieldMapSummary(db, { fieldId: FIELD, orgId: OTHER })).toBeNull();
  });

  it("getMapExtent -- spans the pairs and the unpaired points", async () => {
    const box = await getMapExtent(db, { auditId: AUDIT, orgId: ORG });
    expect(box!.minE).toBeCloseTo(662_409.9, 6);
    expect(box!.maxE).toBeCloseTo(662_416, 6); // the ambiguous survey point
    expect(box!.maxN).toBeCloseTo(5_821_342, 6);
    expect(box!.minN).toBeCloseTo(5_821_330.2, 6); // the planted record without a checkpoint
  });

  it("getMapPair -- the full record of one pair for the side panel", async () => {
    const p = await getMapPair(db, { auditId: AUDIT, orgId: ORG, seq: 8 });
    expect(p).toMatchObject({ seq: 8, bed: "3", fix: "rtk-float", within: false, outlier: true, pairedBy: "id" });
    expect(p!.surveyE - p!.plantedE).toBeCloseTo(p!.dE, 9);
    expect(await getMapPair(db, { auditId: AUDIT, orgId: ORG, seq: 99 })).toBeNull();
    expect(await getMapUnpaired(db, { auditId: AUDIT, orgId: ORG, seq: 1 })).toMatchObject({
      kind: "surveyed-not-planted",
      line: 377,
    });
  });

  it("getLatestMappedAudit -- the most recently computed audit with results", async () => {
    expect(await getLatestMappedAudit(db, { fieldId: FIELD, orgId: ORG })).toEqual({ id: AUDIT });
    expect(await getLatestMappedAudit(db, { fieldId: FIELD, orgId: OTHER })).toBeNull();
  });

  it("getFieldMapSummary -- the grower never sees guidance from an unsigned audit; a newer one is only mentioned", async () => {
    // AUDIT is newer but only computed; OLDER is signed off and has no per-plant rows.
    expect(await getLatestSignedAudit(db, { fieldId: FIELD, orgId: ORG })).toMatchObject({ id: OLDER });
    const view = await getFieldMapSummary(db, { fieldId: FIELD, orgId: ORG });
    expect(view!.audit!.id).toBe(OLDER);
    expect(view!.pending).toEqual({ id: AUDIT, title: "Long Acre spring check", state: "computed" });
    expect(view!.beds).toEqual([]);
    expect(view!.guidance).toEqual([]); // not bed 3's "do not rely" of the unsigned audit
    expect(JSON.stringify(view)).not.toMatch(/Bed 3/);
    const home = await listGrowerFields(db, { orgId: ORG });
    expect(home).toHaveLength(1);
    expect(home[0].signed!.id).toBe(OLDER);
    expect(home[0].pending!.id).toBe(AUDIT);
    expect(await listGrowerFields(db, { orgId: OTHER })).toEqual([]);
    // a field with only an unsigned audit: nothing is used, the pending one is mentioned
    const FIELD2 = "00000000-0000-4000-8000-00000000f002";
    await db.insert(field).values({ ...FIELD_ROW, id: FIELD2, name: "Far Meadow" });
    await db.insert(audit).values({
      id: "00000000-0000-4000-8000-00000000a003",
      orgId: ORG,
      fieldId: FIELD2,
      title: "Far Meadow first check",
      state: "submitted",
      profileSnapshot: PROFILE,
      settings: SETTINGS,
      computedAt: new Date("2026-04-22T10:00:00Z"),
    });
    const none = await getFieldMapSummary(db, { fieldId: FIELD2, orgId: ORG });
    expect(none!.audit).toBeNull();
    expect(none!.guidance).toEqual([]);
    expect(none!.summary).toMatch(
      /has been signed off yet\. A newer audit, “Far Meadow first check”, is waiting for sign-off/,
    );
  });

  it("getFieldMapSummary -- per-bed guidance from the stored rows equals the pure helpers on the same values", async () => {
    // Once the newer audit is signed off, the grower's view moves to it and nothing is pending.
    await db.update(audit).set({ state: "signed_off" }).where(eq(audit.id, AUDIT));
    const view = await getFieldMapSummary(db, { fieldId: FIELD, orgId: ORG });
    expect(view!.pending).toBeNull();
    expect(view!.audit).toMatchObject({ id: AUDIT, pairs: 12 });
    const cols = await loadBedColumns(db, { auditId: AUDIT, orgId: ORG });
    expect(cols.bed).toEqual(PAIRS.map((p) => p.bed ?? ""));
    expect(Array.from(cols.within)).toEqual(PAIRS.map((p) => (p.within === null ? -1 : p.within ? 1 : 0)));
    const expected = bedStats({
      bed: PAIRS.map((p) => p.bed ?? ""),
      radial: PAIRS.map((p) => Math.fround(Math.hypot(p.dE, p.dN))),
      cross: PAIRS.map((p) => (p.cross === null ? NaN : Math.fround(p.cross))),
      along: PAIRS.map((p) => (p.along === null ? NaN : Math.fround(p.along))),
      within: PAIRS.map((p) => (p.within === null ? -1 : p.within ? 1 : 0)),
      confidence: 0.95,
    });
    expect(view!.beds.map((b) => b.bed)).toEqual(["1", "3", ""]);
    view!.beds.forEach((b, i) => {
      expect(b.n).toBe(expected[i].n);
      expect(b.out).toBe(expected[i].out);
      expect(b.p95Along ?? 0).toBeCloseTo(expected[i].p95Along ?? 0, 6);
    });
    expect(view!.guidance.map((g) => g.state)).toEqual(expected.map((s) => bedGuidance(s, PROFILE).state));
    expect(view!.guidance[1].state).toBe("not-relied-on"); // bed 3: 2 of 5 checkpoints 31 mm along the row
    expect(view!.summary).toMatch(/not whether a machine is safe to run\.$/);
  });
});
