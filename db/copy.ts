/**
 * Bulk insert through PostgreSQL's COPY … FROM with PGlite's in-memory '/dev/blob' file: one CSV
 * text per batch instead of an INSERT with tens of thousands of bound parameters, which PGlite
 * spends most of its time encoding. Rows of one batch must share their keys (they come from one
 * builder); columns not in the rows get their defaults. On a PostgreSQL server the rows go in as multi-row INSERTs
 * under the protocol's limit of 65,535 bound parameters.
 */
import { getTableColumns, getTableName, type Column } from "drizzle-orm";
import type { PgTable } from "drizzle-orm/pg-core";
import type { DB } from "./client";

/** One value in PostgreSQL's CSV format: empty (unquoted) is NULL, text is always quoted. */
function cell(v: unknown, col: Column): string {
  if (v === null || v === undefined) return "";
  if (typeof v === "number") return Number.isFinite(v) ? String(v) : v !== v ? "NaN" : v > 0 ? "Infinity" : "-Infinity";
  if (typeof v === "boolean") return v ? "t" : "f";
  const s =
    v instanceof Date
      ? v.toISOString()
      : typeof v === "string"
        ? v
        : col.dataType === "json"
          ? JSON.stringify(v)
          : String(v);
  return `"${s.replace(/"/g, '""')}"`;
}

/** Inserts `rows` into `table` with one COPY statement. */
export async function copyRows<T extends PgTable>(db: DB, table: T, rows: readonly T["$inferInsert"][]): Promise<void> {
  if (rows.length === 0) return;
  if (db.$engine.kind === "server") {
    const perRow = Math.max(1, Object.keys(rows[0] as object).length);
    const step = Math.max(1, Math.floor(60_000 / perRow));
    for (let i = 0; i < rows.length; i += step)
      await db.insert(table).values(rows.slice(i, i + step) as T["$inferInsert"][]);
    return;
  }
  const pglite = db.$engine.pglite;
  const columns = Object.entries(getTableColumns(table)).filter(([key]) => key in (rows[0] as object));
  const lines: string[] = new Array(rows.length);
  for (let i = 0; i < rows.length; i++) {
    const row = rows[i] as Record<string, unknown>;
    let line = "";
    for (let k = 0; k < columns.length; k++) line += (k ? "," : "") + cell(row[columns[k][0]], columns[k][1]);
    lines[i] = line;
  }
  const names = columns.map(([, c]) => `"${c.name}"`).join(", ");
  await pglite.query(`COPY "${getTableName(table)}" (${names}) FROM '/dev/blob' WITH (FORMAT csv)`, [], {
    blob: new Blob([lines.join("\n") + "\n"]),
  });
}
