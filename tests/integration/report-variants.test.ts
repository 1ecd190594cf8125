/** The spreadsheet variants of the CSV reports, through the routes: made from stored rows, the stored reports untouched. */
import fs from "node:fs";
import path from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { eq } from "drizzle-orm";
import { ctx, req } from "./helpers";
import { cloneAudit, setUpReviewWorld, signoffBody, type ReviewWorld } from "./review-helpers";
import { auditReport } from "@/db/schema";
import { captureMail, type MailCapture } from "@/lib/server/mail/testing";

let w: ReviewWorld;
let mail: MailCapture;
let residualsCsv: typeof import("@/app/api/audits/[id]/residuals.csv/route");
let summaryCsv: typeof import("@/app/api/audits/[id]/summary.csv/route");
let signedId: string;

beforeAll(async () => {
  mail = await captureMail();
  w = await setUpReviewWorld();
  residualsCsv = await import("@/app/api/audits/[id]/residuals.csv/route");
  summaryCsv = await import("@/app/api/audits/[id]/summary.csv/route");
  const signoff = await import("@/app/api/audits/[id]/signoff/route");
  signedId = await cloneAudit(w.db, w.base.id, "submitted");
  const res = await signoff.POST(
    req(`/api/audits/${signedId}/signoff`, {
      method: "POST",
      cookie: w.cookies.qa_lead,
      body: JSON.stringify(signoffBody("qa_lead")),
    }),
    ctx({ id: signedId }),
  );
  if (res.status !== 201) throw new Error(`sign-off: ${res.status} ${await res.text()}`);
}, 180_000);

afterAll(async () => {
  await mail?.stop();
});

const get = (route: typeof residualsCsv, id: string, query: string, who: keyof ReviewWorld["cookies"] = "grower") =>
  route.GET(req(`/api/audits/${id}/x.csv${query}`, { cookie: w.cookies[who] }), ctx({ id }));

const linesOf = (text: string) =>
  text
    .replace(/^\uFEFF/, "")
    .split("\r\n")
    .filter((l) => l !== "");

async function storedBytes(id: string, kind: string): Promise<Buffer> {
  const parts = await w.db.select().from(auditReport).where(eq(auditReport.auditId, id));
  return Buffer.concat(
    parts
      .filter((p) => p.kind === kind)
      .sort((a, b) => a.part - b.part)
      .map((p) => Buffer.from(p.bytes!)),
  );
}

describe("report variants -- GET residuals.csv and summary.csv with units and sep", () => {
  it("residuals.csv -- without a format the stored report byte for byte, named as before", async () => {
    const res = await get(residualsCsv, signedId, "");
    expect(res.status).toBe(200);
    expect(Buffer.from(await res.arrayBuffer()).equals(await storedBytes(signedId, "residuals"))).toBe(true);
    expect(res.headers.get("content-disposition")).toMatch(/_residuals\.csv"/);
  });

  it("residuals.csv -- ?units=mm&sep=semicolon: one line per pair, decimal commas, planting day and local time", async () => {
    const res = await get(residualsCsv, signedId, "?units=mm&sep=semicolon");
    expect(res.status).toBe(200);
    expect(res.headers.get("content-type")).toBe("text/csv; charset=utf-8");
    expect(res.headers.get("content-disposition")).toMatch(/_residuals-mm-semicolon\.csv"/);
    const lines = linesOf(await res.text());
    expect(lines).toHaveLength(w.base.summary!.pairs + 1);
    const header = lines[0].split(";");
    const first = lines[1].split(";");
    const at = (name: string) => first[header.indexOf(name)];
    // The planting time of that plant in the uploaded file (public/demo/long-acre-as-planted.csv, planted_at in UTC).
    const planted = fs.readFileSync(
      path.join(import.meta.dirname, "../../public/demo/long-acre-as-planted.csv"),
      "utf8",
    );
    const record = planted.split("\n").find((l) => l.startsWith(`${at("plant id")},`))!;
    const iso = record.split(",")[7];
    expect(iso).toMatch(/^2026-04-\d\dT\d\d:\d\d:\d\d\.\d{3}Z$/);
    expect(at("planted at (UTC)")).toBe(`${iso.slice(0, 10)} ${iso.slice(11, 19)}`);
    // Europe/London is UTC+1 in April (BST, IANA tzdb)
    const local = new Date(Date.parse(iso) + 1 * 3_600_000).toISOString();
    expect(at("planting time (Europe/London)")).toBe(local.slice(11, 19));
    expect(at("planting day (Europe/London)")).toBe(local.slice(0, 10));
    expect(at("distance (mm)")).toMatch(/^\d+(,\d)?$/);
    expect(at("planted east (m)")).toMatch(/^\d+,\d{1,4}$/);
  });

  it("residuals.csv -- metres with commas agree with the stored report's radial_m", async () => {
    const stored = (await storedBytes(signedId, "residuals")).toString("utf8").trim().split("\n");
    const storedHeader = stored[0].split(",");
    const storedFirst = stored[1].split(",");
    const res = await get(residualsCsv, signedId, "?units=m&sep=comma");
    expect(res.headers.get("content-disposition")).toMatch(/_residuals-m-comma\.csv"/);
    const lines = linesOf(await res.text());
    const header = lines[0].split(",");
    const first = lines[1].split(",");
    expect(first[header.indexOf("plant id")]).toBe(storedFirst[storedHeader.indexOf("plant_id")]);
    expect(first[header.indexOf("distance (m)")]).toBe(storedFirst[storedHeader.indexOf("radial_m")]);
  });

  it("summary.csv -- labelled rows with units, the title, profile, verdict and the sign-off hash", async () => {
    const signoff = await import("@/app/api/audits/[id]/signoff/route");
    const review = (
      await (
        await signoff.GET(req(`/api/audits/${signedId}/signoff`, { cookie: w.cookies.grower }), ctx({ id: signedId }))
      ).json()
    ).review;
    const res = await get(summaryCsv, signedId, "?sep=semicolon");
    expect(res.status).toBe(200);
    expect(res.headers.get("content-disposition")).toMatch(/_summary-mm-semicolon\.csv"/);
    const lines = linesOf(await res.text());
    expect(lines[0]).toBe("label;value;unit");
    expect(lines).toContain("Field;Long Acre;");
    expect(lines).toContain("State;Signed off;");
    expect(lines).toContain("Tolerance profile;In-row weeding around plants;");
    expect(lines).toContain("Verdict;Fail;");
    expect(lines).toContain(`Pairs (checkpoints);${w.base.summary!.pairs};count`);
    expect(lines).toContain(`Sign-off hash (SHA-256);${review.signoff.sha256};`);
    expect(lines.find((l) => l.startsWith("Horizontal RMSE;"))).toMatch(/^Horizontal RMSE;\d+,\d;mm$/);
    expect(lines.some((l) => l.includes("signed_off") || l.includes("withinTolerance"))).toBe(false);
  });

  it("summary.csv -- an audit not signed has no sign-off lines; the stored summary is unchanged", async () => {
    const lines = linesOf(await (await get(summaryCsv, w.base.id, "?units=m")).text());
    expect(lines[0]).toBe("label,value,unit");
    expect(lines.some((l) => l.startsWith("Sign-off hash"))).toBe(false);
    const stored = await (await get(summaryCsv, w.base.id, "")).arrayBuffer();
    expect(Buffer.from(stored).equals(await storedBytes(w.base.id, "summary"))).toBe(true);
  });

  it("report variants -- a bad format is 422 naming the parameter; another organisation gets 404", async () => {
    const bad = await get(residualsCsv, signedId, "?units=cm");
    expect(bad.status).toBe(422);
    expect((await bad.json()).error.message).toContain("query.units");
    const foreign = await get(summaryCsv, signedId, "?units=mm", "other");
    expect(foreign.status).toBe(404);
  });
});
