/**
 * The one place that opens the database. Everything else asks `getDb()`.
 *
 * Embedded PostgreSQL (PGlite) on disk by default (`PGLITE_DIR`, default ./data/pglite),
 * or in memory with `PGLITE_DIR=memory://`. Pointing the same schema at a PostgreSQL server
 * means swapping the driver here (drizzle-orm/node-postgres) and nothing else.
 */
import path from "node:path";
import fs from "node:fs";
import { PGlite } from "@electric-sql/pglite";
import { drizzle, type PgliteDatabase } from "drizzle-orm/pglite";
import { migrate } from "drizzle-orm/pglite/migrator";
import * as schema from "./schema";

export type DB = PgliteDatabase<typeof schema> & { $client: PGlite };

// PGlite's own bytea codec goes byte by byte through strings (about 10 s for a 10 MB upload).
// Passing the bytes through makes the wire protocol send them in binary; results are decoded from hex natively.
const BYTEA = 17;
const BYTEA_SERIALIZERS = { [BYTEA]: (v: unknown) => v as string };
const BYTEA_PARSERS = {
  [BYTEA]: (s: string) => {
    const b = Buffer.from(s.slice(2), "hex");
    return new Uint8Array(b.buffer, b.byteOffset, b.byteLength);
  },
};

const MIGRATIONS_DIR = path.join(/* turbopackIgnore: true */ process.cwd(), "db", "migrations");

/** Open a database (on disk or in memory) and bring it to the latest migration. Fails loudly. */
export async function openDb(dataDir: string, migrationsDir = MIGRATIONS_DIR): Promise<DB> {
  if (!dataDir.startsWith("memory://")) fs.mkdirSync(dataDir, { recursive: true }); // PGlite won't create parents
  const client = await PGlite.create(dataDir, { serializers: BYTEA_SERIALIZERS, parsers: BYTEA_PARSERS });
  const db = drizzle({ client, schema }) as DB;
  await migrate(db, { migrationsFolder: migrationsDir });
  return db;
}

const g = globalThis as unknown as { __plotproofDb?: Promise<DB> };

/** The process-wide database; opened lazily so `next build` never touches data/. */
export function getDb(): Promise<DB> {
  if (!g.__plotproofDb) {
    const dir = process.env.PGLITE_DIR ?? path.join(/* turbopackIgnore: true */ process.cwd(), "data", "pglite");
    g.__plotproofDb = openDb(dir);
    g.__plotproofDb.catch(() => {
      g.__plotproofDb = undefined;
    });
  }
  return g.__plotproofDb;
}

/** Tests inject their own in-memory database. */
export function setDbForTests(db: DB): void {
  g.__plotproofDb = Promise.resolve(db);
}
