/**
 * Reading one point file (or a byte range of one) from disk as text, for the command line and its
 * read worker. Kept apart from files.ts so the worker's bundle holds only what reading needs.
 */
import { isAscii } from "node:buffer";
import { createReadStream } from "node:fs";
import { StringDecoder } from "node:string_decoder";
import { readPoints, type ColumnMapping, type FileRole, type PointFileFormat, type ReadResult } from "@/geo";

/** One file (or the tail of one) to read. */
export interface ReadJob {
  path: string;
  role: FileRole;
  timeZone?: string;
  mapping?: ColumnMapping;
  format?: PointFileFormat;
  /** Read from this byte offset on, led by `prefix` (the file's header line), instead of the whole file. */
  start?: number;
  end?: number;
  prefix?: Uint8Array;
}

/** True when `b` does not end inside a UTF-8 multi-byte sequence. */
function endsOnCharBoundary(b: Buffer): boolean {
  for (let k = 1; k <= Math.min(4, b.length); k++) {
    const c = b[b.length - k];
    if (c < 0x80) return true; // ASCII
    if (c >= 0xc0) {
      const need = c >= 0xf0 ? 4 : c >= 0xe0 ? 3 : 2;
      return k >= need;
    }
  }
  return true;
}

/**
 * UTF-8 text of a file (or of a byte range led by a prefix) in 1 MB chunks. Chunks that are pure
 * ASCII (the usual machine export) are turned into strings as Latin-1, which is the same text for
 * ASCII and about twice as fast as UTF-8 decoding; other chunks go through a streaming UTF-8 decoder.
 * A leading UTF-8 BOM is dropped.
 */
export async function* fileText(
  path: string,
  range: { start?: number; end?: number; prefix?: Uint8Array } = {},
): AsyncGenerator<string> {
  const decoder = new StringDecoder("utf8");
  let pending = false; // decoder holds part of a character
  let first = true;
  async function* bytes(): AsyncGenerator<Buffer> {
    if (range.prefix) yield Buffer.from(range.prefix);
    yield* createReadStream(path, {
      highWaterMark: 1 << 20,
      start: range.start,
      end: range.end === undefined ? undefined : range.end - 1,
    }) as AsyncIterable<Buffer>;
  }
  for await (const chunk of bytes()) {
    let b = chunk;
    if (first) {
      first = false;
      if (b.length >= 3 && b[0] === 0xef && b[1] === 0xbb && b[2] === 0xbf) b = b.subarray(3);
      else if (b.length >= 4 && b[0] === 0x50 && b[1] === 0x4b && b[2] === 0x03 && b[3] === 0x04) {
        yield b.toString("latin1"); // let the reader report a zip/xlsx file
        return;
      }
    }
    if (!pending && isAscii(b)) yield b.toString("latin1");
    else {
      yield decoder.write(b);
      pending = !endsOnCharBoundary(b);
    }
  }
  const tail = decoder.end();
  if (tail) yield tail;
}

/** Reads a point file (or a part of one) as a stream of text; the file name in messages is the path as given. */
export function readFileJob(job: ReadJob): Promise<ReadResult> {
  return readPoints(fileText(job.path, job), {
    source: job.path,
    role: job.role,
    timeZone: job.timeZone,
    mapping: job.mapping,
    format: job.format,
  });
}
