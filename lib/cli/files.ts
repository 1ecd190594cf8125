import { isAscii } from "node:buffer";
import { createReadStream } from "node:fs";
import { StringDecoder } from "node:string_decoder";
import { Worker } from "node:worker_threads";
import { readPoints, type ColumnMapping, type FileRole, type PointFileFormat, type ReadResult } from "@/geo";

/** One file to read. */
export interface ReadJob {
  path: string;
  role: FileRole;
  timeZone?: string;
  mapping?: ColumnMapping;
  format?: PointFileFormat;
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
 * UTF-8 text of a file in 1 MB chunks. Chunks that are pure ASCII (the usual machine export) are
 * turned into strings as Latin-1, which is the same text for ASCII and about twice as fast as UTF-8
 * decoding; other chunks go through a streaming UTF-8 decoder. A leading UTF-8 BOM is dropped.
 */
export async function* fileText(path: string): AsyncGenerator<string> {
  const decoder = new StringDecoder("utf8");
  let pending = false; // decoder holds part of a character
  let first = true;
  for await (const chunk of createReadStream(path, { highWaterMark: 1 << 20 }) as AsyncIterable<Buffer>) {
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

/** Reads a point file as a stream of text; the file name in messages is the path as given. */
export function readFileJob(job: ReadJob): Promise<ReadResult> {
  return readPoints(fileText(job.path), {
    source: job.path,
    role: job.role,
    timeZone: job.timeZone,
    mapping: job.mapping,
    format: job.format,
  });
}

/** Buffers of a result's typed arrays, to move them to another thread without copying. */
export function transferList(r: ReadResult): ArrayBuffer[] {
  const t = r.table;
  if (!t) return [];
  const arrays: (ArrayBufferView | null)[] = [t.x, t.y, t.line, t.time, t.hdop, t.precision, t.rawX, t.rawY];
  for (const c of Object.values(t.attrs)) if (c) arrays.push(c.codes);
  const seen = new Set<ArrayBuffer>();
  for (const a of arrays) if (a && a.buffer instanceof ArrayBuffer) seen.add(a.buffer);
  return [...seen];
}

/**
 * Reads a file on a worker thread (the other file is read on the main thread meanwhile; each takes
 * one of the two cores). Typed arrays are transferred back, not copied.
 */
export function readFileInWorker(job: ReadJob): Promise<ReadResult> {
  return new Promise((resolve, reject) => {
    // Node 20 worker threads do not inherit tsx's loader hooks: a small .mjs entry registers tsx first.
    const boot = new URL("./worker-boot.mjs", import.meta.url);
    const entry = new URL("./read-worker.ts", import.meta.url).href;
    const worker = new Worker(boot, { workerData: { ...job, entry } });
    worker.once("message", (r: ReadResult) => {
      resolve(r);
      void worker.terminate();
    });
    worker.once("error", reject);
    worker.once("exit", (code) => {
      if (code !== 0) reject(new Error(`reading ${job.path} on a worker thread stopped with code ${code}`));
    });
  });
}
