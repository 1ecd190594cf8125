import { createReadStream } from "node:fs";
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

/** Reads a point file with a UTF-8 stream (1 MB chunks); the file name in messages is the path as given. */
export function readFileJob(job: ReadJob): Promise<ReadResult> {
  const stream = createReadStream(job.path, { encoding: "utf8", highWaterMark: 1 << 20 });
  return readPoints(stream as AsyncIterable<string>, {
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
