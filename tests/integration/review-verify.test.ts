import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { sql } from "drizzle-orm";
import { ctx, req } from "./helpers";
import { cloneAudit, setUpReviewWorld, signoffBody, type ReviewWorld } from "./review-helpers";
import { captureMail, type MailCapture } from "@/lib/server/mail/testing";
import type { VerificationDto } from "@/lib/review/types";

let w: ReviewWorld;
let mail: MailCapture;
let submitRoute: typeof import("@/app/api/audits/[id]/submit/route");
let signoffRoute: typeof import("@/app/api/audits/[id]/signoff/route");
let verifyRoute: typeof import("@/app/api/audits/[id]/verify/route");
let activityRoute: typeof import("@/app/api/audits/[id]/activity/route");

beforeAll(async () => {
  mail = await captureMail();
  w = await setUpReviewWorld();
  submitRoute = await import("@/app/api/audits/[id]/submit/route");
  signoffRoute = await import("@/app/api/audits/[id]/signoff/route");
  verifyRoute = await import("@/app/api/audits/[id]/verify/route");
  activityRoute = await import("@/app/api/audits/[id]/activity/route");
}, 180_000);

afterAll(async () => {
  await mail?.stop();
});

async function signedAudit(): Promise<{ id: string; sha256: string }> {
  const id = await cloneAudit(w.db, w.base.id, "computed");
  expect(
    (
      await submitRoute.POST(
        req(`/api/audits/${id}/submit`, { method: "POST", cookie: w.cookies.technician }),
        ctx({ id }),
      )
    ).status,
  ).toBe(200);
  const res = await signoffRoute.POST(
    req(`/api/audits/${id}/signoff`, {
      method: "POST",
      cookie: w.cookies.qa_lead,
      body: JSON.stringify(signoffBody("qa_lead")),
    }),
    ctx({ id }),
  );
  expect(res.status).toBe(201);
  return { id, sha256: (await res.json()).review.signoff.sha256 };
}

async function verify(id: string): Promise<VerificationDto> {
  const res = await verifyRoute.POST(
    req(`/api/audits/${id}/verify`, { method: "POST", cookie: w.cookies.grower }),
    ctx({ id }),
  );
  expect(res.status).toBe(200);
  return (await res.json()).verification;
}

const check = (v: VerificationDto, id: string) => v.checks.filter((c) => c.id === id);

/** Change stored data behind the application's back, as someone with database access could (triggers off). */
async function tamper(statement: ReturnType<typeof sql>): Promise<void> {
  // One transaction, so the setting and the statement share a connection on a server's pool too.
  await w.db.transaction(async (tx) => {
    await tx.execute(sql`set local session_replication_role = replica`);
    await tx.execute(statement);
  });
}

describe("verify -- re-computing from the raw files against the signed record", () => {
  it("verify -- an untouched signed-off audit: every check passes and all three hashes agree", async () => {
    const { id, sha256 } = await signedAudit();
    const v = await verify(id);
    expect(v.checks.filter((c) => !c.ok)).toEqual([]);
    expect(v).toMatchObject({
      ok: true,
      signed: true,
      signedSha256: sha256,
      storedSha256: sha256,
      recomputedSha256: sha256,
    });
    expect(v.checks.map((c) => c.id)).toEqual([
      "record",
      "raw-files",
      "stored-points",
      "raw-files",
      "stored-points",
      "stored-results",
      "recomputed-results",
      "stored-hash",
      "recomputed-hash",
    ]);
  });

  it("verify -- a residual changed directly in the database is reported as a mismatch, loudly and precisely", async () => {
    const { id, sha256 } = await signedAudit();
    await tamper(
      sql`update audit_residual set de = de + 0.003, radial = radial + 0.003 where audit_id = ${id} and seq = 5`,
    );
    const v = await verify(id);
    expect(v.ok).toBe(false);
    expect(v.signedSha256).toBe(sha256);
    expect(v.storedSha256).not.toBe(sha256);
    // What is stored no longer matches what was signed …
    const stored = check(v, "stored-results")[0];
    expect(stored.ok).toBe(false);
    expect(stored.differences!.map((d) => d.path)).toEqual(["results.residuals.sha256"]);
    expect(stored.text).toMatch(
      /^The database no longer holds what was signed: results\.residuals\.sha256 was [0-9a-f]{16}…, is [0-9a-f]{16}…$/,
    );
    expect(check(v, "stored-hash")[0].ok).toBe(false);
    // … while the raw files still reproduce the signed results, which shows where the change was made.
    expect(check(v, "recomputed-results")[0].ok).toBe(true);
    expect(check(v, "recomputed-hash")[0].ok).toBe(true);
    expect(check(v, "record")[0].ok).toBe(true);
    const { activity } = await (
      await activityRoute.GET(req(`/api/audits/${id}/activity`, { cookie: w.cookies.owner }), ctx({ id }))
    ).json();
    expect(activity.at(-1).text).toBe(
      "Ansel Brookes verified it: MISMATCH (Stored results as signed, Hash of the stored audit).",
    );
  });

  it("verify -- a changed headline figure is named with both values", async () => {
    const { id } = await signedAudit();
    await tamper(sql`update audit set summary = jsonb_set(summary, '{rmseR}', '0.0042'::jsonb) where id = ${id}`);
    const v = await verify(id);
    expect(v.ok).toBe(false);
    const d = check(v, "stored-results")[0].differences!;
    expect(d).toHaveLength(1);
    expect(d[0]).toMatchObject({ path: "results.summary.rmseR", now: 0.0042 });
    expect(d[0].signed).toBeCloseTo(w.base.summary!.rmseR!, 12);
  });

  it("verify -- a changed raw file is caught by its hash and by the re-computation", async () => {
    const { id } = await signedAudit();
    await tamper(sql`update dataset_file set bytes = bytes || '\\x0a'::bytea where dataset_id = ${w.survey.id}`);
    try {
      const v = await verify(id);
      expect(v.ok).toBe(false);
      const raw = check(v, "raw-files").find((c) => c.label.includes("survey"))!;
      expect(raw.ok).toBe(false);
      expect(raw.text).toContain("long-acre-survey.csv now hashes to");
      expect(check(v, "recomputed-hash")[0].ok).toBe(false);
      expect(check(v, "stored-results")[0].ok).toBe(true);
    } finally {
      await tamper(
        sql`update dataset_file set bytes = substring(bytes from 1 for length(bytes) - 1) where dataset_id = ${w.survey.id}`,
      );
    }
  });

  it("verify -- a changed sign-off record no longer hashes to its own hash", async () => {
    const { id } = await signedAudit();
    await tamper(
      sql`update audit_signoff set canonical = replace(canonical, '"deviation":true', '"deviation":false') where audit_id = ${id}`,
    );
    const v = await verify(id);
    expect(check(v, "record")[0]).toMatchObject({ ok: false, label: "Sign-off record intact" });
    expect(v.ok).toBe(false);
  });

  it("verify -- deleting the profile a signed-off audit used only clears the link; the audit keeps its copy and still verifies", async () => {
    const profilesRoute = await import("@/app/api/profiles/route");
    const profileRoute = await import("@/app/api/profiles/[id]/route");
    const weeding = w.profiles.find((p) => p.name === "In-row weeding around plants")!;
    const { id: _i, builtIn: _b, updatedAt: _u, ...copy } = weeding;
    const created = await profilesRoute.POST(
      req("/api/profiles", {
        method: "POST",
        cookie: w.cookies.qa_lead,
        body: JSON.stringify({ ...copy, name: "Weeding copy for this test" }),
      }),
      ctx({}),
    );
    expect(created.status).toBe(201);
    const { profile } = await created.json();
    const id = await cloneAudit(w.db, w.base.id, "computed");
    await w.db.execute(sql`update audit set profile_id = ${profile.id} where id = ${id}`);
    expect(
      (
        await submitRoute.POST(
          req(`/api/audits/${id}/submit`, { method: "POST", cookie: w.cookies.technician }),
          ctx({ id }),
        )
      ).status,
    ).toBe(200);
    expect(
      (
        await signoffRoute.POST(
          req(`/api/audits/${id}/signoff`, {
            method: "POST",
            cookie: w.cookies.qa_lead,
            body: JSON.stringify(signoffBody("qa_lead")),
          }),
          ctx({ id }),
        )
      ).status,
    ).toBe(201);
    const del = await profileRoute.DELETE(
      req(`/api/profiles/${profile.id}`, { method: "DELETE", cookie: w.cookies.qa_lead }),
      ctx({ id: profile.id }),
    );
    expect(del.status).toBe(204);
    const row = (
      await w.db.execute<{ profile_id: string | null; state: string }>(
        sql`select profile_id, state from audit where id = ${id}`,
      )
    ).rows[0];
    expect(row).toEqual({ profile_id: null, state: "signed_off" });
    expect((await verify(id)).ok).toBe(true);
    // Clearing the link is the only change let through: anything else on the same row is still refused.
    const err = await w.db.execute(sql`update audit set profile_id = null, title = 'x' where id = ${id}`).then(
      () => null,
      (e: Error & { cause?: Error }) => e,
    );
    expect(String(err?.cause?.message ?? err?.message)).toMatch(/^plotproof: audit .* is signed off/);
  });

  it("verify -- an audit not yet signed: re-computed results are compared with the stored ones, without hashes", async () => {
    const v = await verify(w.base.id);
    expect(v).toMatchObject({
      ok: true,
      signed: false,
      signedSha256: null,
      storedSha256: null,
      recomputedSha256: null,
    });
    expect(v.checks.map((c) => c.id)).toEqual([
      "raw-files",
      "stored-points",
      "raw-files",
      "stored-points",
      "recomputed-results",
    ]);
    const id = await cloneAudit(w.db, w.base.id, "computed");
    await w.db.execute(sql`update audit_residual set dn = dn - 0.001 where audit_id = ${id} and seq = 0`);
    const bad = await verify(id);
    expect(bad.ok).toBe(false);
    expect(check(bad, "recomputed-results")[0].differences!.map((d) => d.path)).toEqual(["results.residuals.sha256"]);
  });

  it("verify -- an audit signed under an older engine's rules: the different re-computation is explained, not failed", async () => {
    // What an audit computed before engine versions were kept looks like: no engineVersion, a figure the old rule gave.
    const id = await cloneAudit(w.db, w.base.id, "computed");
    await w.db.execute(
      sql`update audit set summary = jsonb_set(summary - 'engineVersion', '{withinTolerance,lower}', '0.5'::jsonb) where id = ${id}`,
    );
    const submitted = await submitRoute.POST(
      req(`/api/audits/${id}/submit`, { method: "POST", cookie: w.cookies.technician }),
      ctx({ id }),
    );
    expect(submitted.status).toBe(200);
    const signed = await signoffRoute.POST(
      req(`/api/audits/${id}/signoff`, {
        method: "POST",
        cookie: w.cookies.qa_lead,
        body: JSON.stringify(signoffBody("qa_lead")),
      }),
      ctx({ id }),
    );
    expect(signed.status).toBe(201);
    const v = await verify(id);
    expect(v.ok).toBe(true);
    for (const c of ["record", "stored-results", "stored-hash"]) expect(check(v, c)[0].ok, c).toBe(true);
    const recomputed = check(v, "recomputed-results")[0];
    expect(recomputed).toMatchObject({ ok: true, informational: true });
    expect(recomputed.text).toContain("computed by engine version 1");
    expect(recomputed.differences!.map((d) => d.path)).toContain("results.summary.engineVersion");
    expect(check(v, "recomputed-hash")[0]).toMatchObject({ ok: true, informational: true });
  });

  it("verify -- the same difference under today's engine version is a failure", async () => {
    const { id } = await signedAudit();
    await tamper(
      sql`update audit set summary = jsonb_set(summary, '{withinTolerance,lower}', '0.5'::jsonb) where id = ${id}`,
    );
    const v = await verify(id);
    expect(v.ok).toBe(false);
    expect(check(v, "recomputed-results")[0].informational).toBeUndefined();
  });
});
