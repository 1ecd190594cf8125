/** Quoting per RFC 4180 §2; the report text comes from the engine's own writer (lib/audit/residuals-csv.ts). */
import { describe, expect, it } from "vitest";
import { filterUnpairedCsv, secondCell } from "./unpaired-csv";

const REPORT = [
  "kind,id,file,line,e,n,crop,bed,row,arm,fix",
  "planted-not-found,LA-1-1-0001,p.csv,2,1,2,lettuce,1,1,1,rtk-fixed",
  "planted-not-found,LA-1-1-0006,p.csv,7,1,2,lettuce,1,1,1,rtk-fixed",
  'planted-not-found,"odd,""id""",p.csv,9,1,2,,,,,',
  "planted-not-found,'-neg,p.csv,10,1,2,,,,,",
  "surveyed-not-planted,,s.csv,4,1,2,,,,,",
  "ambiguous,,s.csv,5,1,2,,,,,",
  "",
].join("\n");

describe("filterUnpairedCsv", () => {
  it("filterUnpairedCsv -- keeps sampled planted records and every survey-side line, byte for byte", () => {
    const r = filterUnpairedCsv(REPORT, new Set(["LA-1-1-0006", 'odd,"id"', "-neg"]));
    expect(r.text).toBe(
      [
        "kind,id,file,line,e,n,crop,bed,row,arm,fix",
        "planted-not-found,LA-1-1-0006,p.csv,7,1,2,lettuce,1,1,1,rtk-fixed",
        'planted-not-found,"odd,""id""",p.csv,9,1,2,,,,,',
        "planted-not-found,'-neg,p.csv,10,1,2,,,,,",
        "surveyed-not-planted,,s.csv,4,1,2,,,,,",
        "ambiguous,,s.csv,5,1,2,,,,,",
        "",
      ].join("\n"),
    );
    expect(r.kept).toBe(5);
    expect(r.dropped).toBe(1);
  });

  it("secondCell -- unquotes and removes the spreadsheet guard", () => {
    expect(secondCell('a,"x ""y"", z",c')).toBe('x "y", z'); // RFC 4180 §2 rule 7
    expect(secondCell("a,'=1,c")).toBe("=1");
    expect(secondCell("a,'plain,c")).toBe("'plain");
  });
});
