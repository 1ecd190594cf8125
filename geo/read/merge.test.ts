import { describe, expect, it } from "vitest";
import { readCsv } from "./csv";
import { appendReadResults } from "./merge";

// By construction: reading a file in two parts (the second led by the header line) and appending
// must equal reading it whole.
const text = [
  "plant_id,crop,fix,planted_at,lat,lon",
  "P1,leek,4,2025-05-03T08:00:00Z,52.1,9.1",
  ",leek,5,2025-05-03 10:00,52.2,9.2",
  "P3,kale,4,,52.3,9.3",
  "",
  "P4,chard,4,2025-05-03T08:00:00Z,52.4,9.4",
  ",kale,1,2025-05-03 11:00,52.5,9.5",
  "P6,chard,x,2025-05-03T08:00:00Z,oops,9.6",
].join("\n");
const opts = { source: "planted.csv", role: "planted" as const };

describe("merge", () => {
  it("appendReadResults -- two parts equal the whole file", async () => {
    const lines = text.split("\n");
    for (let cut = 2; cut < lines.length; cut++) {
      const firstText = lines.slice(0, cut).join("\n") + "\n";
      const secondText = [lines[0], ...lines.slice(cut)].join("\n");
      const whole = await readCsv(text.replace("oops", "52.6"), opts);
      const first = await readCsv(firstText.replace("oops", "52.6"), opts);
      const second = await readCsv(secondText.replace("oops", "52.6"), opts);
      const merged = appendReadResults(first, second, first.linesRead! - 1);
      expect(merged.table).toEqual(whole.table);
      expect(merged.issues).toEqual(whole.issues);
      expect(merged.linesRead).toBe(whole.linesRead);
    }
  });

  it("appendReadResults -- errors of the second part carry file lines", async () => {
    const lines = text.split("\n");
    const first = await readCsv(lines.slice(0, 4).join("\n") + "\n", opts);
    const second = await readCsv([lines[0], ...lines.slice(4)].join("\n"), opts);
    const merged = appendReadResults(first, second, first.linesRead! - 1);
    const whole = await readCsv(text, opts);
    expect(merged.table).toBeNull();
    expect(merged.issues.find((i) => i.code === "coordinate-not-numeric")).toEqual(
      whole.issues.find((i) => i.code === "coordinate-not-numeric"),
    );
    expect(merged.issues.find((i) => i.code === "coordinate-not-numeric")!.line).toBe(8);
  });
});
