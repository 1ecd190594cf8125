import { createReadStream } from "node:fs";
import { readCsv } from "./geo/read/csv";
const t = performance.now();
const r = await readCsv(createReadStream(".bench/tmp-planted.csv", { highWaterMark: 1 << 20 }), { source: "p", role: "planted" });
console.log("read", performance.now() - t, r.table?.length);
