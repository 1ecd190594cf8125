import { beforeAll, describe, expect, it } from "vitest";
import { cookieFor, ctx, req, useMemoryDb } from "./helpers";
import { DEMO_PASSWORD, DEMO_PEOPLE, OTHER_OWNER } from "@/lib/demo/farm";

const cookies: Record<string, string> = {};
let keysRoute: typeof import("@/app/api/keys/route");
let keyRoute: typeof import("@/app/api/keys/[id]/route");
let fieldsRoute: typeof import("@/app/api/fields/route");
let fieldRoute: typeof import("@/app/api/fields/[fieldId]/route");

beforeAll(async () => {
  await useMemoryDb();
  const { seedDemo } = await import("@/lib/demo/seed");
  await seedDemo();
  for (const p of DEMO_PEOPLE) cookies[p.role] = await cookieFor(p.email, DEMO_PASSWORD);
  cookies.other = await cookieFor(OTHER_OWNER.email, DEMO_PASSWORD);
  keysRoute = await import("@/app/api/keys/route");
  keyRoute = await import("@/app/api/keys/[id]/route");
  fieldsRoute = await import("@/app/api/fields/route");
  fieldRoute = await import("@/app/api/fields/[fieldId]/route");
}, 120_000);

const bearer = (key: string) => ({ headers: { authorization: `Bearer ${key}` } });

describe("api keys", () => {
  it("api keys -- only owners create them", async () => {
    for (const role of ["qa_lead", "technician", "grower"]) {
      const res = await keysRoute.POST(
        req("/api/keys", { method: "POST", cookie: cookies[role], body: JSON.stringify({ name: "x" }) }),
        ctx({}),
      );
      expect(res.status).toBe(403);
    }
  });

  it("api keys -- a key reads its own organisation, not another's, and stops working when revoked", async () => {
    const created = await keysRoute.POST(
      req("/api/keys", { method: "POST", cookie: cookies.owner, body: JSON.stringify({ name: "Nightly export" }) }),
      ctx({}),
    );
    expect(created.status).toBe(201);
    const { id, key } = await created.json();
    expect(key).toMatch(/^ppk_/);

    const mine = await fieldsRoute.GET(req("/api/fields", bearer(key)), ctx({}));
    expect(mine.status).toBe(200);
    expect((await mine.json()).fields.map((f: { name: string }) => f.name).sort()).toEqual([
      "Long Acre",
      "Willow Strip",
    ]);

    const foreignId = (await (await fieldsRoute.GET(req("/api/fields", { cookie: cookies.other }), ctx({}))).json())
      .fields[0].id;
    expect(
      (await fieldRoute.GET(req(`/api/fields/${foreignId}`, bearer(key)), ctx({ fieldId: foreignId }))).status,
    ).toBe(404);

    const listed = await (await keysRoute.GET(req("/api/keys", { cookie: cookies.owner }), ctx({}))).json();
    expect(JSON.stringify(listed)).not.toContain(key); // the key itself is never listed
    expect(listed.keys[0].lastUsedAt).not.toBeNull();

    expect(
      (await keyRoute.DELETE(req(`/api/keys/${id}`, { method: "DELETE", cookie: cookies.owner }), ctx({ id }))).status,
    ).toBe(204);
    expect((await fieldsRoute.GET(req("/api/fields", bearer(key)), ctx({}))).status).toBe(401);
  });

  it("api keys -- another organisation's owner cannot revoke our key", async () => {
    const { id, key } = await (
      await keysRoute.POST(
        req("/api/keys", { method: "POST", cookie: cookies.owner, body: JSON.stringify({ name: "Second" }) }),
        ctx({}),
      )
    ).json();
    expect(
      (await keyRoute.DELETE(req(`/api/keys/${id}`, { method: "DELETE", cookie: cookies.other }), ctx({ id }))).status,
    ).toBe(404);
    expect((await fieldsRoute.GET(req("/api/fields", bearer(key)), ctx({}))).status).toBe(200);
  });

  it("api keys -- an unknown key is 401", async () => {
    expect((await fieldsRoute.GET(req("/api/fields", bearer("ppk_" + "x".repeat(40))), ctx({}))).status).toBe(401);
  });
});
