/**
 * Text input for the readers: a whole string, or chunks of text or UTF-8 bytes (a file stream, an
 * upload stream). Bytes are decoded with the standard TextDecoder; a UTF-8 byte-order mark is dropped.
 */

/** What a reader accepts. */
export type TextInput = string | AsyncIterable<string | Uint8Array> | Iterable<string | Uint8Array>;

/** Minimal TextDecoder shape (present in browsers and Node; declared here so geo/ needs no DOM types). */
interface Utf8Decoder {
  decode(input?: Uint8Array, options?: { stream?: boolean }): string;
}
declare const TextDecoder: { new (label?: string, options?: { fatal?: boolean; ignoreBOM?: boolean }): Utf8Decoder };

/** Thrown (and turned into an issue by the readers) when the bytes are clearly not a text file. */
export class NotTextError extends Error {}

/** Size of the string slices a reader works on. */
export const SLICE = 1 << 20;

/**
 * Yields the input as strings of roughly `slice` characters (default `SLICE`) (smaller chunks are joined, a large
 * string is sliced). The first string has no byte-order mark.
 * Throws NotTextError for zip/xlsx, gzip or binary (NUL bytes) content in the first chunk.
 *
 * @example const parts: string[] = []; for await (const s of textChunks("a,b\n1,2\n")) parts.push(s); // ["a,b\n1,2\n"]
 */
export async function* textChunks(input: TextInput, slice: number = SLICE): AsyncGenerator<string> {
  if (typeof input === "string") {
    const s = input.charCodeAt(0) === 0xfeff ? input.slice(1) : input;
    checkText(s.slice(0, 4096));
    for (let i = 0; i < s.length; i += slice) yield s.slice(i, i + slice);
    return;
  }
  const decoder = new TextDecoder("utf-8");
  let first = true;
  let pending: string[] = [];
  let size = 0;
  for await (const chunk of input as AsyncIterable<string | Uint8Array>) {
    let s: string;
    if (typeof chunk === "string") s = chunk;
    else {
      if (first) checkBytes(chunk);
      s = decoder.decode(chunk, { stream: true });
    }
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
  const tail = decoder.decode();
  if (tail) pending.push(tail);
  if (pending.length) yield pending.join("");
}

function checkBytes(b: Uint8Array): void {
  if (b.length >= 4 && b[0] === 0x50 && b[1] === 0x4b && b[2] === 0x03 && b[3] === 0x04) {
    throw new NotTextError("the file is a zip archive or a spreadsheet (.xlsx/.ods), not text; export it as CSV");
  }
  if (b.length >= 2 && b[0] === 0x1f && b[1] === 0x8b)
    throw new NotTextError("the file is gzip-compressed; unpack it first");
  if (b.length >= 2 && ((b[0] === 0xff && b[1] === 0xfe) || (b[0] === 0xfe && b[1] === 0xff))) {
    throw new NotTextError("the file is UTF-16 text; save it as UTF-8");
  }
}

function checkText(s: string): void {
  if (s.startsWith("PK\u0003\u0004"))
    throw new NotTextError("the file is a zip archive or a spreadsheet (.xlsx/.ods), not text; export it as CSV");
  if (s.indexOf("\u0000") >= 0) throw new NotTextError("the file contains binary data (NUL bytes), not text");
}

/** Reads all of the input into one string (used for GeoJSON, which is not streamed). */
export async function readAllText(input: TextInput): Promise<string> {
  const parts: string[] = [];
  for await (const s of textChunks(input)) parts.push(s);
  return parts.join("");
}
