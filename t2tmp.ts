import { createReadStream, writeFileSync } from "node:fs";
import { readCsv } from "./geo/read/csv";
const N = 1_000_000;
const lines = ["plant_id,crop,bed,row,arm,fix,lat,lon"];
for (let i = 0; i < N; i++) lines.push(`P${String(i).padStart(7, "0")},lettuce,B${(i / 20000) | 0},${(i / 4000) % 5 | 0},A${i % 2},4,${(52.1 + i * 1e-7).toFixed(9)},${(9.1 + (i % 4000) * 3e-6).toFixed(9)}`);
writeFileSync(".bench/tmp-planted.csv", lines.join("\n") + "\n");
const t = performance.now();
const r = await readCsv(createReadStream(".bench/tmp-planted.csv", { highWaterMark: 1 << 20 }), { source: "p", role: "planted" });
console.log("read", performance.now() - t, r.table?.length, r.issues.length, process.memoryUsage().rss / 1e6);
