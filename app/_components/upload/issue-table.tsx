import type { InputIssue } from "@/lib/api-types";

const sentence = (s: string) => (s ? s[0].toUpperCase() + s.slice(1) : s);

/** Issues found in a file: where (file, line, column), what was there, and what was expected. */
export function IssueTable({
  issues,
  caption,
  testId,
}: {
  issues: readonly InputIssue[];
  caption: string;
  testId: string;
}) {
  const sorted = [...issues].sort(
    (a, b) => (a.severity === b.severity ? 0 : a.severity === "error" ? -1 : 1) || (a.line ?? 0) - (b.line ?? 0),
  );
  return (
    <div className="max-h-[28rem] overflow-auto rounded-plot border border-chalk-line">
      <table className="w-full text-left text-sm" data-testid={testId}>
        <caption className="sr-only">{caption}</caption>
        <thead className="sticky top-0 bg-chalk text-ink-soft">
          <tr>
            <th scope="col" className="px-3 py-2 font-medium">
              Kind
            </th>
            <th scope="col" className="px-3 py-2 font-medium">
              File
            </th>
            <th scope="col" className="px-3 py-2 font-medium">
              Line
            </th>
            <th scope="col" className="px-3 py-2 font-medium">
              Column
            </th>
            <th scope="col" className="px-3 py-2 font-medium">
              Value found
            </th>
            <th scope="col" className="px-3 py-2 font-medium">
              What was expected
            </th>
          </tr>
        </thead>
        <tbody className="divide-y divide-chalk-deep">
          {sorted.map((i, n) => (
            <tr key={n} data-line={i.line ?? ""} data-column={i.column ?? ""}>
              <td className={`px-3 py-1.5 font-medium ${i.severity === "error" ? "text-alarm" : "text-loam"}`}>
                {i.severity === "error" ? "Error" : "Warning"}
              </td>
              <td className="px-3 py-1.5 whitespace-nowrap">{i.file}</td>
              <td className="px-3 py-1.5">{i.line ?? "–"}</td>
              <td className="px-3 py-1.5 font-mono text-xs">{i.column ?? "–"}</td>
              <td className="px-3 py-1.5 font-mono text-xs break-all">
                {i.value === undefined ? "–" : i.value === "" ? "(empty)" : i.value}
              </td>
              <td className="px-3 py-1.5">{sentence(i.message)}</td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
