import "server-only";
import { z } from "zod";

/**
 * Where raw uploads and report files live, decided once per process from the environment:
 *
 * - Embedded mode (no DATABASE_URL): in the database, as always. OBJECT_STORE_* are ignored (with a warning).
 * - Server mode (DATABASE_URL) with OBJECT_STORE_URL and OBJECT_STORE_BUCKET: in that S3-compatible object store.
 * - Server mode without OBJECT_STORE_URL: in the PostgreSQL database (allowed; fine while files stay moderate).
 */
export type StorageChoice = { kind: "database" } | { kind: "object-store"; config: ObjectStoreConfig };

export interface ObjectStoreConfig {
  url: string;
  bucket: string;
  region: string;
  accessKeyId: string;
  secretAccessKey: string;
}

const Schema = z.object({
  OBJECT_STORE_URL: z.url("OBJECT_STORE_URL must be the object store's endpoint URL, e.g. http://127.0.0.1:9000"),
  OBJECT_STORE_BUCKET: z
    .string({ error: "OBJECT_STORE_BUCKET is required with OBJECT_STORE_URL" })
    .regex(/^[a-z0-9][a-z0-9.-]{1,61}[a-z0-9]$/, "OBJECT_STORE_BUCKET must be a bucket name (3–63 of a-z 0-9 . -)"),
  OBJECT_STORE_REGION: z.string().min(1).default("us-east-1"),
  OBJECT_STORE_ACCESS_KEY: z.string({ error: "OBJECT_STORE_ACCESS_KEY is required with OBJECT_STORE_URL" }).min(1),
  OBJECT_STORE_SECRET_KEY: z.string({ error: "OBJECT_STORE_SECRET_KEY is required with OBJECT_STORE_URL" }).min(1),
});

let warned = false;

/** The storage choice for this environment; throws a message naming the variable when the object store is half set. */
export function storageChoice(env: Record<string, string | undefined> = process.env): StorageChoice {
  if (!env.OBJECT_STORE_URL) return { kind: "database" };
  if (!env.DATABASE_URL) {
    if (!warned) {
      warned = true;
      console.warn("[plotproof] OBJECT_STORE_URL is ignored in embedded mode (no DATABASE_URL): files stay in PGlite.");
    }
    return { kind: "database" };
  }
  const parsed = Schema.safeParse(env);
  if (!parsed.success)
    throw new Error(`Object store settings: ${parsed.error.issues.map((i) => i.message).join("; ")}.`);
  const e = parsed.data;
  return {
    kind: "object-store",
    config: {
      url: e.OBJECT_STORE_URL,
      bucket: e.OBJECT_STORE_BUCKET,
      region: e.OBJECT_STORE_REGION,
      accessKeyId: e.OBJECT_STORE_ACCESS_KEY,
      secretAccessKey: e.OBJECT_STORE_SECRET_KEY,
    },
  };
}
