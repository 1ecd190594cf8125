import { mkdtempSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { describe, expect, it } from "vitest";
import { readBoth, readFileJob } from "@/lib/cli/files";

// By construction: reading the planted file in two parts on two threads must give exactly what
// reading it whole on one thread gives (same table, same issues with the same line numbers).
const dir = mkdtempSync(path.join(tmpdir(), "plotproof-read-"));

function plantedFile(name: string, rows: number, edit?: (i: number, line: string) => string): string {
  const lines = ["\uFEFFplant_id,crop,bed,row,fix,planted_at,lat,lon"];
  for (let i = 0; i < rows; i++) {
    const line = `AB-${i},${["leek", "kale", "Möhre"][i % 3]},B${(i / 500) | 0},${((i / 100) % 5) | 0},${i % 7 ? 4 : 5},${i % 11 ? "2025-05-03T08:00:00Z" : "2025-05-03 10:00"},${(52.3 + i * 1e-7).toFixed(9)},${(9.77 + (i % 100) * 3e-6).toFixed(9)}`;
    lines.push(edit ? edit(i, line) : line);
  }
  const p = path.join(dir, name);
  writeFileSync(p, lines.join("\r\n") + "\r\n");
  return p;
}
const survey = path.join(dir, "survey.csv");
writeFileSync(survey, "easting,northing\n552300.1,5794100.2\n552300.3,5794100.4\n");

describe("readBoth", () => {
  it("readBoth -- split across two threads equals a whole read", async () => {
    const planted = plantedFile("p1.csv", 20000, (i, l) => (i % 997 === 0 ? l.replace(/^AB-\d+/, "") : l));
    const [a, b] = await readBoth(
      { path: planted, role: "planted" },
      { path: survey, role: "survey", format: "csv" },
      { parallel: true, splitSlackBytes: 0 },
    );
    const whole = await readFileJob({ path: planted, role: "planted" });
    expect(a.sawQuote).toBe(false);
    expect(a.table).toEqual(whole.table);
    expect(a.issues).toEqual(whole.issues);
    expect(a.issues.map((i) => i.code).sort()).toEqual(["id-missing", "time-without-zone"]);
    expect(b.table!.length).toBe(2);
  });

  it("readBoth -- an error in the second part keeps its file line", async () => {
    const planted = plantedFile("p2.csv", 20000, (i, l) => (i === 19990 ? l.replace(/,52\.\d+,/, ",n/a,") : l));
    const [a] = await readBoth(
      { path: planted, role: "planted" },
      { path: survey, role: "survey" },
      { parallel: true, splitSlackBytes: 0 },
    );
    expect(a.table).toBeNull();
    expect(a.issues.find((i) => i.severity === "error")).toMatchObject({
      code: "coordinate-not-numeric",
      line: 19992,
      value: "n/a",
    });
  });

  it("readBoth -- a quoted field anywhere makes the file be read whole", async () => {
    const planted = plantedFile("p3.csv", 20000, (i, l) =>
      i === 12000 ? l.replace("kale", '"kale, curly"').replace("leek", '"leek, winter"') : l,
    );
    const [a] = await readBoth(
      { path: planted, role: "planted" },
      { path: survey, role: "survey" },
      { parallel: true, splitSlackBytes: 0 },
    );
    const whole = await readFileJob({ path: planted, role: "planted" });
    expect(a.table).toEqual(whole.table);
    expect(a.issues).toEqual(whole.issues);
  });
});
