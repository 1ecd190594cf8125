import { describe, expect, it } from "vitest";
import { formatIssue, hasErrors, IssueCollector } from "./issues";

// Self-constructed checks of message plumbing (no published source applies).
describe("issues", () => {
  it("IssueCollector -- keeps the first N of a kind and summarises the rest", () => {
    const c = new IssueCollector(3);
    for (let i = 0; i < 10; i++)
      c.add({ severity: "error", code: "coordinate-not-numeric", file: "a.csv", line: i + 2, message: "x" });
    c.add({ severity: "warning", code: "other", file: "a.csv", message: "y" });
    const out = c.finish();
    expect(out.filter((i) => i.code === "coordinate-not-numeric")).toHaveLength(4);
    expect(out.at(-1)!.message).toMatch(
      /7 more issue\(s\) of this kind \(coordinate-not-numeric\) not listed; 10 in total/,
    );
    expect(c.count("coordinate-not-numeric")).toBe(10);
    expect(c.hasErrors()).toBe(true);
    expect(hasErrors(out)).toBe(true);
  });

  it("IssueCollector -- caps per file", () => {
    const c = new IssueCollector(1);
    c.add({ severity: "warning", code: "k", file: "a", message: "" });
    c.add({ severity: "warning", code: "k", file: "b", message: "" });
    expect(c.finish()).toHaveLength(2);
    expect(c.hasErrors()).toBe(false);
  });

  it("formatIssue -- names file, line, column, value and code", () => {
    expect(
      formatIssue({
        severity: "error",
        code: "coordinate-not-numeric",
        file: "planted.csv",
        line: 57,
        column: "lat",
        value: "abc",
        message: "expected a number",
      }),
    ).toBe('error planted.csv:57 column "lat" value "abc": expected a number (coordinate-not-numeric)');
  });
});
