import { readFileInWorker, readFileJob } from "./lib/cli/files";
const t = performance.now();
const [a, b] = await Promise.all([readFileInWorker({ path: ".bench/tmp-planted.csv", role: "planted" }), readFileJob({ path: ".bench/tmp-planted.csv", role: "survey" })]);
console.log(performance.now() - t, a.table?.length, b.table?.length, a.table?.x instanceof Float64Array, a.issues);
