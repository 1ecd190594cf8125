/**
 * The one place that opens the database. Everything else asks `getDb()` and never learns which engine it talks to.
 *
 * - Embedded (default): PGlite on disk (`PGLITE_DIR`, default ./data/pglite), or in memory with `PGLITE_DIR=memory://`.
 *   One process owns the data directory.
 * - Server: with `DATABASE_URL` set, a PostgreSQL server through node-postgres (`pg`), shared by several app
 *   instances and workers. The same Drizzle schema and migrations run on both.
 *
 * Raw SQL goes through `db.$client.query(text, params)` (both drivers answer `{ rows }`); bulk inserts through
 * `copyRows` (db/copy.ts), which picks the engine's fast path.
 */
import path from "node:path";
import fs from "node:fs";
import { PGlite } from "@electric-sql/pglite";
import { drizzle as drizzlePglite, type PgliteDatabase } from "drizzle-orm/pglite";
import { migrate as migratePglite } from "drizzle-orm/pglite/migrator";
import { drizzle as drizzlePg } from "drizzle-orm/node-postgres";
import { migrate as migratePg } from "drizzle-orm/node-postgres/migrator";
import pg from "pg";
import * as schema from "./schema";

/** What raw SQL needs of either driver. */
export interface SqlClient {
  query<T = Record<string, unknown>>(text: string, params?: unknown[]): Promise<{ rows: T[] }>;
}

/** The engine behind a database handle. */
export type DbEngine = { kind: "embedded"; pglite: PGlite } | { kind: "server"; pool: pg.Pool };

/**
 * A database handle. Typed as Drizzle's PGlite database (the node-postgres one has the same query API; `execute`
 * answers `{ rows }` on both), with `$client` narrowed to what both drivers share.
 */
export type DB = Omit<PgliteDatabase<typeof schema>, "$client"> & { $client: SqlClient; $engine: DbEngine };

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

/** Open an embedded database (on disk or in memory) and bring it to the latest migration. Fails loudly. */
export async function openDb(dataDir: string, migrationsDir = MIGRATIONS_DIR): Promise<DB> {
  if (!dataDir.startsWith("memory://")) fs.mkdirSync(dataDir, { recursive: true }); // PGlite won't create parents
  const client = await PGlite.create(dataDir, { serializers: BYTEA_SERIALIZERS, parsers: BYTEA_PARSERS });
  const db = drizzlePglite({ client, schema });
  await migratePglite(db, { migrationsFolder: migrationsDir });
  return Object.assign(db, { $engine: { kind: "embedded", pglite: client } as const }) as unknown as DB;
}

/** Open a PostgreSQL server database by URL and bring it to the latest migration. Fails loudly. */
export async function openServerDb(url: string, migrationsDir = MIGRATIONS_DIR): Promise<DB> {
  const pool = new pg.Pool({ connectionString: url, max: Number(process.env.DATABASE_POOL_SIZE ?? 10) });
  const db = drizzlePg({ client: pool, schema });
  // Several instances may start at once: one applies the migrations, the others wait for its lock.
  const lock = await pool.connect();
  try {
    await lock.query("select pg_advisory_lock(724519)");
    await migratePg(db, { migrationsFolder: migrationsDir });
  } finally {
    await lock.query("select pg_advisory_unlock(724519)").catch(() => {});
    lock.release();
  }
  return Object.assign(db, { $engine: { kind: "server", pool } as const }) as unknown as DB;
}

/** Closes the database's connections (tests, scripts). */
export async function closeDb(db: DB): Promise<void> {
  if (db.$engine.kind === "embedded") await db.$engine.pglite.close();
  else await db.$engine.pool.end();
}

const g = globalThis as unknown as { __plotproofDb?: Promise<DB> };

/** The process-wide database; opened lazily so `next build` never touches data/. */
export function getDb(): Promise<DB> {
  if (!g.__plotproofDb) {
    const url = process.env.DATABASE_URL;
    const dir = process.env.PGLITE_DIR ?? path.join(/* turbopackIgnore: true */ process.cwd(), "data", "pglite");
    g.__plotproofDb = url ? openServerDb(url) : openDb(dir);
    g.__plotproofDb.catch(() => {
      g.__plotproofDb = undefined;
    });
  }
  return g.__plotproofDb;
}

/** True when this process talks to a PostgreSQL server (several processes may share it). */
export function isServerMode(): boolean {
  return !!process.env.DATABASE_URL;
}

/** Tests inject their own database. */
export function setDbForTests(db: DB): void {
  g.__plotproofDb = Promise.resolve(db);
}
