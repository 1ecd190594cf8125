/**
 * Sources: RFC 4180 (CSV quoting), read back with papaparse 5.7.1 as independent parser; spreadsheet formula
 * injection guidance (prefix "=", "+", "-", "@", tab, CR with a single quote) — common practice, no source.
 */
import fc from "fast-check";
import Papa from "papaparse";
import { describe, expect, it } from "vitest";
import { PAIRED_BY_POSITION } from "@/geo/types";
import { computeAudit } from "./index";
import {
  RESIDUALS_CSV_COLUMNS,
  UNPAIRED_CSV_COLUMNS,
  csvNumberFormatter,
  neutraliseCell,
  residualsCsv,
  summaryCsv,
  summaryRows,
  unpairedCsv,
} from "./residuals-csv";
import { identityPairing, makePairing, makeTable } from "./test-helpers";

function parse(text: string): string[][] {
  const out = Papa.parse<string[]>(text, { skipEmptyLines: true });
  expect(out.errors).toEqual([]);
  return out.data;
}

/** Three plants of the fictional Hollow Brook farm; one id and one crop are hostile. */
function field() {
  const planted = makeTable({
    role: "planted",
    x: [612000, 612000.5, 612001],
    y: [5812000, 5812000.3, 5812000.6],
    id: ["HB-1", '=HYPERLINK("http://x")', "-12"],
    attrs: {
      crop: ["leek", "@SUM(A1)", 'onion, "red"'],
      bed: ["1", "1", "2"],
      arm: ["L", "R", ""],
      fix: ["4", "5", "4"],
    },
  });
  const survey = makeTable({
    role: "survey",
    x: [612000.012, 612000.488, 612001.003, 612005],
    y: [5812000.0, 5812000.31, 5812000.6, 5812005],
    id: ["HB-1", "x", "\tTAB", "+weed"],
  });
  return { planted, survey };
}

describe("residuals CSV", () => {
  it("neutraliseCell -- dangerous first characters get a quote", () => {
    for (const s of ["=1+1", "+1", "-1", "@A1", "\tx", "\rx"]) expect(neutraliseCell(s)).toBe(`'${s}`);
    for (const s of ["", "leek", "B-12", "1=1", " =1"]) expect(neutraliseCell(s)).toBe(s);
  });

  it("csvNumberFormatter -- rounds, drops trailing zeros, never uses exponents", () => {
    const f4 = csvNumberFormatter(4);
    expect(f4(-0.012)).toBe("-0.012");
    expect(f4(612000.12345)).toBe("612000.1235");
    expect(f4(5812000)).toBe("5812000");
    expect(f4(1e-7)).toBe("0");
    expect(f4(-0.00004)).toBe("0");
    expect(f4(Number.NaN)).toBe("");
    expect(csvNumberFormatter(0)(120)).toBe("120");
    expect(csvNumberFormatter(6)(0.0000012)).toBe("0.000001");
    expect(() => csvNumberFormatter(11)).toThrow("residualsCsv: decimals must be an integer 0..10");
    fc.assert(
      fc.property(fc.double({ min: -1e7, max: 1e7, noNaN: true }), fc.integer({ min: 0, max: 7 }), (v, d) => {
        const text = csvNumberFormatter(d)(v);
        expect(text).toMatch(/^-?\d+(\.\d*[1-9])?$/);
        // the cell reads back as the value rounded to d places
        expect(Math.abs(Number(text) - v)).toBeLessThanOrEqual(0.5 * 10 ** -d * (1 + 1e-9) + Math.abs(v) * 1e-15);
      }),
    );
  });

  it("residualsCsv -- header, numbers plain, text neutralised and quoted", () => {
    const { planted, survey } = field();
    const pairing = makePairing([
      [0, 0],
      [1, 1],
      [2, 2],
    ]);
    const { residuals } = computeAudit({
      planted,
      survey,
      pairing,
      options: { toleranceRadial: 0.02, rowBearingDeg: 0 },
    });
    const rows = parse([...residualsCsv({ planted, survey, residuals })].join(""));
    expect(rows[0]).toEqual([...RESIDUALS_CSV_COLUMNS]);
    const col = (name: (typeof RESIDUALS_CSV_COLUMNS)[number]) => RESIDUALS_CSV_COLUMNS.indexOf(name);
    expect(rows).toHaveLength(4);
    expect(rows[1][col("plant_id")]).toBe("HB-1");
    expect(rows[1][col("de_m")]).toBe("0.012");
    expect(rows[2][col("plant_id")]).toBe('\'=HYPERLINK("http://x")');
    expect(rows[2][col("crop")]).toBe("'@SUM(A1)");
    expect(rows[2][col("de_m")]).toBe("-0.012"); // a number keeps its minus sign, no quote
    expect(rows[2][col("fix")]).toBe("5");
    expect(rows[3][col("plant_id")]).toBe("'-12"); // an id is text, even when it looks like a number
    expect(rows[3][col("survey_id")]).toBe("'\tTAB");
    expect(rows[3][col("crop")]).toBe('onion, "red"');
    expect(rows[3][col("arm")]).toBe("");
    expect(rows[1][col("planted_e")]).toBe("612000");
    expect(rows[1][col("survey_e")]).toBe("612000.012");
    expect(rows[1][col("cross_m")]).toBe("0.012"); // rows run north: cross = dE
    expect(rows[2][col("along_m")]).toBe("0.01");
    expect(rows[1][col("within_tolerance")]).toBe("true");
    expect(rows[1][col("outlier")]).toBe("false");
    expect(rows[1][col("paired_by")]).toBe("id");
    // raw text: the minus of a number is not quoted or prefixed
    const text = [...residualsCsv({ planted, survey, residuals })].join("");
    expect(text).toContain(",-0.012,");
    expect(text).not.toContain("'-0.012");
  });

  it("residualsCsv -- chunks join to the same text; empty flags without tolerance or bearing", () => {
    const n = 11;
    const x = Array.from({ length: n }, (_, i) => 612000 + i * 0.5);
    const planted = makeTable({ role: "planted", x, y: x.map(() => 5812000) });
    const survey = makeTable({ role: "survey", x: x.map((v, i) => v + i * 0.001), y: x.map(() => 5812000.002) });
    const pairing = { ...identityPairing(n), method: new Uint8Array(n).fill(PAIRED_BY_POSITION) };
    const { residuals } = computeAudit({ planted, survey, pairing });
    const chunks = [...residualsCsv({ planted, survey, residuals, chunkRows: 4 })];
    expect(chunks).toHaveLength(1 + 3); // header + 4 + 4 + 3 rows
    expect(chunks.join("")).toBe([...residualsCsv({ planted, survey, residuals })].join(""));
    const rows = parse(chunks.join(""));
    expect(rows).toHaveLength(n + 1);
    const col = (name: (typeof RESIDUALS_CSV_COLUMNS)[number]) => RESIDUALS_CSV_COLUMNS.indexOf(name);
    expect(rows[1][col("within_tolerance")]).toBe("");
    expect(rows[1][col("along_m")]).toBe("");
    expect(rows[1][col("paired_by")]).toBe("position");
    expect(rows[4][col("de_m")]).toBe("0.003");
    expect(rows[4][col("dn_m")]).toBe("0.002");
  });

  it("unpairedCsv -- three kinds with file and line", () => {
    const { planted, survey } = field();
    const pairing = makePairing([[0, 0]], { unmatchedPlanted: [1, 2], unmatchedSurvey: [3], ambiguousSurvey: [1] });
    const rows = parse([...unpairedCsv({ planted, survey, pairing })].join(""));
    expect(rows[0]).toEqual([...UNPAIRED_CSV_COLUMNS]);
    expect(rows.slice(1).map((r) => [r[0], r[1], r[2], r[3]])).toEqual([
      ["planted-not-found", '\'=HYPERLINK("http://x")', "planted.csv", "3"],
      ["planted-not-found", "'-12", "planted.csv", "4"],
      ["surveyed-not-planted", "'+weed", "survey.csv", "5"],
      ["ambiguous", "x", "survey.csv", "3"],
    ]);
    expect(rows[3][4]).toBe("612005");
  });

  it("summaryCsv -- flat key/value rows, nulls empty", () => {
    const { planted, survey } = field();
    const { summary } = computeAudit({
      planted,
      survey,
      pairing: makePairing([
        [0, 0],
        [1, 1],
        [2, 2],
      ]),
      options: { toleranceRadial: 0.02, groupBy: ["crop"] },
    });
    const rows = parse([...summaryCsv(summary)].join(""));
    expect(rows[0]).toEqual(["key", "value"]);
    const get = (k: string) => rows.find((r) => r[0] === k)?.[1];
    expect(Number(get("rmseR"))).toBe(summary.rmseR);
    expect(get("meanAlong")).toBe("");
    expect(Number(get("withinTolerance.lower95"))).toBe(summary.withinTolerance!.lower95);
    expect(get("groups.crop[0].key")).toBe("'@SUM(A1)");
    expect(get("status")).toBe("ok");
    expect(summaryRows(summary).length).toBe(rows.length - 1);
  });
});
