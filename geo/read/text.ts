/**
 * Text input for the readers: a whole string, or chunks of text or bytes (a file stream, an upload
 * stream). Bytes are decoded with the platform's TextDecoder (WHATWG Encoding Standard) in the encoding
 * `ByteDecoder` detects: UTF-8 (a byte-order mark is dropped), UTF-16 LE/BE when the file starts with
 * their byte-order mark, otherwise Windows-1252 when the bytes are not valid UTF-8.
 */
import type { InputIssue } from "../types";

/** What a reader accepts. */
export type TextInput = string | AsyncIterable<string | Uint8Array> | Iterable<string | Uint8Array>;

/** Minimal TextDecoder shape (present in browsers and Node; declared here so geo/ needs no DOM types). */
interface PlatformDecoder {
  decode(input?: Uint8Array, options?: { stream?: boolean }): string;
}
declare const TextDecoder: {
  new (label?: string, options?: { fatal?: boolean; ignoreBOM?: boolean }): PlatformDecoder;
};

/** Thrown (and turned into an issue by the readers) when the bytes are not a text file we can decode. */
export class NotTextError extends Error {
  constructor(
    message: string,
    /** Line (1-based) where the problem was found, when known. */
    readonly line?: number,
    readonly code: string = "file-not-text",
  ) {
    super(message);
  }
}

/** Size of the string slices a reader works on. */
export const SLICE = 1 << 20;

/** Encodings the readers decode. */
export type TextEncoding = "utf-8" | "utf-8-bom" | "utf-16le" | "utf-16be" | "windows-1252";

/** Names of the encodings as messages say them. */
export const ENCODING_NAMES: Record<TextEncoding, string> = {
  "utf-8": "UTF-8",
  "utf-8-bom": "UTF-8 with a byte-order mark",
  "utf-16le": "UTF-16 LE",
  "utf-16be": "UTF-16 BE",
  "windows-1252": "Windows-1252 (Latin-1)",
};

/** What decoding found out about a file of bytes (filled in while reading). */
export interface TextReport {
  encoding: TextEncoding;
  /** First line holding a character outside ASCII, and a few characters around it; -1 when none. */
  firstNonAsciiLine: number;
  firstNonAsciiText: string;
}

const NON_ASCII = /[\u0080-\uffff]/;
/** Bytes 0x81, 0x8D, 0x8F, 0x90, 0x9D have no character in Windows-1252 (the decoder gives C1 controls). */
const UNDEFINED_1252 = /[\u0081\u008d\u008f\u0090\u009d]/;

function countNewlines(s: string, end: number = s.length): number {
  let n = 0;
  for (let k = s.indexOf("\n"); k >= 0 && k < end; k = s.indexOf("\n", k + 1)) n++;
  return n;
}

/**
 * Decodes a file's bytes chunk by chunk with the platform's TextDecoder, choosing the encoding as it goes:
 * a UTF-8 byte-order mark (EF BB BF) → UTF-8; FF FE → UTF-16 LE; FE FF → UTF-16 BE (Unicode 15.0 §23.8,
 * Table 23-4); otherwise UTF-8, switching to Windows-1252 at the first byte sequence that is not UTF-8 as
 * long as everything before was plain ASCII (which both encodings write alike). Throws NotTextError, with the
 * line, for a file it cannot decode: invalid UTF-16 or BOM-marked UTF-8, a file mixing UTF-8 with another
 * encoding, bytes Windows-1252 leaves undefined, zip/gzip content.
 *
 * @example const d = new ByteDecoder(); d.push(Uint8Array.of(0x52, 0xfc, 0x62, 0x65)) + d.end(); // "Rübe", d.report.encoding "windows-1252"
 */
export class ByteDecoder {
  readonly report: TextReport = { encoding: "utf-8", firstNonAsciiLine: -1, firstNonAsciiText: "" };
  private decoder: PlatformDecoder | null = null;
  /** Newlines in the text handed out so far. */
  private lines = 0;
  /** While all text so far is ASCII: the bytes at the end of the last chunk the UTF-8 decoder is holding. */
  private held: Uint8Array = new Uint8Array(0);

  /** Decodes the next chunk of bytes. */
  push(chunk: Uint8Array): string {
    if (this.decoder === null) this.start(chunk);
    let s: string;
    try {
      s = this.decoder!.decode(chunk, { stream: true });
    } catch {
      s = this.fallBack(chunk, false);
    }
    return this.after(s, chunk);
  }

  /** Decodes what the decoder still holds at the end of the input. */
  end(): string {
    if (this.decoder === null) return "";
    let s: string;
    try {
      s = this.decoder.decode();
    } catch {
      s = this.fallBack(new Uint8Array(0), true);
    }
    return this.after(s, new Uint8Array(0));
  }

  private start(first: Uint8Array): void {
    if (first.length >= 4 && first[0] === 0x50 && first[1] === 0x4b && first[2] === 0x03 && first[3] === 0x04) {
      throw new NotTextError("the file is a zip archive or a spreadsheet (.xlsx/.ods), not text; export it as CSV");
    }
    if (first.length >= 2 && first[0] === 0x1f && first[1] === 0x8b)
      throw new NotTextError("the file is gzip-compressed; unpack it first");
    const r = this.report;
    if (first.length >= 2 && first[0] === 0xff && first[1] === 0xfe) r.encoding = "utf-16le";
    else if (first.length >= 2 && first[0] === 0xfe && first[1] === 0xff) r.encoding = "utf-16be";
    else if (first.length >= 3 && first[0] === 0xef && first[1] === 0xbb && first[2] === 0xbf) r.encoding = "utf-8-bom";
    this.decoder = new TextDecoder(r.encoding === "utf-8-bom" ? "utf-8" : r.encoding, { fatal: true });
  }

  /** The UTF-8 decoder refused `chunk`: switch to Windows-1252 if nothing but ASCII came before, else refuse. */
  private fallBack(chunk: Uint8Array, atEnd: boolean): string {
    const r = this.report;
    const bytes = new Uint8Array(this.held.length + chunk.length);
    bytes.set(this.held);
    bytes.set(chunk, this.held.length);
    const lossy = new TextDecoder(r.encoding === "utf-8-bom" ? "utf-8" : r.encoding).decode(bytes, { stream: !atEnd });
    const bad = lossy.indexOf("\ufffd");
    const line = this.lines + 1 + countNewlines(lossy, bad < 0 ? lossy.length : bad);
    const utf8Before = bad > 0 && NON_ASCII.test(lossy.slice(0, bad));
    if (r.encoding === "utf-8" && r.firstNonAsciiLine < 0 && !utf8Before) {
      r.encoding = "windows-1252";
      this.decoder = new TextDecoder("windows-1252");
      return this.decoder.decode(bytes, { stream: !atEnd });
    }
    const name = ENCODING_NAMES[r.encoding];
    if (r.encoding === "utf-8") {
      const utf8Line =
        r.firstNonAsciiLine > 0 ? r.firstNonAsciiLine : this.lines + 1 + countNewlines(lossy, lossy.search(NON_ASCII));
      throw new NotTextError(
        `the file mixes encodings: line ${utf8Line} holds UTF-8 characters, but line ${line} has bytes that are not UTF-8; save the whole file again as UTF-8`,
        line,
        "file-encoding-invalid",
      );
    }
    throw new NotTextError(
      `the file starts with the byte-order mark of ${name}, but line ${line} holds bytes that are not valid ${name}; save it again as UTF-8`,
      line,
      "file-encoding-invalid",
    );
  }

  private after(s: string, chunk: Uint8Array): string {
    const r = this.report;
    if (r.firstNonAsciiLine < 0) {
      const m = NON_ASCII.exec(s);
      if (m) {
        r.firstNonAsciiLine = this.lines + 1 + countNewlines(s, m.index);
        const from = Math.max(s.lastIndexOf("\n", m.index) + 1, m.index - 20);
        let to = s.indexOf("\n", m.index);
        if (to < 0 || to > m.index + 20) to = Math.min(s.length, m.index + 20);
        r.firstNonAsciiText = s
          .slice(from, to)
          .replace(/^\uFEFF/, "")
          .trim();
      } else if (r.encoding === "utf-8") {
        // Bytes ≥ 0x80 at the end of an all-ASCII chunk are the start of a sequence the decoder holds back.
        let k = chunk.length;
        while (k > 0 && chunk.length - k < 3 && chunk[k - 1] >= 0x80) k--;
        this.held = chunk.length === 0 ? this.held : chunk.slice(k);
      }
    }
    if (r.encoding === "windows-1252") {
      const m = UNDEFINED_1252.exec(s);
      if (m) {
        const line = this.lines + 1 + countNewlines(s, m.index);
        throw new NotTextError(
          `the file is neither UTF-8 nor Windows-1252 (Latin-1): line ${line} holds the byte 0x${m[0].charCodeAt(0).toString(16).toUpperCase()}, which has no character in Windows-1252; save it again as UTF-8`,
          line,
          "file-encoding-invalid",
        );
      }
    }
    this.lines += countNewlines(s);
    return s;
  }
}

/**
 * The warning a reader adds for a file that was not UTF-8 (null for UTF-8, with or without a byte-order mark).
 * @example encodingIssue({ encoding: "windows-1252", firstNonAsciiLine: 4, firstNonAsciiText: "Müller" }, "p.csv")!.line // 4
 */
export function encodingIssue(report: TextReport, file: string): InputIssue | null {
  if (report.encoding === "utf-8" || report.encoding === "utf-8-bom") return null;
  const name = ENCODING_NAMES[report.encoding];
  const line = report.firstNonAsciiLine > 0 ? report.firstNonAsciiLine : undefined;
  return {
    severity: "warning",
    code: "file-encoding",
    file,
    line: report.encoding === "windows-1252" ? line : 1,
    value: report.encoding === "windows-1252" && line ? report.firstNonAsciiText : undefined,
    message:
      report.encoding === "windows-1252"
        ? `the file is not UTF-8; it was read as ${name}${line ? `, first such character on line ${line}` : ""}. Check that names and words read correctly; the file itself is kept exactly as uploaded`
        : `the file is ${name} text (it starts with that byte-order mark) and was read as such; the file itself is kept exactly as uploaded`,
  };
}

/**
 * Yields the input as strings of roughly `slice` characters (default `SLICE`) (smaller chunks are joined, a large
 * string is sliced). The first string has no byte-order mark. Bytes are decoded by a `ByteDecoder`; pass `report`
 * to learn the encoding it chose. Throws NotTextError for zip/xlsx, gzip, binary (NUL bytes) or undecodable content.
 *
 * @example const parts: string[] = []; for await (const s of textChunks("a,b\n1,2\n")) parts.push(s); // ["a,b\n1,2\n"]
 */
export async function* textChunks(
  input: TextInput,
  slice: number = SLICE,
  report?: TextReport,
): AsyncGenerator<string> {
  if (typeof input === "string") {
    const s = input.charCodeAt(0) === 0xfeff ? input.slice(1) : input;
    checkText(s.slice(0, 4096));
    for (let i = 0; i < s.length; i += slice) yield s.slice(i, i + slice);
    return;
  }
  const decoder = new ByteDecoder();
  let first = true;
  let pending: string[] = [];
  let size = 0;
  for await (const chunk of input as AsyncIterable<string | Uint8Array>) {
    let s: string;
    if (typeof chunk === "string") s = chunk;
    else if (chunk.length === 0) continue;
    else s = decoder.push(chunk);
    if (first && s.length > 0) {
      if (s.charCodeAt(0) === 0xfeff) s = s.slice(1);
      checkText(s.slice(0, 4096));
      first = false;
    }
    if (s.length === 0) continue;
    pending.push(s);
    size += s.length;
    if (size >= slice) {
      yield pending.length === 1 ? pending[0] : pending.join("");
      pending = [];
      size = 0;
    }
  }
  const tail = decoder.end();
  if (report) Object.assign(report, decoder.report);
  if (tail) pending.push(tail);
  if (pending.length) yield pending.join("");
}

function checkText(s: string): void {
  if (s.startsWith("PK\u0003\u0004"))
    throw new NotTextError("the file is a zip archive or a spreadsheet (.xlsx/.ods), not text; export it as CSV");
  if (s.indexOf("\u0000") >= 0) throw new NotTextError("the file contains binary data (NUL bytes), not text");
}

/** Reads all of the input into one string (used for GeoJSON, which is not streamed). */
export async function readAllText(input: TextInput, report?: TextReport): Promise<string> {
  const parts: string[] = [];
  for await (const s of textChunks(input, SLICE, report)) parts.push(s);
  return parts.join("");
}
