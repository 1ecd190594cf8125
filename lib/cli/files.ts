import { isAscii } from "node:buffer";
import { closeSync, createReadStream, openSync, readSync, statSync } from "node:fs";
import { StringDecoder } from "node:string_decoder";
import { fileURLToPath } from "node:url";
import { Worker } from "node:worker_threads";
import { appendReadResults, formatFromName, readPoints, type ColumnMapping, type FileRole, type PointFileFormat, type ReadResult } from "@/geo";

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
export async function* fileText(path: string, range: { start?: number; end?: number; prefix?: Uint8Array } = {}): AsyncGenerator<string> {
  const decoder = new StringDecoder("utf8");
  let pending = false; // decoder holds part of a character
  let first = true;
  async function* bytes(): AsyncGenerator<Buffer> {
    if (range.prefix) yield Buffer.from(range.prefix);
    yield* createReadStream(path, { highWaterMark: 1 << 20, start: range.start, end: range.end === undefined ? undefined : range.end - 1 }) as AsyncIterable<Buffer>;
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
 * Reads files on a worker thread, one after the other; typed arrays are transferred back, not copied.
 * Under tsx a small CommonJS entry registers tsx's in-thread hook first (Node 20 worker threads do
 * not inherit tsx's loader); starting it still costs a few hundred milliseconds, so callers use it
 * for large files only.
 */
export function readInWorker(jobs: ReadJob[]): Promise<ReadResult[]> {
  return new Promise((resolve, reject) => {
    const boot = new URL("./worker-boot.cjs", import.meta.url);
    const entry = fileURLToPath(new URL("./read-worker.ts", import.meta.url));
    const worker = new Worker(boot, { workerData: { jobs, entry } });
    worker.once("message", (r: ReadResult[]) => {
      resolve(r);
      void worker.terminate();
    });
    worker.once("error", reject);
    worker.once("exit", (code) => {
      if (code !== 0) reject(new Error(`reading ${jobs.map((j) => j.path).join(", ")} on a worker thread stopped with code ${code}`));
    });
  });
}

function sizeOf(path: string): number {
  try {
    return statSync(path).size;
  } catch {
    return 0;
  }
}

/** Bytes [0, n) of a file (fewer at its end). */
function head(path: string, at: number, n: number): Buffer {
  const fd = openSync(path, "r");
  try {
    const b = Buffer.alloc(n);
    const got = readSync(fd, b, 0, n, at);
    return b.subarray(0, got);
  } finally {
    closeSync(fd);
  }
}

/** Below this combined size both files are read on the main thread (a worker costs more than it saves). */
const PARALLEL_MIN_BYTES = 8e6;

/**
 * Reads the as-planted and survey files using both cores: the survey file on a worker thread and the
 * planted file on the main thread; when one CSV file is much larger, its tail (from a line start
 * chosen so both threads get about half the bytes) is read on the worker too, led by the header
 * line, and the two parts are appended (`appendReadResults`). If a double quote appears anywhere in
 * a split file (a quoted field could span the cut), that file is read again whole on the main thread.
 */
export async function readBoth(
  planted: ReadJob,
  survey: ReadJob,
  options: { parallel?: boolean; splitSlackBytes?: number } = {},
): Promise<[ReadResult, ReadResult]> {
  const sp = sizeOf(planted.path), ss = sizeOf(survey.path);
  const useWorker = options.parallel ?? sp + ss >= PARALLEL_MIN_BYTES;
  if (useWorker) {
    try {
      return await readOnTwoThreads(planted, survey, sp, ss, options.splitSlackBytes ?? 1e6);
    } catch {
      // A worker thread could not run (e.g. no TypeScript loader): read on this thread instead.
    }
  }
  return [await readFileJob(planted), await readFileJob(survey)];
}

async function readOnTwoThreads(planted: ReadJob, survey: ReadJob, sp: number, ss: number, slack: number): Promise<[ReadResult, ReadResult]> {
  const csv = (j: ReadJob) => (j.format ?? formatFromName(j.path)) === "csv";
  const bigIsPlanted = sp >= ss;
  const big = bigIsPlanted ? planted : survey, small = bigIsPlanted ? survey : planted;
  const bigSize = Math.max(sp, ss), total = sp + ss;
  let cut = -1, prefix: Buffer | null = null;
  if (csv(big) && bigSize > total / 2 + slack) {
    const first = head(big.path, 0, 1 << 16);
    const nl = first.indexOf(0x0a);
    // The main thread starts parsing at once while the worker starts up (a few hundred ms), so the
    // main thread takes a little more than half of the bytes.
    const target = Math.min(bigSize - (1 << 17), Math.floor(total / 2 + 4e6));
    const probe = head(big.path, target, 1 << 16);
    const k = probe.indexOf(0x0a);
    if (nl >= 0 && k >= 0 && target + k + 1 < bigSize) {
      prefix = first.subarray(0, nl + 1);
      cut = target + k + 1;
    }
  }

  if (cut < 0) {
    const [[smallResult], bigResult] = await Promise.all([readInWorker([small]), readFileJob(big)]);
    return bigIsPlanted ? [bigResult, smallResult] : [smallResult, bigResult];
  }
  const [workerResults, head1] = await Promise.all([
    readInWorker([small, { ...big, start: cut, prefix: prefix! }]),
    readFileJob({ ...big, end: cut }),
  ]);
  const [smallResult, tail] = workerResults;
  const bigResult =
    head1.sawQuote || tail.sawQuote ? await readFileJob(big) : appendReadResults(head1, tail, (head1.linesRead ?? 1) - 1);
  return bigIsPlanted ? [bigResult, smallResult] : [smallResult, bigResult];
}
