import { closeSync, openSync, readSync, statSync } from "node:fs";
import { Worker } from "node:worker_threads";
import { appendReadResults, formatFromName, IdColumn, type ReadResult } from "@/geo";
import { readFileJob, type ReadJob } from "./file-read";
import { workerBundle } from "@/lib/workers/bundle";

export { readFileJob, type ReadJob } from "./file-read";

/**
 * Reads files on a worker thread, one after the other; typed arrays are transferred back, not copied.
 * The worker runs a plain-JavaScript bundle of read-worker.ts (see `workerBundle`).
 */
export async function readInWorker(jobs: ReadJob[]): Promise<ReadResult[]> {
  const entry = await workerBundle("lib/cli/read-worker.ts");
  return new Promise((resolve, reject) => {
    const worker = new Worker(entry, { workerData: { jobs }, execArgv: [] }); // no tsx hooks: the bundle is plain JavaScript;
    worker.once("message", (r: ReadResult[]) => {
      // Structured cloning keeps an IdColumn's arrays but not its class.
      for (const x of r) if (x.table) x.table.id = IdColumn.revive(x.table.id);
      resolve(r);
      void worker.terminate();
    });
    worker.once("error", reject);
    worker.once("exit", (code) => {
      if (code !== 0)
        reject(new Error(`reading ${jobs.map((j) => j.path).join(", ")} on a worker thread stopped with code ${code}`));
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
  const sp = sizeOf(planted.path),
    ss = sizeOf(survey.path);
  const useWorker = options.parallel ?? sp + ss >= PARALLEL_MIN_BYTES;
  if (useWorker) {
    try {
      return await readOnTwoThreads(planted, survey, sp, ss, options.splitSlackBytes ?? 1e6);
    } catch {
      // A worker thread could not run (e.g. esbuild could not bundle it): read on this thread instead.
    }
  }
  return [await readFileJob(planted), await readFileJob(survey)];
}

async function readOnTwoThreads(
  planted: ReadJob,
  survey: ReadJob,
  sp: number,
  ss: number,
  slack: number,
): Promise<[ReadResult, ReadResult]> {
  const csv = (j: ReadJob) => (j.format ?? formatFromName(j.path)) === "csv";
  const bigIsPlanted = sp >= ss;
  const big = bigIsPlanted ? planted : survey,
    small = bigIsPlanted ? survey : planted;
  const bigSize = Math.max(sp, ss),
    total = sp + ss;
  let cut = -1,
    prefix: Buffer | null = null;
  if (csv(big) && bigSize > total / 2 + slack) {
    const first = head(big.path, 0, 1 << 16);
    const nl = first.indexOf(0x0a);
    // Half of all bytes each: the bundled worker starts in a few tens of milliseconds, and a byte of
    // the survey file costs the worker about what a byte of the planted file costs this thread.
    const target = Math.min(bigSize - (1 << 17), Math.floor(total / 2));
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
    head1.sawQuote || tail.sawQuote
      ? await readFileJob(big)
      : appendReadResults(head1, tail, (head1.linesRead ?? 1) - 1);
  return bigIsPlanted ? [bigResult, smallResult] : [smallResult, bigResult];
}
