import { describe, expect, it } from "vitest";
import { boolean, doublePrecision, integer, pgTable, text } from "drizzle-orm/pg-core";
import { asc } from "drizzle-orm";
import { closeDb, openDb } from "./client";
import { copyRows } from "./copy";

const sample = pgTable("copy_sample", {
  seq: integer("seq").notNull(),
  note: text("note"),
  value: doublePrecision("value"),
  flag: boolean("flag"),
});

describe("copyRows", () => {
  it("copyRows -- text with quotes, commas and line breaks, empty text vs null, doubles exactly, booleans", async () => {
    const db = await openDb("memory://");
    if (db.$engine.kind !== "embedded") throw new Error("embedded database expected");
    await db.$engine.pglite.exec(
      "create table copy_sample (seq integer not null, note text, value double precision, flag boolean)",
    );
    const rows = [
      { seq: 1, note: 'say "hi", then\nleave', value: 0.1 + 0.2, flag: true },
      // biome-ignore lint/correctness/noPrecisionLoss: the literal is meant to use every digit a double holds.
      { seq: 2, note: "", value: -1.2345678901234567e-7, flag: false },
      { seq: 3, note: null, value: null, flag: null },
      { seq: 4, note: "=SUM(A1)", value: Number.NaN, flag: true },
    ];
    await copyRows(db, sample, rows);
    const back = await db.select().from(sample).orderBy(asc(sample.seq));
    expect(back).toEqual(rows);
    await closeDb(db);
  });
});
