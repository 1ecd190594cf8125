import fs from "node:fs";
import path from "node:path";
import { eq } from "drizzle-orm";
import { beforeAll, describe, expect, it } from "vitest";
import { cookieFor, ctx, req, useMemoryDb } from "./helpers";
import type { DB } from "@/db/client";
import { member, user } from "@/db/schema";
import { insertApiKey } from "@/db/queries/api-keys";
import { hashApiKey } from "@/lib/server/api-keys";
import { DEMO_PASSWORD, DEMO_PEOPLE, OTHER_OWNER } from "@/lib/demo/farm";
import type { ApiKeyScope } from "@/lib/security/key-scope";

const cookies: Record<string, string> = {};
let keysRoute: typeof import("@/app/api/keys/route");
let keyRoute: typeof import("@/app/api/keys/[id]/route");
let fieldsRoute: typeof import("@/app/api/fields/route");
let fieldRoute: typeof import("@/app/api/fields/[fieldId]/route");
let datasetsRoute: typeof import("@/app/api/fields/[fieldId]/datasets/route");
let auditsRoute: typeof import("@/app/api/audits/route");
let teamRoute: typeof import("@/app/api/team/route");
let db: DB;
let orgId: string;
let ownerId: string;
let fieldId: string;
let foreignFieldId: string;

beforeAll(async () => {
  db = await useMemoryDb();
  const { seedDemo } = await import("@/lib/demo/seed");
  await seedDemo();
  for (const p of DEMO_PEOPLE) cookies[p.role] = await cookieFor(p.email, DEMO_PASSWORD);
  cookies.other = await cookieFor(OTHER_OWNER.email, DEMO_PASSWORD);
  keysRoute = await import("@/app/api/keys/route");
  keyRoute = await import("@/app/api/keys/[id]/route");
  fieldsRoute = await import("@/app/api/fields/route");
  fieldRoute = await import("@/app/api/fields/[fieldId]/route");
  datasetsRoute = await import("@/app/api/fields/[fieldId]/datasets/route");
  auditsRoute = await import("@/app/api/audits/route");
  teamRoute = await import("@/app/api/team/route");
  const fields = async (cookie: string) =>
    (await (await fieldsRoute.GET(req("/api/fields", { cookie }), ctx({}))).json()).fields as { id: string }[];
  fieldId = (await fields(cookies.owner))[0].id;
  foreignFieldId = (await fields(cookies.other))[0].id;
  ownerId = await userIdOf(DEMO_PEOPLE.find((p) => p.role === "owner")!.email);
  const [row] = await db.select({ orgId: member.organizationId }).from(member).where(eq(member.userId, ownerId));
  orgId = row.orgId;
}, 120_000);

const bearer = (key: string) => ({ headers: { authorization: `Bearer ${key}` } });

async function userIdOf(email: string): Promise<string> {
  const [row] = await db.select({ id: user.id }).from(user).where(eq(user.email, email));
  return row.id;
}

/** A key made through the API by the owner, as the keys page makes it. */
async function createKey(body: { name: string; scope?: ApiKeyScope; expiresOn?: string | null }) {
  const res = await keysRoute.POST(
    req("/api/keys", { method: "POST", cookie: cookies.owner, body: JSON.stringify(body) }),
    ctx({}),
  );
  expect(res.status).toBe(201);
  return (await res.json()) as { id: string; key: string; scope: ApiKeyScope; expiresAt: string | null };
}

/** A key written straight into the table: for keys the API no longer makes (old prefix, already expired). */
async function storeKey(key: string, k: { userId?: string; scope?: ApiKeyScope; expiresAt?: Date | null } = {}) {
  await insertApiKey(db, {
    orgId,
    userId: k.userId ?? ownerId,
    name: key.slice(0, 12),
    prefix: key.slice(0, 12),
    hash: hashApiKey(key),
    scope: k.scope ?? "full",
    expiresAt: k.expiresAt ?? null,
  });
  return key;
}

function uploadAsPlanted(key: string, target = fieldId) {
  const form = new FormData();
  const bytes = fs.readFileSync(path.join(import.meta.dirname, "../../public/demo/long-acre-as-planted.csv"));
  form.set("file", new File([new Uint8Array(bytes)], "long-acre-as-planted.csv", { type: "text/csv" }));
  form.set("kind", "planted");
  form.set("crs", "EPSG:4326");
  form.set("acceptWarnings", "true");
  const r = new Request(`http://localhost:3000/api/fields/${target}/datasets`, {
    method: "POST",
    body: form,
    headers: { authorization: `Bearer ${key}` },
  });
  return datasetsRoute.POST(r, ctx({ fieldId: target }));
}

const createAuditAs = (key: string) =>
  auditsRoute.POST(req("/api/audits", { method: "POST", ...bearer(key), body: JSON.stringify({ fieldId }) }), ctx({}));

const createFieldAs = (key: string) =>
  fieldsRoute.POST(
    req("/api/fields", {
      method: "POST",
      ...bearer(key),
      body: JSON.stringify({ name: "Key field", farm: "Test", crs: "EPSG:4326", timeZone: "Europe/Amsterdam" }),
    }),
    ctx({}),
  );

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
    expect(key).toMatch(/^plotkey_[A-Za-z0-9_-]{40}$/);

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

  it("api keys -- a key made without a scope is full and without expiry, as keys made before scopes", async () => {
    const made = await createKey({ name: "No scope given" });
    expect(made.scope).toBe("full");
    expect(made.expiresAt).toBeNull();
    const listed = (await (await keysRoute.GET(req("/api/keys", { cookie: cookies.owner }), ctx({}))).json()).keys;
    expect(listed.find((k: { id: string }) => k.id === made.id)).toMatchObject({ scope: "full", expiresAt: null });
    expect((await createFieldAs(made.key)).status).toBe(201);
  });

  it("api keys -- a read key can GET but gets 403 on POST, naming its scope", async () => {
    const { key } = await createKey({ name: "Reporting", scope: "read" });
    expect((await fieldsRoute.GET(req("/api/fields", bearer(key)), ctx({}))).status).toBe(200);
    expect((await fieldRoute.GET(req(`/api/fields/${fieldId}`, bearer(key)), ctx({ fieldId }))).status).toBe(200);
    expect((await teamRoute.GET(req("/api/team", bearer(key)), ctx({}))).status).toBe(200);
    const refused = await createFieldAs(key);
    expect(refused.status).toBe(403);
    const { error } = await refused.json();
    expect(error.code).toBe("forbidden");
    expect(error.message).toContain('scope "read"');
    expect(error.message).toContain("GET requests");
    expect((await uploadAsPlanted(key)).status).toBe(403);
  });

  it("api keys -- an upload key uploads a dataset but cannot create an audit or a field, or read the team", async () => {
    const { key } = await createKey({ name: "Planter push", scope: "upload", expiresOn: "2999-01-01" });
    expect((await fieldsRoute.GET(req("/api/fields", bearer(key)), ctx({}))).status).toBe(200);
    expect((await fieldRoute.GET(req(`/api/fields/${fieldId}`, bearer(key)), ctx({ fieldId }))).status).toBe(200);

    const uploaded = await uploadAsPlanted(key);
    expect(uploaded.status).toBe(201);
    expect((await uploaded.json()).dataset.rowCount).toBe(4800);
    const listed = await datasetsRoute.GET(req(`/api/fields/${fieldId}/datasets`, bearer(key)), ctx({ fieldId }));
    expect(listed.status).toBe(200);

    const audit = await createAuditAs(key);
    expect(audit.status).toBe(403);
    expect((await audit.json()).error.message).toContain('scope "upload"');
    expect((await createFieldAs(key)).status).toBe(403);
    expect((await teamRoute.GET(req("/api/team", bearer(key)), ctx({}))).status).toBe(403);
    expect((await keysRoute.GET(req("/api/keys", bearer(key)), ctx({}))).status).toBe(403);
  });

  it("api keys -- a scoped key never does more than its creator's current role", async () => {
    // A key whose creator is now a grower: the upload scope allows the upload, the grower role does not.
    const grower = await userIdOf(DEMO_PEOPLE.find((p) => p.role === "grower")!.email);
    const key = await storeKey(`plotkey_${"g".repeat(40)}`, { userId: grower, scope: "upload" });
    const res = await uploadAsPlanted(key);
    expect(res.status).toBe(403);
    expect((await res.json()).error.message).toContain("role");
    expect((await fieldsRoute.GET(req("/api/fields", bearer(key)), ctx({}))).status).toBe(200);
  });

  it("api keys -- an expired key gets 401 saying when it expired", async () => {
    const key = await storeKey(`plotkey_${"e".repeat(40)}`, { expiresAt: new Date("2025-06-01T00:00:00Z") });
    const res = await fieldsRoute.GET(req("/api/fields", bearer(key)), ctx({}));
    expect(res.status).toBe(401);
    expect((await res.json()).error.message).toBe(
      "This API key expired on 2025-06-01 at 00:00 UTC. An owner can create a new key under API keys.",
    );
    const listed = (await (await keysRoute.GET(req("/api/keys", { cookie: cookies.owner }), ctx({}))).json()).keys;
    const row = listed.find((k: { prefix: string }) => k.prefix === key.slice(0, 12));
    expect(row).toMatchObject({ expiresAt: "2025-06-01T00:00:00.000Z", lastUsedAt: null });
  });

  it("api keys -- an expiry date that is not after today is refused", async () => {
    const res = await keysRoute.POST(
      req("/api/keys", {
        method: "POST",
        cookie: cookies.owner,
        body: JSON.stringify({ name: "Past", scope: "read", expiresOn: "2020-01-01" }),
      }),
      ctx({}),
    );
    expect(res.status).toBe(422);
    expect((await res.json()).error.message).toContain("body.expiresOn");
  });

  it("api keys -- a key of one organisation cannot read another's field (404), whatever its scope", async () => {
    for (const scope of ["full", "upload", "read"] as const) {
      const { key } = await createKey({ name: `Foreign probe ${scope}`, scope });
      const res = await fieldRoute.GET(
        req(`/api/fields/${foreignFieldId}`, bearer(key)),
        ctx({ fieldId: foreignFieldId }),
      );
      expect(res.status, scope).toBe(404);
    }
    const { key } = await createKey({ name: "Foreign upload", scope: "upload" });
    expect((await uploadAsPlanted(key, foreignFieldId)).status).toBe(404);
  });

  it("api keys -- an old ppk_ key keeps working with its full scope", async () => {
    const key = await storeKey(`ppk_${"p".repeat(40)}`);
    expect((await fieldsRoute.GET(req("/api/fields", bearer(key)), ctx({}))).status).toBe(200);
    expect((await teamRoute.GET(req("/api/team", bearer(key)), ctx({}))).status).toBe(200);
  });
});
