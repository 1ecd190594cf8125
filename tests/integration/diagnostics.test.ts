/** The demo season and the diagnostics read from it: planted faults found, other organisations kept out. */
import { beforeAll, describe, expect, it } from "vitest";
import { cookieFor, ctx, req, useMemoryDb } from "./helpers";
import { DEMO_PASSWORD, DEMO_PEOPLE, OTHER_OWNER } from "@/lib/demo/farm";
import { DEMO_SEASON } from "@/lib/demo/season";
import type { AuditListItemDto } from "@/lib/api-types";
import type { AuditDiagnostics } from "@/lib/audit/diagnostics";

const cookies: Record<string, string> = {};
let audits: AuditListItemDto[] = [];

beforeAll(async () => {
  await useMemoryDb();
  const { seedDemo } = await import("@/lib/demo/seed");
  await seedDemo({ season: true });
  for (const p of DEMO_PEOPLE) cookies[p.role] = await cookieFor(p.email, DEMO_PASSWORD);
  cookies.other = await cookieFor(OTHER_OWNER.email, DEMO_PASSWORD);
  const route = await import("@/app/api/audits/route");
  audits = (await (await route.GET(req("/api/audits?limit=50", { cookie: cookies.grower }), ctx({}))).json()).audits;
}, 180_000);

async function diagnostics(id: string, cookie: string) {
  const route = await import("@/app/api/audits/[id]/diagnostics/route");
  return route.GET(req(`/api/audits/${id}/diagnostics`, { cookie }), ctx({ id }));
}

describe("demo season", () => {
  it("seed -- every planting of the season is audited and ends in its state", () => {
    for (const s of DEMO_SEASON) {
      const a = audits.find((x) => x.title === s.title);
      expect(a, s.title).toBeDefined();
      expect(a!.state).toBe(s.outcome === "failed" ? "computed" : s.outcome);
      if (s.outcome === "failed") expect(a!.passed).toBe(false);
    }
  });
  it("diagnostics -- recover arm 3's 3 mm cross-row offset within 1 mm and no offset on the others", async () => {
    const a = audits.find((x) => x.title === "Long Acre April planting")!;
    const res = await diagnostics(a.id, cookies.grower);
    expect(res.status).toBe(200);
    const d = (await res.json()).diagnostics as AuditDiagnostics;
    const arm3 = d.arms.find((x) => x.arm === "3")!;
    // Planted in lib/demo/generate.ts: arm 3 records +3 mm right of the plants, so survey − planted ≈ −3 mm
    expect(arm3.basis).toBe("fixed");
    expect(Math.abs(arm3.suggestion.cross!.m + 0.003)).toBeLessThan(0.001);
    expect(arm3.sentence).toMatch(/^Arm 3: move its records \d\.\d mm ± \d\.\d mm to the left/);
    for (const arm of ["1", "4", "5"]) expect(d.arms.find((x) => x.arm === arm)!.suggestion.cross).toBeNull();
  });
  it("diagnostics -- the float episode with its exact plant range from the records", async () => {
    const a = audits.find((x) => x.title === "Long Acre April planting")!;
    const d = (await (await diagnostics(a.id, cookies.qa_lead)).json()).diagnostics as AuditDiagnostics;
    const fix = d.episodes.filter((e) => e.kind === "degraded-fix");
    expect(fix).toHaveLength(1);
    // Planted in lib/demo/generate.ts: bed 3, rows 2–3, plants k = 30–109 (ids 0031–0110) with an RTK float fix
    expect(fix[0].parts.map((p) => [p.bed, p.row, p.firstPlantId, p.lastPlantId, p.count])).toEqual([
      ["3", "2", "LA-3-2-0031", "LA-3-2-0110", 80],
      ["3", "3", "LA-3-3-0031", "LA-3-3-0110", 80],
    ]);
    expect(fix[0].fixValues).toEqual(["rtk-float"]);
    const jump = d.episodes.find((e) => e.kind === "error-jump");
    expect(jump?.duringDegradedFix).toBe(true);
    // The camera correction removes most of the raw GNSS error (raw: ~20 mm drift + 12 mm noise)
    expect(d.cameraGain[0].gain!).toBeGreaterThan(0.5);
  });
  it("diagnostics -- the June planting's whole-pass shift is found and named", async () => {
    const a = audits.find((x) => x.title === "Long Acre June planting")!;
    const body = await (await diagnostics(a.id, cookies.technician)).json();
    const d = body.diagnostics as AuditDiagnostics;
    // Planted: records shifted +15 mm east, −8 mm north, so survey − planted ≈ (−15, +8) mm (the arm biases and the
    // float stretch add about a millimetre to the mean)
    expect(Math.abs(d.similarity!.shiftE.value + 0.015)).toBeLessThan(0.002);
    expect(Math.abs(d.similarity!.shiftN.value - 0.008)).toBeLessThan(0.002);
    expect(d.similarity!.causes[0]).toMatchObject({ part: "shift", significant: true });
    // Compared with the May planting of the same field
    expect(body.previous.title).toBe("Long Acre May planting");
    expect(body.previous.comparison.rmseR.significant).toBe(true);
    expect(body.previous.comparison.sentence).toMatch(/^Horizontal RMSE rose/);
  });
  it("diagnostics.csv -- one table with arms, bed × row and episodes", async () => {
    const a = audits.find((x) => x.title === "Long Acre April planting")!;
    const route = await import("@/app/api/audits/[id]/diagnostics.csv/route");
    const res = await route.GET(
      req(`/api/audits/${a.id}/diagnostics.csv`, { cookie: cookies.grower }),
      ctx({ id: a.id }),
    );
    expect(res.status).toBe(200);
    const text = await res.text();
    expect(text).toContain("episode,2,3,2,80,,,,,,,,,LA-3-2-0031,LA-3-2-0110");
    expect(text.split("\n").filter((l) => l.startsWith("arm,"))).toHaveLength(5);
  });
  it("diagnostics -- another organisation gets 404; a wrong reference frame shows as a shift", async () => {
    const a = audits.find((x) => x.title === "Long Acre April planting")!;
    expect((await diagnostics(a.id, cookies.other)).status).toBe(404);
    const route = await import("@/app/api/audits/[id]/diagnostics.csv/route");
    const csv = await route.GET(
      req(`/api/audits/${a.id}/diagnostics.csv`, { cookie: cookies.other }),
      ctx({ id: a.id }),
    );
    expect(csv.status).toBe(404);
    const failed = audits.find((x) => x.title === "Willow Strip June planting")!;
    const d = (await (await diagnostics(failed.id, cookies.owner)).json()).diagnostics as AuditDiagnostics;
    // ED50 read as ETRS89: a shift of about a hundred metres, named as base station or reference frame
    expect(d.similarity!.causes[0].sentence).toMatch(/reference frame/);
  });
});

describe("season", () => {
  it("season -- the field's audits in planting order with signed ones marked; another organisation gets 404", async () => {
    const fieldsRoute = await import("@/app/api/fields/route");
    const fields = (await (await fieldsRoute.GET(req("/api/fields", { cookie: cookies.grower }), ctx({}))).json())
      .fields;
    const fieldId = fields.find((f: { name: string }) => f.name === "Long Acre").id as string;
    const route = await import("@/app/api/fields/[fieldId]/season/route");
    const res = await route.GET(req(`/api/fields/${fieldId}/season`, { cookie: cookies.grower }), ctx({ fieldId }));
    expect(res.status).toBe(200);
    const season = await res.json();
    expect(
      season.points.map((p: { title: string; signed: boolean; day: string }) => [p.title, p.signed, p.day]),
    ).toEqual([
      ["Long Acre April planting", true, "2026-04-14"],
      ["Long Acre May planting", false, "2026-05-19"],
      ["Long Acre June planting", false, "2026-06-16"],
    ]);
    const arm3 = season.points[0].arms.find((a: { arm: string }) => a.arm === "3");
    expect(Math.abs(arm3.cross + 0.003)).toBeLessThan(0.001);
    const other = await route.GET(req(`/api/fields/${fieldId}/season`, { cookie: cookies.other }), ctx({ fieldId }));
    expect(other.status).toBe(404);
  });
});
