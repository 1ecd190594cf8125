/**
 * Reads the first rows of a chosen file off the main thread, so a large file never freezes the page.
 * CSV: only the first megabyte is read and parsed with papaparse; GeoJSON: the whole document is parsed
 * (it cannot be cut), and the first features' properties are returned.
 */
import Papa from "papaparse";
import { detectDelimiter } from "@/geo";
import { ByteDecoder } from "@/geo/read/text";
import type { CsvPreview, GeoJsonPreview, PreviewFailure, PreviewRequest, PreviewResult } from "./preview-types";

const HEAD_BYTES = 1 << 20;

interface WorkerScope {
  postMessage(message: PreviewResult): void;
  addEventListener(type: "message", listener: (event: MessageEvent<PreviewRequest>) => void): void;
}
const scope = self as unknown as WorkerScope;

scope.addEventListener("message", (event) => {
  const { id, file, rows } = event.data;
  preview(id, file, rows)
    .catch(
      (err: unknown): PreviewFailure => ({
        id,
        ok: false,
        message: `The file could not be read in the browser (${err instanceof Error ? err.message : String(err)}).`,
      }),
    )
    .then((result) => scope.postMessage(result));
});

function isGeoJsonName(name: string): boolean {
  return /\.(geo)?json$/i.test(name);
}

function binaryProblem(b: Uint8Array): string | null {
  if (b.length >= 4 && b[0] === 0x50 && b[1] === 0x4b && b[2] === 0x03 && b[3] === 0x04) {
    return "This is a zip archive or a spreadsheet (.xlsx/.ods), not a text file. Export the sheet as CSV and choose that file.";
  }
  if (b.length >= 2 && b[0] === 0x1f && b[1] === 0x8b)
    return "This file is gzip-compressed. Unpack it first and choose the .csv inside.";
  const utf16 = b.length >= 2 && ((b[0] === 0xff && b[1] === 0xfe) || (b[0] === 0xfe && b[1] === 0xff));
  if (!utf16 && b.subarray(0, 4096).includes(0))
    return "This file contains binary data, not text. Choose the CSV or GeoJSON export of the machine.";
  return null;
}

async function preview(id: number, file: File, rows: number): Promise<PreviewResult> {
  if (file.size === 0) return { id, ok: false, message: `“${file.name}” is empty.` };
  const headBytes = new Uint8Array(await file.slice(0, Math.min(file.size, HEAD_BYTES)).arrayBuffer());
  const problem = binaryProblem(headBytes);
  if (problem) return { id, ok: false, message: problem };
  return isGeoJsonName(file.name) ? previewGeoJson(id, file, rows) : previewCsv(id, file, headBytes, rows);
}

function previewCsv(id: number, file: File, bytes: Uint8Array, rows: number): CsvPreview | PreviewFailure {
  const whole = bytes.length >= file.size;
  // The same choice of encoding as the server's reader (UTF-8, UTF-16 with a byte-order mark, else Windows-1252).
  const decoder = new ByteDecoder();
  let text: string;
  try {
    text = decoder.push(bytes) + (whole ? decoder.end() : "");
  } catch (e) {
    return { id, ok: false, message: `This file cannot be read as text: ${(e as Error).message}.` };
  }
  if (text.charCodeAt(0) === 0xfeff) text = text.slice(1);
  const nl = text.indexOf("\n");
  const cr = text.indexOf("\r");
  const lineEnding: CsvPreview["lineEnding"] =
    nl >= 0 ? (nl > 0 && text[nl - 1] === "\r" ? "CRLF" : "LF") : cr >= 0 ? "CR" : "LF";
  const newline = lineEnding === "CRLF" ? "\r\n" : lineEnding === "CR" ? "\r" : "\n";
  const breakChar = lineEnding === "CR" ? "\r" : "\n";
  // Without the whole file, drop the last (probably cut) line.
  if (!whole) {
    const lastBreak = text.lastIndexOf(breakChar);
    if (lastBreak > 0) text = text.slice(0, lastBreak);
  }
  // Non-blank lines after the header (a quoted cell with a line break counts twice: good enough for a count).
  let nonBlank = 0;
  for (let i = 0; i < text.length; ) {
    let end = text.indexOf(breakChar, i);
    if (end < 0) end = text.length;
    for (let k = i; k < end; k++)
      if (text.charCodeAt(k) > 32) {
        nonBlank++;
        break;
      }
    i = end + 1;
  }
  const lines = Math.max(0, nonBlank - 1);

  // Leading blank lines are skipped, as the server's reader does.
  let line = 1;
  let start = 0;
  while (start < text.length) {
    const end = text.indexOf(breakChar, start);
    const candidate = end < 0 ? text.slice(start) : text.slice(start, end);
    if (candidate.trim() !== "") break;
    if (end < 0) {
      start = text.length;
      break;
    }
    start = end + 1;
    line++;
  }
  const body = text.slice(start);
  if (body.trim() === "") return { id, ok: false, message: `“${file.name}” holds only blank lines.` };
  const headerEnd = body.indexOf(breakChar);
  const delimiter = detectDelimiter(headerEnd < 0 ? body : body.slice(0, headerEnd));

  const parsed = Papa.parse<string[]>(body, {
    delimiter,
    newline: newline as "\n",
    quoteChar: '"',
    preview: rows * 3 + 10,
  });
  const [header = [], ...rest] = parsed.data;
  const out: CsvPreview["rows"] = [];
  const breaksIn = (cells: string[]) => cells.reduce((n, c) => n + (c.split(breakChar).length - 1), 0);
  line += breaksIn(header);
  for (const cells of rest) {
    line++;
    const at = line;
    line += breaksIn(cells);
    if (cells.length === 1 && cells[0].trim() === "") continue;
    if (out.length < rows) out.push({ line: at, cells });
  }
  const decimalCommaAccepted = delimiter !== ",";
  const decimalCommaSeen = decimalCommaAccepted && out.some((r) => r.cells.some((c) => /^\s*[+-]?\d+,\d+\s*$/.test(c)));
  const bytesRead = Math.max(1, new TextEncoder().encode(text).length);
  return {
    id,
    ok: true,
    format: "csv",
    header: header.map((h) => h.replace(/^\uFEFF/, "").trim()),
    rows: out,
    delimiter,
    decimalCommaAccepted,
    decimalCommaSeen,
    lineEnding,
    rowCount: whole ? lines : Math.round((lines * file.size) / bytesRead),
    rowCountExact: whole,
  };
}

function cellText(v: unknown): string {
  if (v === null || v === undefined) return "";
  if (typeof v === "string") return v;
  if (typeof v === "number" || typeof v === "boolean") return String(v);
  return JSON.stringify(v);
}

interface FeatureLike {
  type?: unknown;
  id?: unknown;
  geometry?: { type?: unknown; coordinates?: unknown } | null;
  properties?: Record<string, unknown> | null;
}

async function previewGeoJson(id: number, file: File, rows: number): Promise<GeoJsonPreview | PreviewFailure> {
  let doc: unknown;
  try {
    doc = JSON.parse((await file.text()).replace(/^\uFEFF/, ""));
  } catch (err) {
    return {
      id,
      ok: false,
      message: `“${file.name}” is not valid JSON: ${err instanceof Error ? err.message : "it cannot be parsed"}.`,
    };
  }
  const fc = doc as { type?: unknown; features?: unknown; crs?: { properties?: { name?: unknown } } } | null;
  if (!fc || typeof fc !== "object" || fc.type !== "FeatureCollection" || !Array.isArray(fc.features)) {
    return {
      id,
      ok: false,
      message: `“${file.name}” is JSON but not a GeoJSON FeatureCollection; expected {"type": "FeatureCollection", "features": [...]} with one Point feature per plant.`,
    };
  }
  const features = fc.features as (FeatureLike | null)[];
  const keys: string[] = [];
  const seen = new Set<string>();
  let featureIds = false;
  let projected = false;
  const otherGeometries: Record<string, number> = {};
  for (const f of features) {
    if (f && f.id !== undefined && f.id !== null) featureIds = true;
    const p = f?.properties;
    if (p && typeof p === "object")
      for (const k of Object.keys(p))
        if (!seen.has(k)) {
          seen.add(k);
          keys.push(k);
        }
    const g = f?.geometry;
    if (g && g.type !== "Point") otherGeometries[String(g.type)] = (otherGeometries[String(g.type)] ?? 0) + 1;
    const c = g?.coordinates;
    if (
      Array.isArray(c) &&
      typeof c[0] === "number" &&
      typeof c[1] === "number" &&
      (Math.abs(c[0]) > 180 || Math.abs(c[1]) > 90)
    )
      projected = true;
  }
  let crsHint: string | null = null;
  const crsName = fc.crs?.properties?.name;
  if (typeof crsName === "string") {
    const m = /EPSG:{1,2}(?:[\d.]*:)?(\d+)/i.exec(crsName);
    if (m) crsHint = `EPSG:${m[1]}`;
    else if (/CRS84/i.test(crsName)) crsHint = "EPSG:4326";
  }
  const kindFromHint =
    crsHint && crsHint !== "EPSG:4326" && crsHint !== "EPSG:4258"
      ? /^EPSG:(4\d{3})$/.test(crsHint)
        ? "geographic"
        : "projected"
      : null;
  const shown = features.slice(0, rows);
  return {
    id,
    ok: true,
    format: "geojson",
    header: keys,
    rows: shown.map((f, i) => ({ line: i + 1, cells: keys.map((k) => cellText(f?.properties?.[k])) })),
    positions: shown.map((f) => {
      const c = f?.geometry?.coordinates;
      return Array.isArray(c)
        ? c.slice(0, 2).map(String).join(", ")
        : f?.geometry
          ? String(f.geometry.type)
          : "no geometry";
    }),
    featureCount: features.length,
    coordinateKind: kindFromHint ?? (projected ? "projected" : "geographic"),
    crsHint,
    featureIds,
    otherGeometries,
  };
}
