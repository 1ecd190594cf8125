import { beforeAll, describe, expect, it } from "vitest";
import { and, count, eq } from "drizzle-orm";
import { ctx, req } from "./helpers";
import { ACTORS, cloneAudit, setUpReviewWorld, stateOf, type Actor, type ReviewWorld } from "./review-helpers";
import { activity, audit, auditPlantedNotFound, auditReport, auditResidual, auditUnpaired } from "@/db/schema";
import { logActivity } from "@/db/queries/activity";
import type { AuditDto } from "@/lib/api-types";

let w: ReviewWorld;
let recompute: typeof import("@/app/api/audits/[id]/recompute/route");
let recovery: typeof import("@/lib/server/audits/recovery");

beforeAll(async () => {
  w = await setUpReviewWorld();
  recompute = await import("@/app/api/audits/[id]/recompute/route");
  recovery = await import("@/lib/server/audits/recovery");
}, 180_000);

/** Rows stored for an audit, per table. */
async function rowCounts(id: string) {
  const [[r], [u], [c], [p]] = await Promise.all([
    w.db.select({ n: count() }).from(auditResidual).where(eq(auditResidual.auditId, id)),
    w.db.select({ n: count() }).from(auditUnpaired).where(eq(auditUnpaired.auditId, id)),
    // the planted records nobody surveyed, one compact value (issue 16)
    w.db.select({ n: count() }).from(auditPlantedNotFound).where(eq(auditPlantedNotFound.auditId, id)),
    w.db.select({ n: count() }).from(auditReport).where(eq(auditReport.auditId, id)),
  ]);
  return { residuals: r.n, unpaired: u.n, plantedNotFound: c.n, reports: p.n };
}

/**
 * A copy of the computed base audit left as a killed server leaves one: "computing" at `stage`, no summary yet,
 * and some of its rows already stored (the copy's rows, minus the reports, which are written last).
 */
async function interruptedAudit(stage: string, history: string[] = []): Promise<string> {
  const id = await cloneAudit(w.db, w.base.id, "computed");
  await w.db.delete(auditReport).where(eq(auditReport.auditId, id));
  await w.db
    .update(audit)
    .set({
      state: "computing",
      progress: 0.7,
      progressStage: stage,
      summary: null,
      verdict: null,
      computedAt: null,
    })
    .where(eq(audit.id, id));
  for (const action of history)
    await logActivity(w.db, {
      orgId: (await orgOf(id))!,
      actorId: null,
      action,
      subjectType: "audit",
      subjectId: id,
      detail: { stage },
    });
  return id;
}

async function failedAudit(error: string): Promise<string> {
  const id = await cloneAudit(w.db, w.base.id, "failed");
  await w.db
    .update(audit)
    .set({ error, progressStage: "failed", summary: null, verdict: null, computedAt: null })
    .where(eq(audit.id, id));
  return id;
}

async function orgOf(id: string): Promise<string | undefined> {
  const [row] = await w.db.select({ orgId: audit.orgId }).from(audit).where(eq(audit.id, id));
  return row?.orgId;
}

async function actionsOf(id: string) {
  return w.db
    .select({ action: activity.action, detail: activity.detail, actorId: activity.actorId })
    .from(activity)
    .where(and(eq(activity.subjectType, "audit"), eq(activity.subjectId, id)))
    .orderBy(activity.id);
}

async function auditRow(id: string) {
  const [row] = await w.db.select().from(audit).where(eq(audit.id, id));
  return row;
}

describe("audit recovery at start-up", () => {
  it("recoverInterruptedAudits -- resumes, fails after the limit, and starts counting again after a recompute", async () => {
    const baseRows = await rowCounts(w.base.id);
    expect(baseRows.residuals).toBeGreaterThan(0);
    expect(baseRows.plantedNotFound).toBe(1);
    const fresh = await interruptedAudit("saving");
    const twice = await interruptedAudit("pairing", ["audit.resumed", "audit.resumed"]);
    const reset = await interruptedAudit("statistics", [
      "audit.resumed",
      "audit.resumed",
      "audit.failed",
      "audit.recomputed",
      "audit.resumed",
    ]);
    // The partial rows are really there before recovery.
    expect((await rowCounts(fresh)).residuals).toBe(baseRows.residuals);

    const lines: string[] = [];
    const report = await recovery.recoverInterruptedAudits(w.db, { log: (l) => lines.push(l) });
    expect(report.resumed).toEqual([
      { id: fresh, stage: "saving", resumption: 1 },
      { id: reset, stage: "statistics", resumption: 2 },
    ]);
    expect(report.failed).toEqual([{ id: twice, stage: "pairing", times: 3 }]);
    expect(lines).toHaveLength(3);
    expect(lines.find((l) => l.includes(fresh))).toMatch(
      /interrupted at stage saving: computing it again \(resumption 1 of 2\)/,
    );
    expect(lines.find((l) => l.includes(twice))).toMatch(
      /interrupted at stage pairing for the third time: marked failed/,
    );

    // Failed at once, with a plain reason, and without the rows the killed computations left.
    const failed = await auditRow(twice);
    expect(failed.state).toBe("failed");
    expect(failed.error).toBe(
      "The server stopped while this audit was computing (stage: pairing), 3 times; it was not started again. " +
        "Very large files can need more memory than the server has: check the two files, then compute it again.",
    );
    expect(await rowCounts(twice)).toEqual({ residuals: 0, unpaired: 0, plantedNotFound: 0, reports: 0 });
    expect((await actionsOf(twice)).at(-1)).toMatchObject({ action: "audit.failed", detail: { error: failed.error } });

    await report.done;
    for (const id of [fresh, reset]) {
      const row = await auditRow(id);
      expect(row.state, row.error ?? "").toBe("computed");
      // The partial rows were removed before computing again: exactly one audit's worth, as the base audit has.
      expect(await rowCounts(id)).toEqual(baseRows);
      expect(row.summary).toEqual((await auditRow(w.base.id)).summary);
    }
    const freshLog = (await actionsOf(fresh)).map((a) => a.action);
    expect(freshLog.slice(-2)).toEqual(["audit.resumed", "audit.computed"]);
    expect((await actionsOf(fresh)).find((a) => a.action === "audit.resumed")?.detail).toEqual({
      stage: "saving",
      resumption: 1,
      limit: 2,
    });
    expect((await actionsOf(reset)).filter((a) => a.action === "audit.resumed").at(-1)?.detail).toMatchObject({
      resumption: 2,
    });
  });

  it("recoverInterruptedAudits -- with nothing computing, does nothing", async () => {
    const lines: string[] = [];
    const report = await recovery.recoverInterruptedAudits(w.db, { log: (l) => lines.push(l) });
    await report.done;
    expect(report.resumed).toEqual([]);
    expect(report.failed).toEqual([]);
    expect(lines).toEqual([]);
  });
});

describe("POST /api/audits/:id/recompute", () => {
  const post = (who: Actor, id: string, wait = true) =>
    recompute.POST(
      req(`/api/audits/${id}/recompute${wait ? "?wait=1" : ""}`, { method: "POST", cookie: w.cookies[who] }),
      ctx({ id }),
    );

  const EXPECT: Record<Actor, number> = { owner: 200, qa_lead: 200, technician: 200, grower: 403, other: 404 };
  for (const who of ACTORS) {
    it(`recompute -- ${who} on a failed audit gets ${EXPECT[who]}`, async () => {
      const error = "The server stopped while this audit was computing (stage: saving the results), 3 times; …";
      const id = await failedAudit(error);
      const before = await auditRow(id);
      const res = await post(who, id);
      expect(res.status, await res.clone().text()).toBe(EXPECT[who]);
      if (EXPECT[who] !== 200) {
        expect(await stateOf(w.db, id)).toBe("failed");
        expect((await auditRow(id)).error).toBe(error);
        expect((await res.json()).error.code).toBe(who === "grower" ? "forbidden" : "not_found");
        return;
      }
      const { audit: done } = (await res.json()) as { audit: AuditDto };
      expect(done).toMatchObject({ id, state: "computed", error: null });
      const after = await auditRow(id);
      // The same audit with the same inputs: files, profile copy and settings unchanged.
      expect(after.plantedDatasetId).toBe(before.plantedDatasetId);
      expect(after.surveyDatasetId).toBe(before.surveyDatasetId);
      expect(after.profileSnapshot).toEqual(before.profileSnapshot);
      expect(after.settings).toEqual(before.settings);
      expect(after.summary).toEqual((await auditRow(w.base.id)).summary);
      expect(await rowCounts(id)).toEqual(await rowCounts(w.base.id));
      const log = await actionsOf(id);
      expect(log.map((a) => a.action).slice(-2)).toEqual(["audit.recomputed", "audit.computed"]);
      expect(log.at(-2)?.detail).toEqual({ previousError: error });
      expect(log.at(-2)?.actorId).toBeTruthy();
    });
  }

  for (const state of ["computing", "computed", "submitted", "returned", "signed_off"]) {
    it(`recompute -- on a ${state} audit is 409 and nothing changes`, async () => {
      const id = await cloneAudit(w.db, w.base.id, state);
      const rows = await rowCounts(id);
      const res = await post("technician", id);
      expect(res.status).toBe(409);
      const { error } = await res.json();
      expect(error.code).toBe("conflict");
      expect(error.message).toMatch(
        state === "signed_off" ? /signed off/ : /only possible for an audit that failed to compute/,
      );
      expect(await stateOf(w.db, id)).toBe(state);
      expect(await rowCounts(id)).toEqual(rows);
    });
  }

  it("recompute -- a malformed id is 404, no session is 401", async () => {
    expect((await post("technician", "not-an-id")).status).toBe(404);
    const id = await failedAudit("x");
    const anonymous = await recompute.POST(req(`/api/audits/${id}/recompute`, { method: "POST" }), ctx({ id }));
    expect(anonymous.status).toBe(401);
    expect(await stateOf(w.db, id)).toBe("failed");
  });

  it("recompute -- without ?wait answers 202 while computing; a second click is 409", async () => {
    const id = await failedAudit("The computation failed: out of memory");
    const res = await post("technician", id, false);
    expect(res.status).toBe(202);
    expect(((await res.json()) as { audit: AuditDto }).audit.state).toBe("computing");
    const again = await post("technician", id, false);
    expect(again.status).toBe(409);
    for (let i = 0; i < 300 && (await stateOf(w.db, id)) === "computing"; i++)
      await new Promise((r) => setTimeout(r, 100));
    expect(await stateOf(w.db, id)).toBe("computed");
  });
});
