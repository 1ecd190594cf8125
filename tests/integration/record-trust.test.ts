/**
 * Trust by cause through the API on the demo farm's Long Acre files: the float-fix records (bed 3, rows 2–3) are the
 * ones not to rely on, for in-row weeding and for inter-row hoeing alike; the exclusion lists name exactly them, with
 * the audit, profile and caution; another organisation gets 404.
 */
import Papa from "papaparse";
import { beforeAll, describe, expect, it } from "vitest";
import type { AuditDto } from "@/lib/api-types";
import type { RecordTrustDto } from "@/lib/map/record-guidance";
import { ctx, req } from "./helpers";
import { createAudit, type ReviewWorld, setUpReviewWorld } from "./review-helpers";

let w: ReviewWorld;
let hoeing: AuditDto;
const floatIds = new Set<string>();

beforeAll(async () => {
  w = await setUpReviewWorld();
  hoeing = await createAudit(w, "Inter-row hoeing", "Long Acre hoeing check");
  const fs = await import("node:fs");
  const text = fs.readFileSync(`${import.meta.dirname}/../../public/demo/long-acre-as-planted.csv`, "utf8");
  const rows = Papa.parse<Record<string, string>>(text, { header: true, skipEmptyLines: true }).data;
  for (const r of rows) if (r.fix === "rtk-float") floatIds.add(r.plant_id);
}, 240_000);

async function get(path: string, who: keyof ReviewWorld["cookies"] = "grower"): Promise<Response> {
  const [pathname] = path.split("?");
  const id = pathname.split("/")[3];
  const kind = pathname.split("/")[4];
  const route =
    kind === "record-trust"
      ? await import("@/app/api/audits/[id]/record-trust/route")
      : kind === "exclusions.csv"
        ? await import("@/app/api/audits/[id]/exclusions.csv/route")
        : await import("@/app/api/audits/[id]/exclusions.geojson/route");
  return route.GET(req(path, { cookie: w.cookies[who] }), ctx({ id }));
}

describe("record trust through the API", () => {
  it("record trust -- in-row weeding: the float-fix records are named and the rest relied on", async () => {
    // The demo files hold 160 float-fix records (generator: bed 3, rows 2–3, plants 31–110)
    expect(floatIds.size).toBe(160);
    const res = await get(`/api/audits/${w.base.id}/record-trust`);
    expect(res.status).toBe(200);
    const t = (await res.json()) as RecordTrustDto;
    expect(t.named.map((n) => n.label)).toEqual(["fix quality rtk-float"]);
    expect(t.counts).toEqual({ total: 4800, rely: 4640, doNotRely: 160, notShown: 0 });
    expect(t.remainder?.word).toBe("meets");
    expect(t.rule).toMatch(/^A record is not to be relied on when/);
    expect(t.summary).toContain("Do not rely on 160 of 4,800 records for in-row weeding around plants");
  });

  it("record trust -- inter-row hoeing: the same records, by the one float checkpoint out", async () => {
    const t = (await (await get(`/api/audits/${hoeing.id}/record-trust`)).json()) as RecordTrustDto;
    expect(t.named.map((n) => [n.label, n.outside, n.n])).toEqual([["fix quality rtk-float", 1, 12]]);
    expect(t.counts.doNotRely).toBe(160);
  });

  it("record trust -- judged for another profile, the audit's errors against that profile's limits", async () => {
    const seed = w.profiles.find((p) => p.name === "Seed placement check")!;
    const res = await get(`/api/audits/${hoeing.id}/record-trust?profile=${seed.id}`);
    const t = (await res.json()) as RecordTrustDto;
    expect(t.profile).toEqual({ id: seed.id, name: "Seed placement check", own: false });
    expect(t.counts.total).toBe(4800);
    const bad = await get(`/api/audits/${hoeing.id}/record-trust?profile=not-a-uuid`);
    expect(bad.status).toBe(422);
    expect((await bad.json()).error.message).toContain("query.profile");
  });

  it("exclusions -- the CSV lists exactly the float-fix records, in the field's CRS, with audit and caution", async () => {
    const res = await get(`/api/audits/${w.base.id}/exclusions.csv`);
    expect(res.status).toBe(200);
    expect(res.headers.get("content-disposition")).toMatch(/do-not-rely_in-row-weeding-around-plants\.csv/);
    const text = (await res.text()).replace(/^\uFEFF/, "");
    const comments = text.split("\n").filter((l) => l.startsWith("#"));
    expect(comments.join("\n")).toContain(`id ${w.base.id}`);
    expect(comments.join("\n")).toContain("Coordinates: EPSG:25831, easting and northing in metres");
    expect(comments.join("\n")).toContain("stop and lock out the machine");
    expect(comments.filter((l) => l.startsWith("# Stretch:"))).toEqual([
      "# Stretch: bed 3, row 2 — LA-3-2-0031 to LA-3-2-0110 (80 records)",
      "# Stretch: bed 3, row 3 — LA-3-3-0031 to LA-3-3-0110 (80 records)",
    ]);
    const rows = Papa.parse<Record<string, string>>(text, { header: true, comments: "#", skipEmptyLines: true }).data;
    expect(new Set(rows.map((r) => r.plant_id))).toEqual(floatIds);
    expect(rows.every((r) => r.judgement === "do not rely" && r.fix === "rtk-float")).toBe(true);
    // Long Acre lies near 317,9xx E, 5,816,7xx N (ETRS89 / UTM 31N)
    expect(Number(rows[0].easting)).toBeGreaterThan(317_900);
    expect(Number(rows[0].northing)).toBeGreaterThan(5_816_600);
  });

  it("exclusions -- GeoJSON points with the audit and profile in its own member", async () => {
    const res = await get(`/api/audits/${hoeing.id}/exclusions.geojson`);
    expect(res.headers.get("content-type")).toContain("application/geo+json");
    const g = await res.json();
    expect(g.features).toHaveLength(160);
    expect(g.plotproof.profile).toBe("Inter-row hoeing");
    expect(g.plotproof.audit.id).toBe(hoeing.id);
    expect(g.plotproof.signoffSha256).toBeNull();
    expect(g.crs.properties.name).toBe("EPSG:25831");
    expect(g.features[0].geometry.type).toBe("Point");
  });

  it("record trust -- marks give the positions of the records not relied on", async () => {
    const t = await (await get(`/api/audits/${hoeing.id}/record-trust?marks=1`)).json();
    expect(t.marks.x).toHaveLength(160);
    expect(t.marks.cls.every((c: number) => c === 1)).toBe(true);
  });

  it("record trust -- another organisation gets 404 for every form", async () => {
    for (const p of ["record-trust", "exclusions.csv", "exclusions.geojson"]) {
      const res = await get(`/api/audits/${w.base.id}/${p}`, "other");
      expect(res.status, p).toBe(404);
    }
  });
});
