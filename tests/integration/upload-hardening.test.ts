import fs from "node:fs";
import path from "node:path";
import { beforeAll, describe, expect, it } from "vitest";
import { cookieFor, ctx, req, useMemoryDb } from "./helpers";
import { DEMO_PASSWORD, DEMO_PEOPLE } from "@/lib/demo/farm";
import type { DatasetDto, InputIssue } from "@/lib/api-types";

const demo = (name: string) => fs.readFileSync(path.join(import.meta.dirname, "../../public/demo", name));
let cookie: string;
let fieldsRoute: typeof import("@/app/api/fields/route");
let fieldRoute: typeof import("@/app/api/fields/[fieldId]/route");
let datasetsRoute: typeof import("@/app/api/fields/[fieldId]/datasets/route");
let fileRoute: typeof import("@/app/api/datasets/[id]/file/route");

/** A small square around the Long Acre plot, WGS 84 (longitude, latitude). */
const BOUNDARY = {
  type: "Polygon",
  coordinates: [
    [
      [5.393, 52.5175],
      [5.396, 52.5175],
      [5.396, 52.5195],
      [5.393, 52.5195],
      [5.393, 52.5175],
    ],
  ],
};

async function newField(name: string, extra: Record<string, unknown> = {}) {
  return fieldsRoute.POST(
    req("/api/fields", {
      method: "POST",
      cookie,
      body: JSON.stringify({ name, farm: "Kestrel Fen", crs: "EPSG:25831", timeZone: "Europe/Amsterdam", ...extra }),
    }),
    ctx({}),
  );
}

function upload(fieldId: string, file: Uint8Array | string, name: string, fields: Record<string, string>) {
  const form = new FormData();
  form.set("file", new File([file as BlobPart], name, { type: "text/csv" }));
  for (const [k, v] of Object.entries(fields)) form.set(k, v);
  const r = new Request(`http://localhost:3000/api/fields/${fieldId}/datasets`, {
    method: "POST",
    body: form,
    headers: { cookie },
  });
  return datasetsRoute.POST(r, ctx({ fieldId }));
}

async function datasets(fieldId: string): Promise<DatasetDto[]> {
  const res = await datasetsRoute.GET(req(`/api/fields/${fieldId}/datasets`, { cookie }), ctx({ fieldId }));
  return (await res.json()).datasets;
}

async function issuesOf(res: Response): Promise<{ code: string; issues: InputIssue[] }> {
  const body = await res.json();
  return { code: body.error?.code, issues: body.error?.issues ?? [] };
}

beforeAll(async () => {
  await useMemoryDb();
  const { seedDemo } = await import("@/lib/demo/seed");
  await seedDemo();
  cookie = await cookieFor(DEMO_PEOPLE.find((p) => p.role === "technician")!.email, DEMO_PASSWORD);
  fieldsRoute = await import("@/app/api/fields/route");
  fieldRoute = await import("@/app/api/fields/[fieldId]/route");
  datasetsRoute = await import("@/app/api/fields/[fieldId]/datasets/route");
  fileRoute = await import("@/app/api/datasets/[id]/file/route");
}, 120_000);

const PLANTED_HEAD = "plant_id,crop,bed,row,lat,lon\n";
const plantedRows = (n: number, crop = "lettuce") =>
  Array.from(
    { length: n },
    (_, i) => `P${i + 1},${crop},1,1,${(52.518 + i * 1e-6).toFixed(7)},${(5.394 + i * 1e-6).toFixed(7)}`,
  ).join("\n");

describe("bad files at upload", () => {
  let fieldId: string;

  beforeAll(async () => {
    fieldId = (await (await newField("Hardening Plot", { boundary: BOUNDARY })).json()).field.id;
  });

  it("upload -- a Latin-1 file is held back with a warning naming the encoding and line, then saved byte for byte", async () => {
    const text = `${PLANTED_HEAD}${plantedRows(3)}\nP4,Rübe,1,2,52.5181,5.3941\n`;
    const bytes = Uint8Array.from(text, (c) => c.charCodeAt(0)); // Windows-1252: one byte per character here
    const first = await upload(fieldId, bytes, "ruebe.csv", { kind: "planted", crs: "EPSG:4326" });
    expect(first.status).toBe(422);
    const held = await issuesOf(first);
    expect(held.code).toBe("warnings_unaccepted");
    expect(held.issues).toEqual([
      expect.objectContaining({
        code: "file-encoding",
        file: "ruebe.csv",
        line: 5,
        value: expect.stringContaining("Rübe"),
      }),
    ]);
    expect(held.issues[0].message).toContain("Windows-1252");
    expect(await datasets(fieldId)).toHaveLength(0);

    const saved = await upload(fieldId, bytes, "ruebe.csv", {
      kind: "planted",
      crs: "EPSG:4326",
      acceptWarnings: "true",
    });
    expect(saved.status).toBe(201);
    const dto = (await saved.json()).dataset as DatasetDto;
    const raw = await fileRoute.GET(req(`/api/datasets/${dto.id}/file`, { cookie }), ctx({ id: dto.id }));
    expect(new Uint8Array(await raw.arrayBuffer())).toEqual(bytes);
  });

  it("upload -- the same file again is held back naming the earlier upload", async () => {
    const text = `${PLANTED_HEAD}${plantedRows(3)}\nP4,Rübe,1,2,52.5181,5.3941\n`;
    const bytes = Uint8Array.from(text, (c) => c.charCodeAt(0));
    const again = await upload(fieldId, bytes, "ruebe-copy.csv", { kind: "planted", crs: "EPSG:4326" });
    expect(again.status).toBe(422);
    const { issues } = await issuesOf(again);
    const dup = issues.find((i) => i.code === "file-uploaded-before");
    expect(dup).toMatchObject({ file: "ruebe-copy.csv", value: "ruebe.csv" });
    expect(dup!.message).toMatch(/as "ruebe.csv" \(as-planted records\) on \d{4}-\d\d-\d\d \d\d:\d\d UTC/);
    expect(await datasets(fieldId)).toHaveLength(1);
  });

  it("upload -- a 2 MB value is refused naming line and column, and nothing is saved", async () => {
    const text = `${PLANTED_HEAD}${plantedRows(3)}\nP9,${"x".repeat(2 << 20)},1,1,52.518,5.394\n`;
    const res = await upload(fieldId, text, "blob.csv", { kind: "planted", crs: "EPSG:4326", acceptWarnings: "true" });
    expect(res.status).toBe(422);
    const { code, issues } = await issuesOf(res);
    expect(code).toBe("invalid_file");
    expect(issues).toEqual([expect.objectContaining({ code: "field-too-long", line: 5, column: "crop" })]);
    expect(JSON.stringify(issues).length).toBeLessThan(2000); // the value is not sent back
    expect(await datasets(fieldId)).toHaveLength(1);
  });

  it("upload -- a file thousands of km from the field's boundary (latitude sign dropped) is refused naming distance and lines", async () => {
    const text = PLANTED_HEAD + plantedRows(5).replace(/,52\./g, ",-52.");
    const res = await upload(fieldId, text, "south.csv", { kind: "planted", crs: "EPSG:4326", acceptWarnings: "true" });
    expect(res.status).toBe(422);
    const { issues } = await issuesOf(res);
    const far = issues.find((i) => i.code === "file-far-from-field")!;
    expect(far).toMatchObject({ severity: "error", file: "south.csv", line: 2 });
    expect(far.message).toMatch(/about 11,6\d\d km from the field's boundary .*lines 2, 3, 4, 5, 6/);
    expect(await datasets(fieldId)).toHaveLength(1);
  });

  it("upload -- duplicate survey point names are refused naming both lines", async () => {
    const text =
      "point,method,precision_m,lat,lon\nCP1,rtk,0.01,52.518,5.394\nCP2,rtk,0.01,52.5181,5.3941\nCP1,rtk,0.01,52.5182,5.3942\n";
    const res = await upload(fieldId, text, "checks.csv", { kind: "survey", crs: "EPSG:4326", acceptWarnings: "true" });
    expect(res.status).toBe(422);
    const { issues } = await issuesOf(res);
    expect(issues).toEqual(
      expect.arrayContaining([
        expect.objectContaining({ code: "id-duplicate", column: "point", value: "CP1", line: 4, severity: "error" }),
      ]),
    );
    expect(issues.find((i) => i.code === "id-duplicate")!.message).toContain("on lines 2, 4");
    expect(await datasets(fieldId)).toHaveLength(1);
  });

  it("upload -- a precision column in millimetres is a warning, and a survey file sent as as-planted records another", async () => {
    const rows = Array.from(
      { length: 25 },
      (_, i) => `CP${i},total-station,${i % 2 ? 4.0 : 1.5},${(52.518 + i * 1e-5).toFixed(6)},5.394`,
    );
    const text = `point,method,precision,lat,lon\n${rows.join("\n")}\n`;
    const res = await upload(fieldId, text, "checks-mm.csv", { kind: "planted", crs: "EPSG:4326" });
    expect(res.status).toBe(422);
    const { code, issues } = await issuesOf(res);
    expect(code).toBe("warnings_unaccepted");
    expect(issues.map((i) => i.code).sort()).toEqual(["file-kind-doubtful", "precision-implausible"]);
    expect(issues.find((i) => i.code === "precision-implausible")).toMatchObject({ column: "precision", line: 2 });
    expect(issues.find((i) => i.code === "file-kind-doubtful")!.message).toContain("looks like a survey file");
    expect(await datasets(fieldId)).toHaveLength(1);
  });

  it("upload -- without a boundary, a file far from the field's other files is refused", async () => {
    const plain = (await (await newField("Hardening Plain")).json()).field.id as string;
    const ok = await upload(plain, demo("long-acre-survey.csv"), "long-acre-survey.csv", {
      kind: "survey",
      crs: "EPSG:25831",
      acceptWarnings: "true",
    });
    expect(ok.status).toBe(201);
    const res = await upload(plain, PLANTED_HEAD + plantedRows(5).replace(/,5\.39/g, ",15.39"), "east.csv", {
      kind: "planted",
      crs: "EPSG:4326",
      acceptWarnings: "true",
    });
    expect(res.status).toBe(422);
    const far = (await issuesOf(res)).issues.find((i) => i.code === "file-far-from-field")!;
    expect(far.message).toContain("the field's other files (long-acre-survey.csv)");
    expect(await datasets(plain)).toHaveLength(1);
  });
});

describe("field projection", () => {
  it("field -- a UTM zone of 999 is refused on create and on edit, naming the CRS", async () => {
    const res = await newField("Zone Nowhere", { crs: "+proj=utm +zone=999" });
    expect(res.status).toBe(422);
    const body = await res.json();
    expect(body.error.code).toBe("invalid_input");
    expect(JSON.stringify(body.error.issues)).toContain("UTM zones run from 1 to 60; +zone=999 is not one.");

    const made = await newField("Zone Somewhere", { crs: "+proj=utm +zone=31 +datum=WGS84 +units=m +no_defs" });
    expect(made.status).toBe(201);
    const id = (await made.json()).field.id as string;
    const patch = await fieldRoute.PATCH(
      req(`/api/fields/${id}`, { method: "PATCH", cookie, body: JSON.stringify({ crs: "+proj=nosuch" }) }),
      ctx({ fieldId: id }),
    );
    expect(patch.status).toBe(422);
    expect(JSON.stringify((await patch.json()).error.issues)).toContain("proj4 cannot use");
    const after = await fieldRoute.GET(req(`/api/fields/${id}`, { cookie }), ctx({ fieldId: id }));
    expect((await after.json()).field.crs).toBe("+proj=utm +zone=31 +datum=WGS84 +units=m +no_defs");
  });
});
