import type { InputIssue } from "@/lib/api-types";

const PLAIN_NUMBER = /^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/;
const DANGEROUS_FIRST = new Set(["=", "+", "-", "@", "\t", "\r"]);

/**
 * One CSV cell: a text that a spreadsheet would run as a formula (starting with = + - @, tab or CR) gets a
 * leading single quote, except a plain number such as -12.5; then quoted per RFC 4180 when needed.
 */
export function csvCell(value: string | number | undefined | null): string {
  if (value === undefined || value === null) return "";
  let text = String(value);
  if (text.length > 0 && DANGEROUS_FIRST.has(text[0]) && !PLAIN_NUMBER.test(text)) text = `'${text}`;
  return /[",\r\n]/.test(text) ? `"${text.replace(/"/g, '""')}"` : text;
}

export const ISSUE_CSV_COLUMNS = ["severity", "file", "line", "column", "value", "expected", "code"] as const;

/** The issues of a refused upload as CSV text (header first, LF line ends). */
export function issuesCsv(issues: readonly InputIssue[]): string {
  const rows = issues.map((i) =>
    [i.severity, i.file, i.line, i.column, i.value, i.message, i.code].map(csvCell).join(","),
  );
  return [ISSUE_CSV_COLUMNS.join(","), ...rows].join("\n") + "\n";
}

/** A file name made of safe characters, e.g. "reed-margin-as-planted-problems.csv". */
export function safeFileName(...parts: string[]): string {
  return (
    parts
      .join("-")
      .toLowerCase()
      .replace(/[^a-z0-9]+/g, "-")
      .replace(/^-+|-+$/g, "") + ".csv"
  );
}

/** Offers `text` as a download in the browser. */
export function downloadText(text: string, fileName: string, type = "text/csv;charset=utf-8"): void {
  const url = URL.createObjectURL(new Blob([text], { type }));
  const a = document.createElement("a");
  a.href = url;
  a.download = fileName;
  document.body.appendChild(a);
  a.click();
  a.remove();
  setTimeout(() => URL.revokeObjectURL(url), 1000);
}
