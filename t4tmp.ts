import { createReadStream } from "node:fs";
import { readCsv } from "./geo/read/csv";
for (let k = 0; k < 3; k++) {
  const t = performance.now();
  const r = await readCsv(createReadStream(".bench/tmp-planted.csv", { highWaterMark: 1 << 20, encoding: "utf8" }), { source: "p", role: "planted" });
  console.log("read", (performance.now() - t).toFixed(0), r.table?.length);
}
