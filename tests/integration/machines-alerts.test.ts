/** Machines, the comparison and season by machine, and alerts: role checks, other organisations kept out. */
import fs from "node:fs";
import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import { sql } from "drizzle-orm";
import { cookieFor, ctx, req, useMemoryDb } from "./helpers";
import type { DB } from "@/db/client";
import { DEMO_PASSWORD, DEMO_PEOPLE, OTHER_OWNER } from "@/lib/demo/farm";
import { DEMO_ALERT_RULES, DEMO_MACHINES } from "@/lib/demo/season";
import type { AuditDto, AuditListItemDto } from "@/lib/api-types";
import type { AlertDto, MachineDto } from "@/lib/machine-types";
import { captureMail, type MailCapture } from "@/lib/server/mail/testing";

const cookies: Record<string, string> = {};
let db: DB;
let audits: AuditListItemDto[] = [];
let machines: MachineDto[] = [];
let fieldIds: Record<string, string> = {};
let mail: MailCapture;

const machinesRoute = () => import("@/app/api/machines/route");
const machineRoute = () => import("@/app/api/machines/[id]/route");
const rulesRoute = () => import("@/app/api/alerts/rules/route");
const alertsRoute = () => import("@/app/api/alerts/route");

function json(url: string, method: string, cookie: string, body?: unknown) {
  return req(url, { method, cookie, body: body === undefined ? undefined : JSON.stringify(body) });
}

function upload(cookie: string, fieldId: string, path: string, fields: Record<string, string>) {
  const form = new FormData();
  form.set("file", new File([new Uint8Array(fs.readFileSync(path))], path.split("/").pop()!, { type: "text/csv" }));
  for (const [k, v] of Object.entries(fields)) form.set(k, v);
  return import("@/app/api/fields/[fieldId]/datasets/route").then((r) =>
    r.POST(
      new Request(`http://localhost:3000/api/fields/${fieldId}/datasets`, {
        method: "POST",
        body: form,
        headers: { cookie },
      }),
      ctx({ fieldId }),
    ),
  );
}

beforeAll(async () => {
  db = await useMemoryDb();
  mail = await captureMail();
  const { seedDemo } = await import("@/lib/demo/seed");
  await seedDemo({ season: true });
  for (const p of DEMO_PEOPLE) cookies[p.role] = await cookieFor(p.email, DEMO_PASSWORD);
  cookies.other = await cookieFor(OTHER_OWNER.email, DEMO_PASSWORD);
  const route = await import("@/app/api/audits/route");
  audits = (await (await route.GET(req("/api/audits?limit=50", { cookie: cookies.grower }), ctx({}))).json()).audits;
  machines = (
    await (await (await machinesRoute()).GET(req("/api/machines", { cookie: cookies.grower }), ctx({}))).json()
  ).machines;
  const fieldsRoute = await import("@/app/api/fields/route");
  const fields = (await (await fieldsRoute.GET(req("/api/fields", { cookie: cookies.grower }), ctx({}))).json()).fields;
  fieldIds = Object.fromEntries(fields.map((f: { id: string; name: string }) => [f.name, f.id]));
}, 240_000);

afterAll(async () => {
  await mail.stop();
});

const machineId = (name: string) => machines.find((m) => m.name === name)!.id;
const auditId = (title: string) => audits.find((a) => a.title === title)!.id;

describe("machines", () => {
  it("list -- everyone in the organisation reads the demo machines with their uploads; another organisation none", async () => {
    expect(machines.map((m) => [m.name, m.toolArms, m.workingWidthM, m.uploads])).toEqual([
      ["Reedling 5-arm transplanter", 5, 2.5, 4],
      ["Sedgeway 4-arm planter", 4, 1.6, 1],
    ]);
    const other = await (await machinesRoute()).GET(req("/api/machines", { cookie: cookies.other }), ctx({}));
    expect((await other.json()).machines).toEqual([]);
  });

  it("create -- technicians and growers are refused (403); a QA lead creates; bad input 422; a taken name 409", async () => {
    const body = { name: "Spare planter", workingWidthM: 1.5, toolArms: 3, receiverNotes: null, cameraNotes: null };
    const { POST } = await machinesRoute();
    for (const role of ["technician", "grower"])
      expect((await POST(json("/api/machines", "POST", cookies[role], body), ctx({}))).status, role).toBe(403);
    const bad = await POST(json("/api/machines", "POST", cookies.qa_lead, { ...body, toolArms: 2.5 }), ctx({}));
    expect(bad.status).toBe(422);
    expect((await bad.json()).error.message).toContain("body.toolArms");
    const created = await POST(json("/api/machines", "POST", cookies.qa_lead, body), ctx({}));
    expect(created.status).toBe(201);
    expect((await created.json()).machine).toMatchObject({ name: "Spare planter", toolArms: 3, uploads: 0 });
    const again = await POST(json("/api/machines", "POST", cookies.owner, body), ctx({}));
    expect(again.status).toBe(409);
  });

  it("edit and delete -- another organisation gets 404; a machine with uploads stays (409); an unused one goes", async () => {
    const { GET, PATCH, DELETE } = await machineRoute();
    const used = machineId(DEMO_MACHINES[0].name);
    const url = `/api/machines/${used}`;
    expect((await GET(req(url, { cookie: cookies.other }), ctx({ id: used }))).status).toBe(404);
    expect((await PATCH(json(url, "PATCH", cookies.other, { toolArms: 6 }), ctx({ id: used }))).status).toBe(404);
    expect((await DELETE(req(url, { method: "DELETE", cookie: cookies.other }), ctx({ id: used }))).status).toBe(404);
    expect((await PATCH(json(url, "PATCH", cookies.technician, { toolArms: 6 }), ctx({ id: used }))).status).toBe(403);
    const patched = await PATCH(
      json(url, "PATCH", cookies.owner, { cameraNotes: "Arm 3 camera recalibrated." }),
      ctx({ id: used }),
    );
    expect(patched.status).toBe(200);
    expect((await patched.json()).machine).toMatchObject({ cameraNotes: "Arm 3 camera recalibrated.", toolArms: 5 });
    const kept = await DELETE(req(url, { method: "DELETE", cookie: cookies.owner }), ctx({ id: used }));
    expect(kept.status).toBe(409);
    const list = (
      await (await (await machinesRoute()).GET(req("/api/machines", { cookie: cookies.owner }), ctx({}))).json()
    ).machines as MachineDto[];
    const spare = list.find((m) => m.name === "Spare planter")!;
    const gone = await DELETE(
      req(`/api/machines/${spare.id}`, { method: "DELETE", cookie: cookies.qa_lead }),
      ctx({ id: spare.id }),
    );
    expect(gone.status).toBe(204);
  });

  it("upload -- names its machine; another organisation's machine or a survey with a machine is refused and nothing saved", async () => {
    const fieldId = fieldIds["Long Acre"];
    const count = async () =>
      Number((await db.execute(sql`select count(*)::int as n from dataset`)).rows[0].n as number);
    const before = await count();
    const otherMachine = (
      await (
        await machinesRoute()
      ).POST(
        json("/api/machines", "POST", cookies.other, { name: "Saltings rig", workingWidthM: 2, toolArms: 2 }),
        ctx({}),
      )
    ).status;
    expect(otherMachine).toBe(201);
    const [{ id: foreign }] = (await db.execute(sql`select id from machine where name = 'Saltings rig'`)).rows as {
      id: string;
    }[];
    const refused = await upload(cookies.technician, fieldId, "public/demo/long-acre-as-planted.csv", {
      kind: "planted",
      crs: "EPSG:4326",
      acceptWarnings: "true",
      machineId: foreign,
    });
    expect(refused.status).toBe(422);
    expect((await refused.json()).error.message).toContain("no such machine in this organisation");
    const survey = await upload(cookies.technician, fieldId, "public/demo/long-acre-survey.csv", {
      kind: "survey",
      crs: "EPSG:25831",
      acceptWarnings: "true",
      machineId: machineId(DEMO_MACHINES[1].name),
    });
    expect(survey.status).toBe(422);
    const malformed = await upload(cookies.technician, fieldId, "public/demo/long-acre-as-planted.csv", {
      kind: "planted",
      acceptWarnings: "true",
      machineId: "not-an-id",
    });
    expect(malformed.status).toBe(422);
    expect(await count()).toBe(before);
  });

  it("audit -- carries the machine of its as-planted upload", async () => {
    const route = await import("@/app/api/audits/[id]/route");
    const id = auditId("Long Acre April planting");
    const a = (await (await route.GET(req(`/api/audits/${id}`, { cookie: cookies.grower }), ctx({ id }))).json())
      .audit as AuditDto;
    expect(a.machine).toEqual({ id: machineId(DEMO_MACHINES[0].name), name: DEMO_MACHINES[0].name });
  });
});

describe("comparison and season by machine", () => {
  async function diagnostics(title: string) {
    const route = await import("@/app/api/audits/[id]/diagnostics/route");
    const id = auditId(title);
    return (await route.GET(req(`/api/audits/${id}/diagnostics`, { cookie: cookies.grower }), ctx({ id }))).json();
  }

  it("comparison -- the machine's previous audit on another field comes before the field's", async () => {
    // Long Acre May: the transplanter's previous audit is Willow Strip May (the field's would be Long Acre April)
    const may = await diagnostics("Long Acre May planting");
    expect(may.previous).toMatchObject({ title: "Willow Strip May planting", basis: "machine" });
    expect(may.machine.name).toBe(DEMO_MACHINES[0].name);
    // Willow Strip June: the 4-arm planter's first audit, so the field's previous one
    const june = await diagnostics("Willow Strip June planting");
    expect(june.previous).toMatchObject({ title: "Willow Strip May planting", basis: "field" });
  });

  it("season -- the machine's audits on both fields in planting order, signed ones marked; another organisation 404", async () => {
    const route = await import("@/app/api/machines/[id]/season/route");
    const id = machineId(DEMO_MACHINES[0].name);
    const res = await route.GET(req(`/api/machines/${id}/season`, { cookie: cookies.grower }), ctx({ id }));
    expect(res.status).toBe(200);
    const season = await res.json();
    expect(season.machine).toMatchObject({ name: DEMO_MACHINES[0].name, toolArms: 5 });
    expect(
      season.points.map((p: { title: string; signed: boolean; fieldName: string }) => [p.title, p.signed, p.fieldName]),
    ).toEqual([
      ["Long Acre April planting", true, "Long Acre"],
      ["Willow Strip May planting", false, "Willow Strip"],
      ["Long Acre May planting", false, "Long Acre"],
      ["Long Acre June planting", false, "Long Acre"],
    ]);
    const other = await route.GET(req(`/api/machines/${id}/season`, { cookie: cookies.other }), ctx({ id }));
    expect(other.status).toBe(404);
  });
});

describe("alerts", () => {
  it("demo -- the season's audits breached the demo thresholds: arm 3, the June shift, the failed verdict", async () => {
    const res = await (await alertsRoute()).GET(req("/api/alerts", { cookie: cookies.grower }), ctx({}));
    expect(res.status).toBe(200);
    const alerts = (await res.json()).alerts as AlertDto[];
    const of = (title: string) => alerts.filter((a) => a.audit.title === title).map((a) => a.kind);
    // Planted in lib/demo/generate.ts: arm 3 records +3 mm right of the plants on every planting (limit 2 mm)
    expect(of("Long Acre April planting")).toEqual(["arm-cross-offset"]);
    expect(alerts.find((a) => a.audit.title === "Long Acre April planting")!.message).toMatch(
      /^Mean cross-row error of arm 3 [23]\.\d mm \(records right of the plants/,
    );
    // The June shift raises the RMSE well over 30 % from the May planting of the same machine
    expect(of("Long Acre June planting")).toContain("rmse-rise");
    expect(
      alerts.find((a) => a.kind === "rmse-rise" && a.audit.title === "Long Acre June planting")!.message,
    ).toContain("previous audit of the same machine (“Long Acre May planting”)");
    expect(of("Willow Strip June planting")).toContain("failed-verdict");
    expect(alerts.find((a) => a.audit.title === "Willow Strip June planting")!.machine?.name).toBe(
      DEMO_MACHINES[1].name,
    );
    const other = await (await alertsRoute()).GET(req("/api/alerts", { cookie: cookies.other }), ctx({}));
    expect((await other.json()).alerts).toEqual([]);
  });

  it("rules -- technicians and growers cannot change them (403); bad input 422; another organisation keeps its own", async () => {
    const { GET, PUT } = await rulesRoute();
    const body = { armCrossOffsetM: 0.0025, rmseRise: 0.5, failedVerdict: true };
    for (const role of ["technician", "grower"])
      expect((await PUT(json("/api/alerts/rules", "PUT", cookies[role], body), ctx({}))).status, role).toBe(403);
    const bad = await PUT(json("/api/alerts/rules", "PUT", cookies.qa_lead, { ...body, armCrossOffsetM: -1 }), ctx({}));
    expect(bad.status).toBe(422);
    expect((await bad.json()).error.message).toContain("body.armCrossOffsetM");
    const mine = (await (await GET(req("/api/alerts/rules", { cookie: cookies.technician }), ctx({}))).json()).rules;
    expect(mine).toMatchObject(DEMO_ALERT_RULES);
    const theirs = (await (await GET(req("/api/alerts/rules", { cookie: cookies.other }), ctx({}))).json()).rules;
    expect(theirs).toMatchObject({ armCrossOffsetM: null, rmseRise: null, failedVerdict: false });
    // Another organisation's owner sets theirs; ours stay
    expect((await PUT(json("/api/alerts/rules", "PUT", cookies.other, body), ctx({}))).status).toBe(200);
    expect(
      (await (await GET(req("/api/alerts/rules", { cookie: cookies.grower }), ctx({}))).json()).rules,
    ).toMatchObject(DEMO_ALERT_RULES);
  });

  it("acknowledge -- a QA lead acknowledges; a technician 403; another organisation 404", async () => {
    const { PATCH } = await import("@/app/api/alerts/[id]/route");
    const alerts = (
      await (await (await alertsRoute()).GET(req("/api/alerts?open=true", { cookie: cookies.owner }), ctx({}))).json()
    ).alerts as AlertDto[];
    const id = alerts[0].id;
    const url = `/api/alerts/${id}`;
    expect((await PATCH(json(url, "PATCH", cookies.other, { acknowledged: true }), ctx({ id }))).status).toBe(404);
    expect((await PATCH(json(url, "PATCH", cookies.technician, { acknowledged: true }), ctx({ id }))).status).toBe(403);
    expect((await PATCH(json(url, "PATCH", cookies.qa_lead, { acknowledged: true }), ctx({ id }))).status).toBe(200);
    const open = (
      await (await (await alertsRoute()).GET(req("/api/alerts?open=true", { cookie: cookies.owner }), ctx({}))).json()
    ).alerts as AlertDto[];
    expect(open.map((a) => a.id)).not.toContain(id);
    expect(open).toHaveLength(alerts.length - 1);
  });

  it("recomputed audit -- a breach found again keeps its row and acknowledgement and is not e-mailed again", async () => {
    const { PATCH } = await import("@/app/api/alerts/[id]/route");
    const list = async () =>
      (await (await (await alertsRoute()).GET(req("/api/alerts", { cookie: cookies.owner }), ctx({}))).json())
        .alerts as AlertDto[];
    const before = await list();
    const target = before.find((a) => a.acknowledgedAt === null)!;
    const ofAudit = before.filter((a) => a.audit.id === target.audit.id);
    for (const a of ofAudit)
      expect(
        (await PATCH(json(`/api/alerts/${a.id}`, "PATCH", cookies.qa_lead, { acknowledged: true }), ctx({ id: a.id })))
          .status,
      ).toBe(200);
    const { removeAuditRows } = await import("@/db/queries/audits");
    const { computeStoredAudit } = await import("@/lib/server/audits/run-audit");
    const { settleAlertChecks } = await import("@/lib/server/alerts/check");
    const [{ org_id: orgId, title }] = (
      await db.execute(sql`select org_id, title from audit where id = ${target.audit.id}`)
    ).rows as { org_id: string; title: string }[];
    await removeAuditRows(db, { id: target.audit.id });
    await db.execute(
      sql`update audit set state = 'computing', summary = null, verdict = null where id = ${target.audit.id}`,
    );
    mail.clear();
    await computeStoredAudit(db, { id: target.audit.id, orgId });
    await settleAlertChecks();
    const after = (await list()).filter((a) => a.audit.id === target.audit.id);
    expect(after.map((a) => a.id).sort()).toEqual(ofAudit.map((a) => a.id).sort());
    expect(after.every((a) => a.acknowledgedAt !== null)).toBe(true);
    expect(mail.messages.filter((m) => m.subject.includes(title))).toHaveLength(0);
  }, 120_000);

  it("computed audit -- a technician's audit that breaches is stored and e-mailed to owners and QA leads only", async () => {
    const { PUT } = await rulesRoute();
    expect(
      (
        await PUT(
          json("/api/alerts/rules", "PUT", cookies.qa_lead, {
            armCrossOffsetM: 0.0025,
            rmseRise: null,
            failedVerdict: false,
          }),
          ctx({}),
        )
      ).status,
    ).toBe(200);
    const fieldId = fieldIds["Long Acre"];
    const planted = await upload(cookies.technician, fieldId, "public/demo/long-acre-as-planted.csv", {
      kind: "planted",
      crs: "EPSG:4326",
      acceptWarnings: "true",
      machineId: machineId(DEMO_MACHINES[0].name),
    });
    expect(planted.status).toBe(201);
    const survey = await upload(cookies.technician, fieldId, "public/demo/long-acre-survey.csv", {
      kind: "survey",
      crs: "EPSG:25831",
      acceptWarnings: "true",
    });
    const profiles = (
      await (
        await (
          await import("@/app/api/profiles/route")
        ).GET(req("/api/profiles", { cookie: cookies.technician }), ctx({}))
      ).json()
    ).profiles as { id: string; name: string }[];
    mail.clear();
    const { getViewerForTest } = await viewerHelper();
    const { startAudit } = await import("@/lib/server/audits/run-audit");
    const { settleAlertChecks } = await import("@/lib/server/alerts/check");
    const audit = await startAudit(
      await getViewerForTest("technician"),
      {
        fieldId,
        plantedDatasetId: (await planted.json()).dataset.id,
        surveyDatasetId: (await survey.json()).dataset.id,
        profileId: profiles.find((p) => p.name === "Inter-row hoeing")!.id,
        title: "Long Acre check after recalibration",
      } as Parameters<typeof startAudit>[1],
      { wait: true },
    );
    await settleAlertChecks();
    const alerts = (
      await (await (await alertsRoute()).GET(req("/api/alerts", { cookie: cookies.grower }), ctx({}))).json()
    ).alerts as AlertDto[];
    const mine = alerts.filter((a) => a.audit.id === audit.id);
    expect(mine.map((a) => a.kind)).toEqual(["arm-cross-offset"]);
    expect(mine[0].message).toContain("above the 2.5 mm limit");
    expect(mine[0].machine?.name).toBe(DEMO_MACHINES[0].name);
    const m = await mail.waitFor((x) => x.subject.includes("Long Acre check after recalibration"));
    expect(m.subject).toBe("Alert: Long Acre check after recalibration crossed a threshold");
    expect(m.text).toContain("Mean cross-row error of arm 3");
    expect(m.text).toContain(`/audits/${audit.id}/diagnostics`);
    const to = mail.messages
      .filter((x) => x.subject === m.subject)
      .flatMap((x) => x.to)
      .sort();
    expect(to).toEqual(["idris@kestrelfen.example", "maren@kestrelfen.example"]);
  }, 120_000);

  it("computed audit -- an alert check that throws is logged and leaves the audit computed", async () => {
    // A threshold no form can send (below zero), written straight into the table: evaluateAlerts refuses it.
    const { recomputeTarget } = await recomputeHelper();
    const { computeStoredAudit } = await import("@/lib/server/audits/run-audit");
    const { settleAlertChecks } = await import("@/lib/server/alerts/check");
    const target = await recomputeTarget();
    await db.execute(sql`update alert_rule set arm_cross_offset_m = -1 where org_id = ${target.orgId}`);
    const errors = vi.spyOn(console, "error").mockImplementation(() => {});
    await computeStoredAudit(db, target);
    await settleAlertChecks();
    const state = (await db.execute(sql`select state from audit where id = ${target.id}`)).rows[0].state;
    expect(state).toBe("computed");
    expect(errors.mock.calls.some((c) => String(c[0]).includes(`alert check of audit ${target.id} failed`))).toBe(true);
    errors.mockRestore();
  }, 120_000);
});

/** A Viewer for a demo person, as the seed builds it. */
async function viewerHelper() {
  const { getMembershipForUser } = await import("@/db/queries/members");
  return {
    async getViewerForTest(role: string) {
      const person = DEMO_PEOPLE.find((p) => p.role === role)!;
      const [u] = (await db.execute(sql`select id from "user" where email = ${person.email}`)).rows as { id: string }[];
      const membership = await getMembershipForUser(db, { userId: u.id, activeOrgId: null });
      return { userId: u.id, name: person.name, email: person.email, ...membership! };
    },
  };
}

/** An audit to compute again in place: the Willow Strip May planting (state "computed"), its rows removed first. */
async function recomputeHelper() {
  const { removeAuditRows } = await import("@/db/queries/audits");
  return {
    async recomputeTarget() {
      const id = auditId("Willow Strip May planting");
      const [{ org_id: orgId }] = (await db.execute(sql`select org_id from audit where id = ${id}`)).rows as {
        org_id: string;
      }[];
      await removeAuditRows(db, { id });
      await db.execute(sql`update audit set state = 'computing', summary = null, verdict = null where id = ${id}`);
      return { id, orgId };
    },
  };
}
