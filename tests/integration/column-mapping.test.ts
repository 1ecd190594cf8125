import fs from "node:fs";
import path from "node:path";
import { beforeAll, describe, expect, it } from "vitest";
import { cookieFor, ctx, req, useMemoryDb } from "./helpers";
import { DEMO_PASSWORD, DEMO_PEOPLE } from "@/lib/demo/farm";
import { readPoints } from "@/geo";
import type { DatasetDto, PresetDto, UploadOkDto } from "@/lib/api-types";

// The demo as-planted file has a fix column with RTK-fixed and RTK-float rows: read, it gives the
// "fix-mixed" warning; not read, it gives none.
const AS_PLANTED = fs.readFileSync(path.join(import.meta.dirname, "../../public/demo/long-acre-as-planted.csv"));
let cookie: string;
let fieldId: string;
let datasetsRoute: typeof import("@/app/api/fields/[fieldId]/datasets/route");
let presetsRoute: typeof import("@/app/api/presets/route");

function upload(fields: Record<string, string>) {
  const form = new FormData();
  form.set("file", new File([new Uint8Array(AS_PLANTED)], "long-acre-as-planted.csv", { type: "text/csv" }));
  for (const [k, v] of Object.entries(fields)) form.set(k, v);
  return datasetsRoute.POST(
    new Request(`http://localhost:3000/api/fields/${fieldId}/datasets`, {
      method: "POST",
      body: form,
      headers: { cookie },
    }),
    ctx({ fieldId }),
  );
}

async function presets(): Promise<PresetDto[]> {
  return (await (await presetsRoute.GET(req("/api/presets?kind=planted", { cookie }), ctx({}))).json()).presets;
}

beforeAll(async () => {
  await useMemoryDb();
  const { seedDemo } = await import("@/lib/demo/seed");
  await seedDemo();
  cookie = await cookieFor(DEMO_PEOPLE.find((p) => p.role === "technician")!.email, DEMO_PASSWORD);
  const fieldsRoute = await import("@/app/api/fields/route");
  datasetsRoute = await import("@/app/api/fields/[fieldId]/datasets/route");
  presetsRoute = await import("@/app/api/presets/route");
  const fields = (await (await fieldsRoute.GET(req("/api/fields", { cookie }), ctx({}))).json()).fields;
  fieldId = fields.find((f: { name: string }) => f.name === "Long Acre").id;
}, 120_000);

describe("column mapping with roles not in the file", () => {
  it("upload -- fix: null leaves the fix column unread, and the stored mapping keeps the null", async () => {
    const res = await upload({
      kind: "planted",
      mapping: JSON.stringify({ fix: null }),
      presetName: "Planter without fix",
    });
    expect(res.status).toBe(201);
    const body = (await res.json()) as UploadOkDto;
    expect(body.warnings).toEqual([]);
    expect(body.columns.columns.fix).toBeUndefined();
    expect(body.columns.unused).toContain("fix");
    expect(body.dataset.mapping).toMatchObject({ fix: null, id: "plant_id", x: "lon", y: "lat", arm: "arm" });

    const listed = (
      await (await datasetsRoute.GET(req(`/api/fields/${fieldId}/datasets`, { cookie }), ctx({ fieldId }))).json()
    ).datasets as DatasetDto[];
    const stored = listed.find((d) => d.id === body.dataset.id)!;
    expect(stored.mapping).toHaveProperty("fix", null);
    // Reading the file again with the stored mapping (as the review does) must not guess the fix column back.
    const again = await readPoints([new Uint8Array(AS_PLANTED)], {
      source: "long-acre-as-planted.csv",
      role: "planted",
      mapping: stored.mapping!,
    });
    expect(again.table!.attrs.fix).toBeUndefined();
    expect(again.table!.attrs.arm).toBeDefined();

    // The preset saved with the upload keeps the null too.
    expect((await presets()).find((p) => p.name === "Planter without fix")?.mapping).toHaveProperty("fix", null);
  });

  it("upload -- without a mapping the fix column is guessed and its mixed qualities need accepting", async () => {
    const res = await upload({ kind: "planted" });
    expect(res.status).toBe(422);
    const body = await res.json();
    expect(body.error.code).toBe("warnings_unaccepted");
    // The same bytes were saved by the test before: that is named too.
    expect(body.error.issues.map((i: { code: string }) => i.code)).toEqual(["fix-mixed", "file-uploaded-before"]);
  });

  it("upload -- x: null is refused with the engine's error; an empty string is refused as invalid input", async () => {
    const x = await upload({ kind: "planted", mapping: JSON.stringify({ x: null }) });
    expect(x.status).toBe(422);
    const xb = await x.json();
    expect(xb.error.code).toBe("invalid_file");
    expect(xb.error.issues.map((i: { code: string }) => i.code)).toEqual(["mapping-coordinate-not-in-file"]);

    const empty = await upload({ kind: "planted", mapping: JSON.stringify({ fix: "" }) });
    expect(empty.status).toBe(422);
    expect(await empty.json()).toMatchObject({ error: { code: "invalid_input", issues: [{ path: ["mapping"] }] } });
  });

  it("presets -- null roles are stored and given back unchanged; unknown roles are refused", async () => {
    const mapping = {
      id: "plant_id",
      fix: null,
      arm: null,
      rawX: "raw_lon",
      rawY: "raw_lat",
      coordinates: "geographic",
    };
    const res = await presetsRoute.POST(
      req("/api/presets", {
        method: "POST",
        cookie,
        body: JSON.stringify({ name: "Hand-held export", kind: "planted", mapping }),
      }),
      ctx({}),
    );
    expect(res.status).toBe(201);
    expect((await res.json()).preset.mapping).toEqual(mapping);
    expect((await presets()).find((p) => p.name === "Hand-held export")?.mapping).toEqual(mapping);

    const bad = await presetsRoute.POST(
      req("/api/presets", {
        method: "POST",
        cookie,
        body: JSON.stringify({ name: "Typo", kind: "planted", mapping: { fixx: null } }),
      }),
      ctx({}),
    );
    expect(bad.status).toBe(422);
  });
});
