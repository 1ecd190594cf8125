import { beforeAll, describe, expect, it } from "vitest";
import { cookieFor, ctx, req, useMemoryDb } from "./helpers";
import type { DB } from "@/db/client";
import { DEMO_PASSWORD, DEMO_PEOPLE, OTHER_OWNER } from "@/lib/demo/farm";

let _db: DB;
const cookies: Record<string, string> = {};
let fieldsRoute: typeof import("@/app/api/fields/route");
let fieldRoute: typeof import("@/app/api/fields/[fieldId]/route");
let teamRoute: typeof import("@/app/api/team/route");
let ownFieldId: string;
let foreignFieldId: string;

const newField = { name: "North Headland", farm: "Kestrel Fen", crs: "EPSG:25831", timeZone: "Europe/Amsterdam" };

beforeAll(async () => {
  _db = await useMemoryDb();
  const { seedDemo } = await import("@/lib/demo/seed");
  expect(await seedDemo()).toBe("created");
  expect(await seedDemo()).toBe("present"); // idempotent
  for (const p of DEMO_PEOPLE) cookies[p.role] = await cookieFor(p.email, DEMO_PASSWORD);
  cookies.other = await cookieFor(OTHER_OWNER.email, DEMO_PASSWORD);
  fieldsRoute = await import("@/app/api/fields/route");
  fieldRoute = await import("@/app/api/fields/[fieldId]/route");
  teamRoute = await import("@/app/api/team/route");
  ownFieldId = (await (await fieldsRoute.GET(req("/api/fields", { cookie: cookies.grower }), ctx({}))).json()).fields[0]
    .id;
  foreignFieldId = (await (await fieldsRoute.GET(req("/api/fields", { cookie: cookies.other }), ctx({}))).json())
    .fields[0].id;
}, 120_000);

describe("access -- session, role and organisation", () => {
  it("access -- no session gets 401 with a JSON error body", async () => {
    const res = await fieldsRoute.GET(req("/api/fields"), ctx({}));
    expect(res.status).toBe(401);
    expect(await res.json()).toEqual({ error: { code: "unauthenticated", message: "Sign in to continue." } });
  });

  it("access -- each organisation lists only its own fields", async () => {
    const mine = (await (await fieldsRoute.GET(req("/api/fields", { cookie: cookies.grower }), ctx({}))).json()).fields;
    const theirs = (await (await fieldsRoute.GET(req("/api/fields", { cookie: cookies.other }), ctx({}))).json())
      .fields;
    expect(mine.map((f: { name: string }) => f.name).sort()).toEqual(["Long Acre", "Willow Strip"]);
    expect(theirs.map((f: { name: string }) => f.name)).toEqual(["Saltings Trial Plot"]);
  });

  it("access -- a grower cannot create a field (403) and nothing is saved", async () => {
    const res = await fieldsRoute.POST(
      req("/api/fields", { method: "POST", cookie: cookies.grower, body: JSON.stringify(newField) }),
      ctx({}),
    );
    expect(res.status).toBe(403);
    expect((await res.json()).error.code).toBe("forbidden");
    const list = (await (await fieldsRoute.GET(req("/api/fields", { cookie: cookies.grower }), ctx({}))).json()).fields;
    expect(list).toHaveLength(2);
  });

  it("access -- a technician creates a field; bad input is 422 with the field named; a duplicate name is 409", async () => {
    const bad = await fieldsRoute.POST(
      req("/api/fields", {
        method: "POST",
        cookie: cookies.technician,
        body: JSON.stringify({ ...newField, crs: "UTM31" }),
      }),
      ctx({}),
    );
    expect(bad.status).toBe(422);
    expect((await bad.json()).error.issues[0].path).toEqual(["crs"]);
    const ok = await fieldsRoute.POST(
      req("/api/fields", { method: "POST", cookie: cookies.technician, body: JSON.stringify(newField) }),
      ctx({}),
    );
    expect(ok.status).toBe(201);
    const again = await fieldsRoute.POST(
      req("/api/fields", { method: "POST", cookie: cookies.technician, body: JSON.stringify(newField) }),
      ctx({}),
    );
    expect(again.status).toBe(409);
  });

  it("access -- another organisation's field is 404, exactly like a field that does not exist", async () => {
    const foreign = await fieldRoute.GET(
      req(`/api/fields/${foreignFieldId}`, { cookie: cookies.owner }),
      ctx({ fieldId: foreignFieldId }),
    );
    const missing = await fieldRoute.GET(
      req("/api/fields/00000000-0000-4000-8000-000000000000", { cookie: cookies.owner }),
      ctx({ fieldId: "00000000-0000-4000-8000-000000000000" }),
    );
    expect(foreign.status).toBe(404);
    expect(missing.status).toBe(404);
    expect(await foreign.json()).toEqual(await missing.json());
    const own = await fieldRoute.GET(
      req(`/api/fields/${ownFieldId}`, { cookie: cookies.grower }),
      ctx({ fieldId: ownFieldId }),
    );
    expect(own.status).toBe(200);
    expect((await own.json()).field.id).toBe(ownFieldId);
  });

  it("access -- only owners list the team, and only their own organisation's members", async () => {
    for (const role of ["qa_lead", "technician", "grower"]) {
      expect((await teamRoute.GET(req("/api/team", { cookie: cookies[role] }), ctx({}))).status).toBe(403);
    }
    const res = await teamRoute.GET(req("/api/team", { cookie: cookies.owner }), ctx({}));
    const emails = (await res.json()).members.map((m: { email: string }) => m.email).sort();
    expect(emails).toEqual(DEMO_PEOPLE.map((p) => p.email).sort());
  });
});
