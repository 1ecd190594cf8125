import { pairPoints } from "./geo/pair";
const N = 1_000_000;
const px = new Float64Array(N), py = new Float64Array(N);
let seed = 1; const rnd = () => ((seed = (seed * 16807) % 2147483647) / 2147483647);
for (let i = 0; i < N; i++) { px[i] = 500000 + (i % 2000) * 0.25; py[i] = 5700000 + Math.floor(i / 2000) * 0.5; }
const M = 1_000_000; const sx = new Float64Array(M), sy = new Float64Array(M);
for (let i = 0; i < M; i++) { const j = (i * 7919) % N; sx[i] = px[j] + (rnd() - 0.5) * 0.04; sy[i] = py[j] + (rnd() - 0.5) * 0.04; }
for (let k = 0; k < 3; k++) {
const t = performance.now();
const r = pairPoints({ length: N, x: px, y: py, id: null }, { length: M, x: sx, y: sy, id: null }, { mode: "nearest" });
console.log("pair", (performance.now() - t).toFixed(0), r.plantedIndex.length, r.unmatchedSurvey.length, r.ambiguousSurvey.length);
}
