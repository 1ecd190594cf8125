import Papa from "papaparse";
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { detectDelimiter, MAX_FIELD_CHARS, MAX_LINE_CHARS, readCsv } from "./csv";
import { parseSpanTo } from "./sink";

// Sources: RFC 4180 (quoting rules; the oracle used below is papaparse's own Papa.parse on the whole
// text, an independent parser); CSV conventions of European exports (semicolon with decimal comma,
// BOM, CRLF) are common practice, no source. Expected values are otherwise by construction.

const opts = { source: "planted.csv", role: "planted" as const };
const enc = new TextEncoder();

async function* chunksOf(text: string, sizes: number[]): AsyncGenerator<Uint8Array> {
  const bytes = enc.encode(text);
  let i = 0,
    k = 0;
  while (i < bytes.length) {
    const n = Math.max(1, sizes[k++ % sizes.length]);
    yield bytes.subarray(i, i + n);
    i += n;
  }
}

describe("csv", () => {
  it("readCsv -- comma file with header variants", async () => {
    const r = await readCsv(
      "plant_id,crop,bed,row,Latitude,Longitude\nP1,lettuce,B1,1,52.1,9.2\nP2,lettuce,B1,2,52.2,9.3\n",
      opts,
    );
    expect(r.issues).toEqual([]);
    const t = r.table!;
    expect(t.length).toBe(2);
    expect(Array.from(t.y)).toEqual([52.1, 52.2]);
    expect(Array.from(t.x)).toEqual([9.2, 9.3]);
    expect(Array.from(t.line)).toEqual([2, 3]);
    expect(t.id!.toArray()).toEqual(["P1", "P2"]);
    expect(t.attrs.row).toEqual({ codes: new Int32Array([0, 1]), values: ["1", "2"] });
    expect(r.columns.delimiter).toBe(",");
    expect(r.columns.coordinates).toBe("geographic");
  });

  it("readCsv -- semicolon with decimal comma, BOM and CRLF", async () => {
    const r = await readCsv("\uFEFFplant_id;lat;lon\r\nP1;52,125;9,5\r\nP2;52,25;9,75\r\n", opts);
    expect(r.issues).toEqual([]);
    expect(Array.from(r.table!.y)).toEqual([52.125, 52.25]);
    expect(r.table!.id!.toArray()).toEqual(["P1", "P2"]);
    expect(r.columns).toMatchObject({ delimiter: ";", decimalComma: true });
  });

  it("readCsv -- tab delimiter and projected columns", async () => {
    const r = await readCsv("Easting\tNorthing\tsigma\n552300.1234\t5794100.5\t0.008\n", {
      source: "survey.txt",
      role: "survey",
    });
    expect(r.columns.coordinates).toBe("projected");
    expect(r.table!.x[0]).toBe(552300.1234);
    expect(r.table!.precision![0]).toBe(0.008);
  });

  it("readCsv -- quoted fields with delimiters, quotes and line breaks count physical lines", async () => {
    const text = 'id,crop,lat,lon\n"P,1","let ""tuce""",52.1,9.2\n"P2","two\nlines",52.2,9.3\nP3,x,oops,9.4\n';
    const r = await readCsv(text, opts);
    expect(r.table).toBeNull();
    const bad = r.issues.find((i) => i.code === "coordinate-not-numeric")!;
    expect(bad).toMatchObject({ line: 5, column: "lat", value: "oops", file: "planted.csv", severity: "error" });
    const ok = await readCsv(text.replace("oops", "52.3"), opts);
    expect(ok.table!.id!.toArray()).toEqual(["P,1", "P2", "P3"]);
    expect(ok.table!.attrs.crop!.values).toEqual(['let "tuce"', "two\nlines", "x"]);
    expect(Array.from(ok.table!.line)).toEqual([2, 3, 5]);
  });

  it("readCsv -- text in a coordinate column on line 57", async () => {
    const rows = ["plant_id,lat,lon"];
    for (let i = 2; i <= 100; i++) rows.push(`P${i},${i === 57 ? "n/a" : (52 + i * 1e-6).toFixed(6)},9.1`);
    const r = await readCsv(rows.join("\n"), opts);
    expect(r.table).toBeNull();
    expect(r.issues).toEqual([
      expect.objectContaining({
        severity: "error",
        code: "coordinate-not-numeric",
        line: 57,
        column: "lat",
        value: "n/a",
      }),
    ]);
  });

  it("readCsv -- non-finite, missing and ragged rows", async () => {
    const r = await readCsv("id,lat,lon\nA,Infinity,9\nB,,9\nC,52,9,extra\n", opts);
    expect(r.issues.map((i) => [i.code, i.line])).toEqual([
      ["coordinate-not-finite", 2],
      ["coordinate-missing", 3],
      ["row-field-count", 4],
    ]);
    expect(r.table).toBeNull();
  });

  it("readCsv -- empty file, header only, data without header, zip", async () => {
    expect((await readCsv("", opts)).issues[0].code).toBe("file-empty");
    expect((await readCsv("\n\n", opts)).issues[0].code).toBe("file-empty");
    expect((await readCsv("plant_id,lat,lon\n", opts)).issues[0].code).toBe("file-no-rows");
    expect((await readCsv("52.1,9.2\n52.2,9.3\n", opts)).issues[0].code).toBe("header-missing");
    const zip = (async function* () {
      yield new Uint8Array([0x50, 0x4b, 0x03, 0x04, 1, 2, 3]);
    })();
    expect((await readCsv(zip, opts)).issues[0].code).toBe("file-not-text");
    const failing = (async function* (): AsyncGenerator<string> {
      yield "id,lat,lon\n";
      throw new Error("EACCES: permission denied");
    })();
    expect((await readCsv(failing, opts)).issues[0]).toMatchObject({
      code: "file-unreadable",
      message: "EACCES: permission denied",
    });
  });

  it("readCsv -- caps repeated issues at 50 plus a count", async () => {
    const rows = ["id,lat,lon", ...Array.from({ length: 500 }, (_, i) => `P${i},x,9`)];
    const r = await readCsv(rows.join("\n"), opts);
    expect(r.issues).toHaveLength(51);
    expect(r.issues[50].message).toMatch(/450 more issue\(s\).*500 in total/);
  });

  it("readCsv -- explicit mapping overrides guessing", async () => {
    const r = await readCsv("a,b,c\nP1,552300,5794100\n", {
      ...opts,
      mapping: { id: "a", x: "b", y: "c", coordinates: "projected" },
    });
    expect(r.table!.id!.toArray()).toEqual(["P1"]);
    expect(r.columns.columns).toMatchObject({ id: "a", x: "b", y: "c" });
    expect(r.columns.coordinates).toBe("projected");
  });

  it("readCsv -- mapping null: the guessed fix column is not read", async () => {
    const text = "id,fix,lat,lon\nP1,RTK fixed,52,9\nP2,RTK float,52,9\n";
    expect((await readCsv(text, opts)).table!.attrs.fix!.values).toEqual(["rtk-fixed", "rtk-float"]);
    const r = await readCsv(text, { ...opts, mapping: { fix: null } });
    expect(r.issues).toEqual([]);
    expect(r.table!.attrs.fix).toBeUndefined();
    expect(r.table!.id!.toArray()).toEqual(["P1", "P2"]);
    expect(r.columns.columns.fix).toBeUndefined();
    expect(r.columns.unused).toEqual(["fix"]);
  });

  it("readCsv -- mapping null for a position column: an error, and no table", async () => {
    const r = await readCsv("id,lat,lon\nP1,52,9\n", { ...opts, mapping: { y: null } });
    expect(r.table).toBeNull();
    expect(r.issues.map((i) => i.code)).toEqual(["mapping-coordinate-not-in-file"]);
  });

  it("readCsv -- times, raw GNSS, fix and missing ids", async () => {
    const text =
      "id,fix,time,lat,lon,raw_lat,raw_lon\nP1,4,2025-05-03T08:00:00Z,52,9,52.0000001,9.0000002\n,RTK float,2025-05-03 10:00,52,9,,\n";
    const r = await readCsv(text, opts);
    const t = r.table!;
    expect(t.attrs.fix!.values).toEqual(["rtk-fixed", "rtk-float"]);
    expect(t.time![0]).toBe(1746259200000);
    expect(t.time![1]).toBeNaN();
    expect(t.rawY![0]).toBe(52.0000001);
    expect(t.rawX![1]).toBeNaN();
    expect(r.issues.map((i) => i.code).sort()).toEqual(["id-missing", "time-without-zone"]);
    const withZone = await readCsv(text, { ...opts, timeZone: "Europe/Berlin" });
    expect(withZone.table!.time![1]).toBe(1746259200000);
    expect((await readCsv(text, { ...opts, timeZone: "Nowhere/Land" })).issues[0].code).toBe("time-zone-unknown");
  });

  it("readCsv -- any chunking of the bytes gives the same table as the whole text", async () => {
    const text = '\uFEFFid;crop;lat;lon\r\n"P;1";Möhre;52,1;9,2\r\nP2;"Kohl\r\nrabi";52,2;9,3\r\nP3;Möhre;52,3;9,4\r\n';
    const whole = await readCsv(text, opts);
    await fc.assert(
      fc.asyncProperty(
        fc.array(fc.integer({ min: 1, max: 17 }), { minLength: 1, maxLength: 8 }),
        fc.integer({ min: 1, max: 40 }),
        async (sizes, slice) => {
          const r = await readCsv(chunksOf(text, sizes), { ...opts, sliceChars: slice });
          expect(r.issues).toEqual(whole.issues);
          expect(r.table).toEqual(whole.table);
        },
      ),
      { numRuns: 60 },
    );
    expect(whole.table!.attrs.crop!.values).toEqual(["Möhre", "Kohl\r\nrabi"]);
    expect(Array.from(whole.table!.line)).toEqual([2, 3, 5]);
  });

  it("readCsv -- agrees cell for cell with Papa.parse on generated files", async () => {
    // Oracle: papaparse's Papa.parse of the whole text (RFC 4180 parser, independent of our fast path).
    const cell = fc.stringMatching(/^[A-Za-z0-9 ._-]{0,6}$/);
    await fc.assert(
      fc.asyncProperty(
        fc.array(
          fc.tuple(
            cell,
            fc.double({ min: -89, max: 89, noNaN: true }),
            fc.double({ min: -179, max: 179, noNaN: true }),
          ),
          { minLength: 1, maxLength: 40 },
        ),
        fc.constantFrom(",", ";", "\t"),
        async (rows, d) => {
          const text = [
            ["plant_id", "lat", "lon"].join(d),
            ...rows.map(([id, a, b]) => [id.trim() || "X", String(a), String(b)].join(d)),
          ].join("\n");
          const oracle = Papa.parse<string[]>(text, { delimiter: d, skipEmptyLines: true }).data.slice(1);
          const r = await readCsv(text, { ...opts, sliceChars: 64 });
          expect(r.table!.id!.toArray()).toEqual(oracle.map((o) => o[0].trim()));
          expect(Array.from(r.table!.y)).toEqual(oracle.map((o) => Number(o[1])));
          expect(Array.from(r.table!.x)).toEqual(oracle.map((o) => Number(o[2])));
        },
      ),
      { numRuns: 80 },
    );
  });

  it("parseSpanTo -- equals Number() on decimal strings (Clinger fast path)", () => {
    // Oracle: ECMAScript Number() (correctly rounded string-to-double conversion)
    const out = new Float64Array(1);
    fc.assert(
      fc.property(fc.double({ noNaN: true, noDefaultInfinity: true }), fc.integer({ min: 0, max: 12 }), (v, digits) => {
        const s = v.toFixed(Math.min(digits, 100));
        if (s.includes("e")) return;
        parseSpanTo(` ${s} `, 0, s.length + 2, false, out);
        expect(out[0]).toBe(Number(s));
      }),
      { numRuns: 2000 },
    );
    for (const s of [
      "0.1",
      "-0.000000123",
      "552300.1234",
      "5794100.0001",
      "007",
      "1e5",
      "9007199254740993",
      ".5",
      "5.",
    ]) {
      parseSpanTo(s, 0, s.length, false, out);
      expect(out[0]).toBe(Number(s));
    }
  });

  it("detectDelimiter -- most frequent outside quotes", () => {
    expect(detectDelimiter("id;lat;lon")).toBe(";");
    expect(detectDelimiter("id\tlat\tlon")).toBe("\t");
    expect(detectDelimiter('"a;b",lat,lon')).toBe(",");
  });
});

describe("readCsv limits", () => {
  it("readCsv -- a field over 1,000 characters is an error naming line and column, fast and quoted paths alike", async () => {
    // common practice, no source: limits of our own so a pasted blob is never stored and sent back
    const long = "x".repeat(MAX_FIELD_CHARS + 1);
    for (const cell of [long, `"${long}"`]) {
      const r = await readCsv(`plant_id,crop,lat,lon\nP1,lettuce,52.1,9.2\nP2,${cell},52.1,9.2\n`, {
        source: "long.csv",
        role: "planted",
      });
      expect(r.table).toBeNull();
      expect(r.issues).toEqual([
        expect.objectContaining({ severity: "error", code: "field-too-long", line: 3, column: "crop" }),
      ]);
      expect(r.issues[0].message).toContain("1,001 characters");
    }
  });

  it("readCsv -- a line over 10,000 characters is an error naming the line", async () => {
    // common practice, no source
    const many = Array.from({ length: 30 }, () => "y".repeat(400)).join(",");
    const r = await readCsv(`plant_id,lat,lon,notes\nP1,52.1,9.2,${many}\n`, { source: "wide.csv", role: "planted" });
    expect(r.table).toBeNull();
    expect(r.issues).toEqual([expect.objectContaining({ code: "line-too-long", line: 2 })]);
    expect(r.issues[0].message).toContain(`at most ${MAX_LINE_CHARS.toLocaleString("en")}`);
  });

  it("readCsv -- a 2 MB value in the last column is refused, not stored", async () => {
    const r = await readCsv(`plant_id,lat,lon,crop\nP1,52.1,9.2,${"z".repeat(2 << 20)}\n`, {
      source: "huge.csv",
      role: "planted",
    });
    expect(r.table).toBeNull();
    expect(r.issues[0]).toMatchObject({ code: "field-too-long", line: 2, column: "crop" });
  });
});
