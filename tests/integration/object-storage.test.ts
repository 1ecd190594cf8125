import crypto from "node:crypto";
import fs from "node:fs";
import path from "node:path";
import {
  DeleteObjectCommand,
  GetObjectCommand,
  ListObjectsV2Command,
  PutObjectCommand,
  S3Client,
} from "@aws-sdk/client-s3";
import { eq, sql } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { startFakeS3 } from "../object-store/fake-s3.mjs";
import { ctx, req } from "./helpers";
import { setUpReviewWorld, type ReviewWorld } from "./review-helpers";
import { audit, auditReport, dataset, datasetFile } from "@/db/schema";
import type { AuditDto, DatasetDto } from "@/lib/api-types";
import type { VerificationDto } from "@/lib/review/types";

/**
 * Server mode with an object store: raw uploads and report files live in S3 (s3rver here), the rows keep their keys,
 * sizes and SHA-256. On the PostgreSQL run (TEST_DATABASE_URL) the storage module picks the object store from the
 * environment, as a deployment does; on the embedded run this file hands it the same store itself.
 */

let fake: Awaited<ReturnType<typeof startFakeS3>>;
let s3: S3Client;
let bucket: string;
let w: ReviewWorld;
let orgId: string;
const demo = (name: string) => fs.readFileSync(path.join(import.meta.dirname, "../../public/demo", name));
const sha256 = (b: Uint8Array) => crypto.createHash("sha256").update(b).digest("hex"); // FIPS 180-4 via node:crypto

type Routes = {
  file: typeof import("@/app/api/datasets/[id]/file/route");
  dataset: typeof import("@/app/api/datasets/[id]/route");
  datasets: typeof import("@/app/api/fields/[fieldId]/datasets/route");
  residuals: typeof import("@/app/api/audits/[id]/residuals.csv/route");
  summary: typeof import("@/app/api/audits/[id]/summary.csv/route");
  unpaired: typeof import("@/app/api/audits/[id]/unpaired.csv/route");
  verify: typeof import("@/app/api/audits/[id]/verify/route");
  audits: typeof import("@/app/api/audits/route");
};
let r: Routes;

beforeAll(async () => {
  fake = await startFakeS3({ bucket: "plotproof-files" });
  Object.assign(process.env, fake.env);
  bucket = fake.env.OBJECT_STORE_BUCKET;
  s3 = new S3Client({
    endpoint: fake.env.OBJECT_STORE_URL,
    region: "us-east-1",
    forcePathStyle: true,
    credentials: { accessKeyId: "S3RVER", secretAccessKey: "S3RVER" },
    requestChecksumCalculation: "WHEN_REQUIRED",
    responseChecksumValidation: "WHEN_REQUIRED",
  });
  if (!process.env.TEST_DATABASE_URL) {
    const { setObjectStoreForTests } = await import("@/lib/server/storage");
    const { s3ObjectStore } = await import("@/lib/server/storage/s3");
    const { storageChoice } = await import("@/lib/server/storage/config");
    const choice = storageChoice({ ...process.env, DATABASE_URL: "postgres://as-if-server-mode" });
    if (choice.kind !== "object-store") throw new Error("the fake store's variables were not taken");
    setObjectStoreForTests(s3ObjectStore(choice.config));
  }
  w = await setUpReviewWorld();
  const [row] = await w.db.select({ orgId: dataset.orgId }).from(dataset).where(eq(dataset.id, w.planted.id));
  orgId = row.orgId;
  r = {
    file: await import("@/app/api/datasets/[id]/file/route"),
    dataset: await import("@/app/api/datasets/[id]/route"),
    datasets: await import("@/app/api/fields/[fieldId]/datasets/route"),
    residuals: await import("@/app/api/audits/[id]/residuals.csv/route"),
    summary: await import("@/app/api/audits/[id]/summary.csv/route"),
    unpaired: await import("@/app/api/audits/[id]/unpaired.csv/route"),
    verify: await import("@/app/api/audits/[id]/verify/route"),
    audits: await import("@/app/api/audits/route"),
  };
}, 300_000);

afterAll(async () => {
  const { setObjectStoreForTests } = await import("@/lib/server/storage");
  setObjectStoreForTests(undefined);
  await fake?.stop();
});

async function object(key: string): Promise<Uint8Array | null> {
  try {
    const res = await s3.send(new GetObjectCommand({ Bucket: bucket, Key: key }));
    return await res.Body!.transformToByteArray();
  } catch (err) {
    if ((err as { name?: string }).name === "NoSuchKey") return null;
    throw err;
  }
}
const putObject = (key: string, body: Uint8Array) =>
  s3.send(new PutObjectCommand({ Bucket: bucket, Key: key, Body: body }));
async function keys(prefix: string): Promise<string[]> {
  const res = await s3.send(new ListObjectsV2Command({ Bucket: bucket, Prefix: prefix }));
  return (res.Contents ?? []).map((c) => c.Key!).sort();
}

async function fileRow(datasetId: string) {
  const [row] = await w.db.select().from(datasetFile).where(eq(datasetFile.datasetId, datasetId));
  return row;
}
async function reportRows(auditId: string) {
  return w.db.select().from(auditReport).where(eq(auditReport.auditId, auditId));
}

const getFile = (id: string, who: keyof ReviewWorld["cookies"] = "grower") =>
  r.file.GET(req(`/api/datasets/${id}/file`, { cookie: w.cookies[who] }), ctx({ id }));
const getReport = (
  kind: "residuals" | "summary" | "unpaired",
  id: string,
  who: keyof ReviewWorld["cookies"] = "grower",
) => r[kind].GET(req(`/api/audits/${id}/${kind}.csv`, { cookie: w.cookies[who] }), ctx({ id }));
async function verify(id: string): Promise<VerificationDto> {
  const res = await r.verify.POST(
    req(`/api/audits/${id}/verify`, { method: "POST", cookie: w.cookies.grower }),
    ctx({ id }),
  );
  expect(res.status, await res.clone().text()).toBe(200);
  return (await res.json()).verification;
}
const bytesOf = async (res: Response) => new Uint8Array(await res.arrayBuffer());
const UUID = "[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}";

/** A statement-level refusal of inserts into `table`, standing in for any failure of the saving transaction. */
async function refuseInserts(table: "dataset_file" | "audit_report", on: boolean): Promise<void> {
  if (on) {
    await w.db.execute(
      sql.raw(
        `create or replace function test_refuse_insert() returns trigger language plpgsql as $$ begin raise exception 'test: insert refused'; end $$`,
      ),
    );
    await w.db.execute(
      sql.raw(
        `create trigger test_refuse_${table} before insert on ${table} for each row execute function test_refuse_insert()`,
      ),
    );
  } else await w.db.execute(sql.raw(`drop trigger test_refuse_${table} on ${table}`));
}

/** Note the keys the app writes while `fn` runs (the store itself unchanged). */
async function keysWrittenDuring(fn: () => Promise<void>): Promise<string[]> {
  const { objectStore, setObjectStoreForTests } = await import("@/lib/server/storage");
  const store = objectStore()!;
  const written: string[] = [];
  setObjectStoreForTests({
    where: store.where,
    put: async (key, bytes, type) => {
      await store.put(key, bytes, type);
      written.push(key);
    },
    get: (key) => store.get(key),
    delete: (key) => store.delete(key),
  });
  try {
    await fn();
  } finally {
    setObjectStoreForTests(store);
  }
  return written;
}

async function upload(name: string, bytes: Uint8Array, kind: "planted" | "survey", crs: string) {
  const form = new FormData();
  form.set("file", new File([new Uint8Array(bytes)], name, { type: "text/csv" }));
  form.set("kind", kind);
  form.set("crs", crs);
  form.set("acceptWarnings", "true");
  return r.datasets.POST(
    new Request(`http://localhost:3000/api/fields/${w.fieldId}/datasets`, {
      method: "POST",
      body: form,
      headers: { cookie: w.cookies.technician },
    }),
    ctx({ fieldId: w.fieldId }),
  );
}

describe("object storage -- server mode keeps files in S3-compatible storage", () => {
  it("object storage -- an upload is one object under the organisation's prefix; the row keeps its key, not the bytes", async () => {
    const original = demo("long-acre-as-planted.csv");
    const row = await fileRow(w.planted.id);
    expect(row.bytes).toBeNull();
    expect(row.objectKey).toMatch(new RegExp(`^orgs/${orgId}/uploads/${UUID}$`));
    const stored = await object(row.objectKey!);
    expect(Buffer.compare(Buffer.from(stored!), original)).toBe(0);
    // The hash recorded at upload is the SHA-256 of the file's bytes, which is what the object holds.
    expect(sha256(stored!)).toBe(sha256(original));
    expect(w.planted.sha256).toBe(sha256(original));
    expect(w.planted.sizeBytes).toBe(original.length);
  });

  it("object storage -- downloading an upload gives the bytes exactly as received, with their SHA-256", async () => {
    for (const [d, name] of [
      [w.planted, "long-acre-as-planted.csv"],
      [w.survey, "long-acre-survey.csv"],
    ] as [DatasetDto, string][]) {
      const res = await getFile(d.id);
      expect(res.status).toBe(200);
      const body = await bytesOf(res);
      expect(Buffer.compare(Buffer.from(body), demo(name))).toBe(0);
      expect(res.headers.get("x-content-sha256")).toBe(sha256(body));
    }
  });

  it("object storage -- an audit's three reports are objects with their size and SHA-256; downloads are those bytes", async () => {
    const rows = await reportRows(w.base.id);
    expect(rows.map((x) => x.kind).sort()).toEqual(["residuals", "summary", "unpaired"]);
    for (const row of rows) {
      expect(row.bytes).toBeNull();
      expect(row.part).toBe(0);
      expect(row.objectKey).toMatch(new RegExp(`^orgs/${orgId}/reports/${w.base.id}/${row.kind}/${UUID}$`));
      const stored = await object(row.objectKey!);
      expect(stored!.length).toBe(row.sizeBytes);
      expect(sha256(stored!)).toBe(row.sha256);
      const res = await getReport(row.kind as "residuals", w.base.id);
      expect(res.status).toBe(200);
      expect(Buffer.compare(Buffer.from(await bytesOf(res)), Buffer.from(stored!))).toBe(0);
    }
    // The reports are what the engine wrote: a re-computation from the raw files (in the object store) agrees.
    const v = await verify(w.base.id);
    expect(v.checks.filter((c) => !c.ok)).toEqual([]);
  });

  it("object storage -- another organisation gets 404 from every route that reads the files", async () => {
    for (const d of [w.planted, w.survey]) {
      expect((await getFile(d.id, "other")).status).toBe(404);
      expect(
        (await r.dataset.GET(req(`/api/datasets/${d.id}`, { cookie: w.cookies.other }), ctx({ id: d.id }))).status,
      ).toBe(404);
    }
    for (const kind of ["residuals", "summary", "unpaired"] as const)
      expect((await getReport(kind, w.base.id, "other")).status).toBe(404);
    const res = await r.verify.POST(
      req(`/api/audits/${w.base.id}/verify`, { method: "POST", cookie: w.cookies.other }),
      ctx({ id: w.base.id }),
    );
    expect(res.status).toBe(404);
    // Nor can it take another organisation's object by deleting its own dataset: keys are under each organisation.
    const foreign = await keys(`orgs/${orgId}/`);
    expect(foreign.length).toBeGreaterThanOrEqual(5);
    expect(foreign.every((k) => k.startsWith(`orgs/${orgId}/`))).toBe(true);
  });

  it("object storage -- an upload changed in the object store: download refused (409) and verification names the file", async () => {
    const key = (await fileRow(w.planted.id)).objectKey!;
    const original = (await object(key))!;
    const changed = Buffer.from(original);
    changed[changed.length - 2] = changed[changed.length - 2] === 0x31 ? 0x32 : 0x31; // one digit of the last row
    await putObject(key, changed);
    try {
      const res = await getFile(w.planted.id);
      expect(res.status).toBe(409);
      const msg = (await res.json()).error.message as string;
      expect(msg).toContain("long-acre-as-planted.csv was changed outside Plotproof");
      expect(msg).toContain(sha256(changed).slice(0, 16));
      expect(msg).toContain(w.planted.sha256.slice(0, 16));
      const v = await verify(w.base.id);
      expect(v.ok).toBe(false);
      const raw = v.checks.find((c) => c.id === "raw-files" && c.label.includes("as-planted"))!;
      expect(raw.ok).toBe(false);
      expect(raw.text).toContain(`now hashes to ${sha256(changed).slice(0, 16)}`);
    } finally {
      await putObject(key, original);
    }
    expect((await getFile(w.planted.id)).status).toBe(200);
  });

  it("object storage -- a report changed in the object store: download refused (409), verification fails", async () => {
    const [row] = (await reportRows(w.base.id)).filter((x) => x.kind === "summary");
    const original = (await object(row.objectKey!))!;
    await putObject(row.objectKey!, new TextEncoder().encode("metric,value\nverdict,pass\n"));
    try {
      const res = await getReport("summary", w.base.id);
      expect(res.status).toBe(409);
      expect((await res.json()).error.message).toContain("the summary report was changed outside Plotproof");
      const v = await verify(w.base.id);
      expect(v.ok).toBe(false);
      const stored = v.checks.find((c) => c.id === "stored-files")!;
      expect(stored.ok).toBe(false);
      expect(stored.text).toContain(row.objectKey!);
    } finally {
      await putObject(row.objectKey!, original);
    }
    expect((await getReport("summary", w.base.id)).status).toBe(200);
  });

  it("object storage -- a missing object: a 409 saying it is missing from the object store, not a crash", async () => {
    const key = (await fileRow(w.survey.id)).objectKey!;
    const [rep] = (await reportRows(w.base.id)).filter((x) => x.kind === "residuals");
    const original = (await object(key))!;
    const originalReport = (await object(rep.objectKey!))!;
    await s3.send(new DeleteObjectCommand({ Bucket: bucket, Key: key }));
    await s3.send(new DeleteObjectCommand({ Bucket: bucket, Key: rep.objectKey! }));
    try {
      const res = await getFile(w.survey.id);
      expect(res.status).toBe(409);
      expect((await res.json()).error.message).toBe(
        `The stored copy of long-acre-survey.csv is missing from the object store (key ${key}); it was removed outside Plotproof.`,
      );
      const rep409 = await getReport("residuals", w.base.id);
      expect(rep409.status).toBe(409);
      expect((await rep409.json()).error.message).toContain("the residuals report is missing from the object store");
      const v = await verify(w.base.id);
      expect(v.ok).toBe(false);
      const raw = v.checks.find((c) => c.id === "raw-files" && c.label.includes("survey"))!;
      expect(raw.text).toContain("missing from the object store");
      expect(v.checks.find((c) => c.id === "stored-files")?.text).toContain(rep.objectKey!);
    } finally {
      await putObject(key, original);
      await putObject(rep.objectKey!, originalReport);
    }
    expect((await getFile(w.survey.id)).status).toBe(200);
  });

  it("object storage -- nothing half-saved: when the upload's rows cannot be saved, its object is deleted again", async () => {
    const before = await keys(`orgs/${orgId}/uploads/`);
    const [{ n }] = await w.db.select({ n: sql<number>`count(*)::int` }).from(dataset);
    await refuseInserts("dataset_file", true);
    const written = await keysWrittenDuring(async () => {
      try {
        const res = await upload("half-saved.csv", demo("long-acre-survey.csv"), "survey", "EPSG:25831");
        expect(res.status).toBe(500);
      } finally {
        await refuseInserts("dataset_file", false);
      }
    });
    // The object was written before the rows, and is gone again.
    expect(written).toHaveLength(1);
    expect(await object(written[0])).toBeNull();
    expect(await keys(`orgs/${orgId}/uploads/`)).toEqual(before);
    expect((await w.db.select({ n: sql<number>`count(*)::int` }).from(dataset))[0].n).toBe(n);
    // The same upload without the failure is kept: one more object.
    const ok = await upload("saved.csv", demo("long-acre-survey.csv"), "survey", "EPSG:25831");
    expect(ok.status).toBe(201);
    expect((await keys(`orgs/${orgId}/uploads/`)).length).toBe(before.length + 1);
  });

  it("object storage -- nothing half-saved: an audit whose report rows fail keeps no report objects and fails cleanly", async () => {
    const profile = w.profiles.find((p) => p.name === "In-row weeding around plants")!;
    await refuseInserts("audit_report", true);
    let failed = null as unknown as AuditDto;
    const written = await keysWrittenDuring(async () => {
      try {
        const res = await r.audits.POST(
          req("/api/audits?wait=1", {
            method: "POST",
            cookie: w.cookies.technician,
            body: JSON.stringify({
              fieldId: w.fieldId,
              plantedDatasetId: w.planted.id,
              surveyDatasetId: w.survey.id,
              profileId: profile.id,
              title: "Object store cleanup check",
            }),
          }),
          ctx({}),
        );
        failed = (await res.json()).audit as AuditDto;
      } finally {
        await refuseInserts("audit_report", false);
      }
    });
    expect(failed.state).toBe("failed");
    expect(failed.error).toContain("The computation failed");
    // All three reports were written before their rows, and are gone again.
    expect(written.map((k) => k.split("/")[4]).sort()).toEqual(["residuals", "summary", "unpaired"]);
    for (const key of written) expect(await object(key)).toBeNull();
    expect(await keys(`orgs/${orgId}/reports/${failed.id}/`)).toEqual([]);
    expect(await reportRows(failed.id)).toEqual([]);
    const [row] = await w.db.select({ state: audit.state }).from(audit).where(eq(audit.id, failed.id));
    expect(row.state).toBe("failed");
  });

  it("object storage -- deleting an unused dataset deletes its object too", async () => {
    const res = await upload("to-delete.csv", demo("long-acre-survey.csv"), "survey", "EPSG:25831");
    const d = (await res.json()).dataset as DatasetDto;
    const key = (await fileRow(d.id)).objectKey!;
    expect(await object(key)).not.toBeNull();
    const del = await r.dataset.DELETE(
      req(`/api/datasets/${d.id}`, { method: "DELETE", cookie: w.cookies.technician }),
      ctx({ id: d.id }),
    );
    expect(del.status).toBe(204);
    expect(await object(key)).toBeNull();
  });
});
