import { describe, expect, it } from "vitest";
import {
  localDateTime,
  residualsSheet,
  type SheetResidualRow,
  sheetNumber,
  sheetSuffix,
  sheetText,
  summaryLines,
  summarySheet,
  type SummarySheetInput,
} from "./spreadsheet-csv";
import type { AuditSummary } from "./types";

const row = (over: Partial<SheetResidualRow> = {}): SheetResidualRow => ({
  plantId: "P-1",
  surveyId: "S1",
  crop: "lettuce",
  bed: "3",
  row: "2",
  arm: "A",
  fix: "RTK fixed",
  day: "2025-05-13",
  plantedAt: Date.UTC(2025, 4, 12, 23, 30, 5),
  plantedE: 431000.12345,
  plantedN: 5760000.5,
  surveyE: 431000.1,
  surveyN: 5760000.51,
  dE: -0.01234,
  dN: 0.00456,
  along: 0.001,
  cross: null,
  radial: 0.0131,
  within: true,
  outlier: false,
  pairedBy: "id",
  ...over,
});

const split = (text: string) => text.split("\r\n").filter((l) => l !== "");

describe("spreadsheet cells", () => {
  it("sheetNumber -- semicolon uses a decimal comma, comma a decimal point, null is empty", () => {
    expect(sheetNumber("semicolon", 1)(-12.34)).toBe("-12,3");
    expect(sheetNumber("comma", 1)(-12.34)).toBe("-12.3");
    expect(sheetNumber("semicolon", 4)(431000.12345)).toBe("431000,1235");
    expect(sheetNumber("semicolon", 1)(null)).toBe("");
    expect(sheetNumber("comma", 1)(Number.NaN)).toBe("");
  });

  it("sheetText -- a value holding the separator is quoted, one holding the other separator is not", () => {
    expect(sheetText("bed 3; row 2", "semicolon")).toBe('"bed 3; row 2"');
    expect(sheetText("bed 3; row 2", "comma")).toBe("bed 3; row 2");
    expect(sheetText("bed 3, row 2", "comma")).toBe('"bed 3, row 2"');
    expect(sheetText("bed 3, row 2", "semicolon")).toBe("bed 3, row 2");
    expect(sheetText('say "hi"', "comma")).toBe('"say ""hi"""');
  });

  it("sheetText -- text starting with = + - @ is neutralised with a leading quote", () => {
    // common practice, no source (OWASP CSV injection advice, from memory)
    for (const bad of ["=SUM(A1)", "+1", "-2+3", "@cmd"]) expect(sheetText(bad, "comma")).toBe(`'${bad}`);
    expect(sheetText("=A1;B1", "semicolon")).toBe(`"'=A1;B1"`);
    expect(sheetText("B-12", "comma")).toBe("B-12");
  });

  it("localDateTime -- the field's local clock across midnight, and UTC", () => {
    // IANA tzdb: Europe/Amsterdam is UTC+2 in May (CEST)
    expect(localDateTime(Date.UTC(2025, 4, 12, 23, 30), "Europe/Amsterdam")).toBe("2025-05-13 01:30:00");
    expect(localDateTime(Date.UTC(2025, 4, 12, 23, 30), "UTC")).toBe("2025-05-12 23:30:00");
    expect(() => localDateTime(0, "Mars/Olympus")).toThrow(/unknown time zone "Mars\/Olympus"/);
  });

  it("sheetSuffix -- names units and separator", () => {
    expect(sheetSuffix({ units: "mm", sep: "semicolon" })).toBe("mm-semicolon");
  });
});

describe("residualsSheet", () => {
  it("residualsSheet -- millimetres with semicolons: decimal commas, local and UTC planting time, units in the header", () => {
    const lines = split([...residualsSheet([row()], { units: "mm", sep: "semicolon" }, "Europe/Amsterdam")].join(""));
    expect(lines).toHaveLength(2);
    const header = lines[0].split(";");
    expect(header).toContain("east error (mm)");
    expect(header).toContain("planting time (Europe/Amsterdam)");
    const cells = lines[1].split(";");
    const at = (name: string) => cells[header.indexOf(name)];
    expect(at("east error (mm)")).toBe("-12,3");
    expect(at("north error (mm)")).toBe("4,6");
    expect(at("cross-row error (mm)")).toBe("");
    expect(at("distance (mm)")).toBe("13,1");
    expect(at("planted east (m)")).toBe("431000,1235");
    expect(at("planting day (Europe/Amsterdam)")).toBe("2025-05-13");
    expect(at("planted at (UTC)")).toBe("2025-05-12 23:30:05");
    expect(at("planting time (Europe/Amsterdam)")).toBe("01:30:05");
    expect(at("within tolerance")).toBe("yes");
    expect(at("paired by")).toBe("plant id");
    expect(cells).toHaveLength(header.length);
  });

  it("residualsSheet -- metres with commas; text cells quoted and neutralised; no time leaves both time cells empty", () => {
    const rows = [row({ plantId: "=HYPERLINK(1)", crop: "lettuce, red", plantedAt: null, within: null })];
    const lines = split([...residualsSheet(rows, { units: "m", sep: "comma" }, "UTC")].join(""));
    expect(lines[0]).toContain("east error (m)");
    expect(lines[1].startsWith(`'=HYPERLINK(1),S1,"lettuce, red",3,2,A,RTK fixed,2025-05-13,,,431000.1235,`)).toBe(
      true,
    );
    expect(lines[1]).toContain(",-0.0123,0.0046,0.001,,0.0131,,no,plant id");
  });

  it("residualsSheet -- chunks rows without losing any; the input is not modified", () => {
    const rows = Array.from({ length: 5 }, (_, i) => row({ plantId: `P${i}` }));
    const before = JSON.stringify(rows);
    const chunks = [...residualsSheet(rows, { units: "mm", sep: "comma" }, "UTC", 2)];
    expect(chunks).toHaveLength(4);
    expect(split(chunks.join(""))).toHaveLength(6);
    expect(JSON.stringify(rows)).toBe(before);
  });
});

const summary = {
  pairs: 375,
  pairedById: 375,
  pairedByPosition: 0,
  unmatchedPlanted: 2,
  unmatchedSurvey: 0,
  ambiguousSurvey: 0,
  meanDE: 0.0012,
  meanDN: -0.0003,
  rmseE: 0.005,
  rmseN: 0.0057,
  rmseR: 0.0076,
  cep50: 0.006,
  r95: 0.0074,
  nssda95: 0.0131,
  rmseCross: 0.004,
  rmseAlong: 0.0064,
  rowBearingDeg: 12.5,
  withinTolerance: {
    share: 0.968,
    lower95: 0.945,
    upper95: 0.983,
    within: 363,
    n: 375,
    confidence: 0.95,
    limits: { radial: 0.03, cross: null, along: null },
  },
  outliers: { count: 4 },
  withoutOutliers: { rmseR: 0.007 },
} as unknown as AuditSummary;

const input: SummarySheetInput = {
  title: "Long Acre; spring",
  fieldName: "Long Acre",
  revision: 2,
  stateLabel: "Signed off",
  computedAt: "2025-05-14T08:00:00.000Z",
  profile: {
    name: "Inter-row hoeing",
    operation: "hoeing",
    radialM: 0.03,
    crossM: null,
    alongM: null,
    requiredShare: 0.95,
    confidence: 0.95,
    minCheckpoints: 30,
  },
  verdict: { passed: true, criteria: [{ passed: true, text: "375 checkpoints; at least 30 needed" }] },
  summary,
  signoff: { signerName: "Maren Holt", signedAt: "2025-05-15T09:00:00.000Z", sha256: "ab".repeat(32) },
};

describe("summarySheet", () => {
  it("summaryLines -- labelled rows with units, not key names; title, profile, verdict and hash when signed", () => {
    const lines = summaryLines(input, "mm");
    const find = (label: string) => lines.find((l) => l.label === label);
    expect(find("Horizontal RMSE")).toEqual({ label: "Horizontal RMSE", value: 7.6, unit: "mm" });
    expect(find("Distance limit")).toEqual({ label: "Distance limit", value: 30, unit: "mm" });
    expect(find("Revision")?.value).toBe(2);
    expect(find("Tolerance profile")?.value).toBe("Inter-row hoeing");
    expect(find("Verdict")?.value).toBe("Pass");
    expect(find("Sign-off hash (SHA-256)")?.value).toBe("ab".repeat(32));
    expect(find("Horizontal RMSE without outliers")?.unit).toBe("mm");
    expect(lines.some((l) => /[a-z][A-Z]/.test(l.label))).toBe(false);
  });

  it("summaryLines -- no sign-off lines for an audit not signed", () => {
    expect(summaryLines({ ...input, signoff: null }, "m").some((l) => l.label.startsWith("Sign"))).toBe(false);
    expect(summaryLines(input, "m").find((l) => l.label === "Horizontal RMSE")?.value).toBe(0.0076);
  });

  it("summarySheet -- semicolon: decimal commas, the title with a semicolon quoted, percentages to 0.01", () => {
    const lines = split(summarySheet(input, { units: "mm", sep: "semicolon" }));
    expect(lines[0]).toBe("label;value;unit");
    expect(lines).toContain('Audit;"Long Acre; spring";');
    expect(lines).toContain("Horizontal RMSE;7,6;mm");
    expect(lines).toContain("Share within every limit;96,8;%");
    expect(lines).toContain("Pairs (checkpoints);375;count");
    expect(lines).toContain("Row bearing;12,5;°");
  });

  it("summarySheet -- comma and metres", () => {
    const lines = split(summarySheet(input, { units: "m", sep: "comma" }));
    expect(lines[0]).toBe("label,value,unit");
    expect(lines).toContain("Horizontal RMSE,0.0076,m");
    expect(lines).toContain("Audit,Long Acre; spring,");
  });
});
