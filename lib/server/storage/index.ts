import "server-only";
import { randomUUID } from "node:crypto";
import { AppError } from "@/lib/errors";
import { sha256Hex } from "@/lib/review/hash";
import { storageChoice } from "./config";
import { type ObjectStore, s3ObjectStore } from "./s3";

/**
 * The one module that decides where raw uploads and report files live (see ./config.ts): in the database, or in an
 * S3-compatible object store (server mode). Nothing else knows which. Rows keep either the bytes or the object's
 * write-once key (a fresh uuid in every key, so an object is never overwritten); sizes and SHA-256 stay in the
 * database either way, and every read from the object store is checked against them.
 *
 * Nothing half-saved: objects are written first, then the rows in the caller's transaction; if that fails, the
 * objects are deleted again (best effort — an object no row names is never read).
 */

export type { ObjectStore } from "./s3";

/** How a file's bytes are kept by its row: the bytes themselves, or the key of an object. */
export type Placement = { bytes: Uint8Array; objectKey: null } | { bytes: null; objectKey: string };

/** What a row holds of a stored file (either may be null, never both). */
export interface StoredFile {
  bytes: Uint8Array | null;
  objectKey: string | null;
}

const g = globalThis as unknown as { __plotproofObjects?: { store: ObjectStore | null } };

/** The object store of this process, or null when files live in the database. */
export function objectStore(): ObjectStore | null {
  if (!g.__plotproofObjects) {
    const choice = storageChoice();
    if (choice.kind === "database") g.__plotproofObjects = { store: null };
    else {
      const s3 = s3ObjectStore(choice.config);
      // The bucket is checked (and created if missing) once; a failure is tried again on the next use.
      let ready: Promise<void> | null = null;
      const bucket = () => {
        ready ??= s3.ensureBucket().catch((err) => {
          ready = null;
          throw err;
        });
        return ready;
      };
      const store: ObjectStore = {
        where: s3.where,
        ensureBucket: bucket,
        put: async (k, b, t) => {
          await bucket();
          return s3.put(k, b, t);
        },
        get: async (k) => {
          await bucket();
          return s3.get(k);
        },
        delete: (k) => s3.delete(k),
      };
      g.__plotproofObjects = { store };
    }
  }
  return g.__plotproofObjects.store;
}

/**
 * At start-up (app instances, workers): where files are kept, as a line for the log. Throws when the object store is
 * half configured or its bucket can neither be found nor created, so a wrong setting stops the process at once.
 */
export async function checkFileStorage(): Promise<string> {
  const store = objectStore();
  if (!store) return "[plotproof] files (uploads, reports) are kept in the database.";
  await store.ensureBucket?.();
  return `[plotproof] files (uploads, reports) are kept in the object store: ${store.where}.`;
}

/** Tests choose the store (null: the database); undefined goes back to the environment's choice. */
export function setObjectStoreForTests(store: ObjectStore | null | undefined): void {
  g.__plotproofObjects = store === undefined ? undefined : { store };
}

/** A file to keep: the organisation it belongs to, what it is (a path-like name inside the org) and its bytes. */
export interface FileToKeep {
  orgId: string;
  /** e.g. "uploads" or `reports/<auditId>/residuals`. */
  name: string;
  bytes: Uint8Array;
  contentType: string;
}

/** A write-once key: organisation, name, a fresh uuid. */
export function objectKeyFor(orgId: string, name: string): string {
  return `orgs/${orgId}/${name}/${randomUUID()}`;
}

/**
 * Keep files, then save the rows that name them: with an object store the objects are written first and `save` gets
 * their keys; if `save` throws, the objects are deleted again and the error goes on. Without one, `save` gets the
 * bytes to store in its rows.
 */
export async function keepFilesThenSave<T>(
  files: readonly FileToKeep[],
  save: (placements: Placement[]) => Promise<T>,
): Promise<T> {
  const store = objectStore();
  if (!store) return save(files.map((f) => ({ bytes: f.bytes, objectKey: null })));
  const written: string[] = [];
  try {
    for (const f of files) {
      const key = objectKeyFor(f.orgId, f.name);
      await putObject(store, key, f);
      written.push(key);
    }
    return await save(written.map((objectKey) => ({ bytes: null, objectKey })));
  } catch (err) {
    await discardObjects(written);
    throw err;
  }
}

async function putObject(store: ObjectStore, key: string, f: FileToKeep): Promise<void> {
  try {
    await store.put(key, f.bytes, f.contentType);
  } catch (err) {
    console.error(`[plotproof] object store: writing ${key} to ${store.where} failed`, err);
    throw new AppError("internal", "The file store could not take the file; nothing was saved. Try again later.");
  }
}

/** Delete objects no row names any more (a failed save, a deleted dataset). Best effort: failures are logged. */
export async function discardObjects(keys: readonly (string | null | undefined)[]): Promise<void> {
  const store = objectStore();
  const real = keys.filter((k): k is string => !!k);
  if (!store || real.length === 0) return;
  for (const key of real) {
    try {
      await store.delete(key);
    } catch (err) {
      console.error(`[plotproof] object store: could not delete ${key} from ${store.where}`, err);
    }
  }
}

/** Why a stored file cannot be given out: its object is missing, or no longer what was stored. */
export class StoredFileProblem extends AppError {
  constructor(
    message: string,
    public readonly problem: "missing" | "changed",
  ) {
    super("conflict", message);
  }
}

/**
 * The bytes of a stored file, from its row or the object store, checked against the SHA-256 (else the size) the
 * database recorded, when given; `what` names the file in messages ("survey.csv", "the residuals report").
 * `check: false` returns whatever the store holds (verification hashes it itself and says what differs).
 */
export async function readStored(
  ref: StoredFile,
  what: string,
  expect: { sha256?: string | null; sizeBytes?: number | null; check?: boolean } = {},
): Promise<Uint8Array> {
  const bytes = ref.bytes ?? (await readObject(ref.objectKey, what));
  if (expect.check === false) return bytes;
  const where = ref.objectKey ? ` (object store key ${ref.objectKey})` : " (in the database)";
  if (expect.sha256) {
    const now = sha256Hex(bytes);
    if (now !== expect.sha256)
      throw new StoredFileProblem(
        `The stored copy of ${what} was changed outside Plotproof: it now holds ${bytes.length} bytes hashing to SHA-256 ${now.slice(0, 16)}…, not the recorded ${expect.sha256.slice(0, 16)}…${where}. It is not given out.`,
        "changed",
      );
  } else if (expect.sizeBytes != null && expect.sizeBytes !== bytes.length) {
    throw new StoredFileProblem(
      `The stored copy of ${what} was changed outside Plotproof: ${bytes.length} bytes instead of ${expect.sizeBytes}${where}. It is not given out.`,
      "changed",
    );
  }
  return bytes;
}

async function readObject(objectKey: string | null, what: string): Promise<Uint8Array> {
  if (!objectKey) throw new StoredFileProblem(`The stored copy of ${what} is missing.`, "missing");
  const store = objectStore();
  if (!store)
    throw new StoredFileProblem(
      `This server has no object store configured, but ${what} is kept in one (set OBJECT_STORE_URL and the other OBJECT_STORE_* variables).`,
      "missing",
    );
  let bytes: Uint8Array | null;
  try {
    bytes = await store.get(objectKey);
  } catch (err) {
    console.error(`[plotproof] object store: reading ${objectKey} from ${store.where} failed`, err);
    throw new AppError("internal", `The file store could not be read for ${what}; try again later.`);
  }
  if (!bytes)
    throw new StoredFileProblem(
      `The stored copy of ${what} is missing from the object store (key ${objectKey}); it was removed outside Plotproof.`,
      "missing",
    );
  return bytes;
}
