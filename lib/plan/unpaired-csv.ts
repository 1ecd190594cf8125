/**
 * The unpaired-points report of an audit of a planned survey, without the records nobody was asked to survey. Pure.
 * Works on the stored report text (lib/audit/residuals-csv.ts `unpairedCsv`: kind first, then id, RFC 4180 quoting,
 * a leading "'" added before "=", "+", "-", "@", tab or CR), so the kept lines are byte for byte as computed.
 */

const DANGEROUS_FIRST = new Set(["=", "+", "-", "@", "\t", "\r"]);

/** The second cell of a CSV line, unquoted (RFC 4180 §2) and with the spreadsheet guard removed. */
export function secondCell(line: string): string {
  const start = line.indexOf(",") + 1;
  if (start === 0) return "";
  let text: string;
  if (line[start] === '"') {
    let i = start + 1;
    let out = "";
    while (i < line.length) {
      if (line[i] === '"') {
        if (line[i + 1] === '"') {
          out += '"';
          i += 2;
          continue;
        }
        break;
      }
      out += line[i++];
    }
    text = out;
  } else {
    const end = line.indexOf(",", start);
    text = line.slice(start, end < 0 ? undefined : end);
  }
  return text.length > 1 && text[0] === "'" && DANGEROUS_FIRST.has(text[1]) ? text.slice(1) : text;
}

/**
 * Keep the header, every survey-side line ("surveyed-not-planted", "ambiguous") and the "planted-not-found" lines
 * whose plant id the plan chose; drop the planted records that were never sampled. Returns the text and counts.
 *
 * @example filterUnpairedCsv("kind,id\nplanted-not-found,A\nplanted-not-found,B\n", new Set(["B"])).text // "kind,id\nplanted-not-found,B\n"
 */
export function filterUnpairedCsv(
  text: string,
  plannedIds: ReadonlySet<string>,
): { text: string; kept: number; dropped: number } {
  const lines = text.split("\n");
  const out: string[] = [lines[0]];
  let kept = 0;
  let dropped = 0;
  for (let i = 1; i < lines.length; i++) {
    const line = lines[i];
    if (line === "") continue;
    if (line.startsWith("planted-not-found,") && !plannedIds.has(secondCell(line))) {
      dropped++;
      continue;
    }
    out.push(line);
    kept++;
  }
  return { text: `${out.join("\n")}\n`, kept, dropped };
}
