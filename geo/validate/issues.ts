import type { InputIssue } from "../types";

/** Default number of issues of one code kept per file before the rest are only counted. */
export const DEFAULT_ISSUE_CAP = 50;

/**
 * Collects input issues, keeping at most `cap` of each (file, code) and counting the rest, so a
 * broken million-row file yields a readable list instead of a million messages.
 *
 * @example
 * const c = new IssueCollector(2);
 * for (let i = 0; i < 5; i++) c.add({ severity: "error", code: "x", file: "a.csv", message: "bad" });
 * c.finish(); // 2 issues of code "x" plus one "x" summary saying 3 more were left out
 */
export class IssueCollector {
  private readonly kept: InputIssue[] = [];
  private readonly counts = new Map<
    string,
    { n: number; severity: InputIssue["severity"]; file: string; code: string }
  >();

  constructor(private readonly cap: number = DEFAULT_ISSUE_CAP) {}

  /** Adds one issue (dropped but counted beyond the cap for its file and code). */
  add(issue: InputIssue): void {
    const key = `${issue.file}\u0000${issue.code}`;
    let entry = this.counts.get(key);
    if (!entry) {
      entry = { n: 0, severity: issue.severity, file: issue.file, code: issue.code };
      this.counts.set(key, entry);
    }
    entry.n++;
    if (issue.severity === "error") entry.severity = "error";
    if (entry.n <= this.cap) this.kept.push(issue);
  }

  /** Adds several issues. */
  addAll(issues: readonly InputIssue[]): void {
    for (const i of issues) this.add(i);
  }

  /** True once any error was added. */
  hasErrors(): boolean {
    for (const e of this.counts.values()) if (e.severity === "error") return true;
    return false;
  }

  /** Number of issues of a code added so far (including those beyond the cap). */
  count(code: string, file?: string): number {
    let n = 0;
    for (const e of this.counts.values()) if (e.code === code && (file === undefined || e.file === file)) n += e.n;
    return n;
  }

  /** The kept issues followed by one summary per (file, code) that overflowed the cap. */
  finish(): InputIssue[] {
    const out = this.kept.slice();
    for (const e of this.counts.values()) {
      if (e.n > this.cap) {
        out.push({
          severity: e.severity,
          code: e.code,
          file: e.file,
          message: `${e.n - this.cap} more issue(s) of this kind (${e.code}) not listed; ${e.n} in total`,
        });
      }
    }
    return out;
  }
}

/** True when any issue in the list is an error (errors mean no result). */
export function hasErrors(issues: readonly InputIssue[]): boolean {
  return issues.some((i) => i.severity === "error");
}

/**
 * One line of text for an issue, for a terminal or a log:
 * `error planted.csv:57 column "lat" value "abc": expected a number (coordinate-not-numeric)`.
 *
 * @example formatIssue({ severity: "error", code: "c", file: "a.csv", line: 3, message: "m" }) // "error a.csv:3: m (c)"
 */
export function formatIssue(issue: InputIssue): string {
  let where = issue.file;
  if (issue.line !== undefined) where += `:${issue.line}`;
  const parts: string[] = [`${issue.severity} ${where}`];
  if (issue.column !== undefined) parts.push(`column "${issue.column}"`);
  if (issue.value !== undefined) parts.push(`value "${truncate(issue.value, 60)}"`);
  return `${parts.join(" ")}: ${issue.message} (${issue.code})`;
}

function truncate(s: string, n: number): string {
  return s.length <= n ? s : `${s.slice(0, n - 1)}…`;
}
