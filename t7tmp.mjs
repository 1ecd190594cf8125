import KDBush from "kdbush";
const N = 1_000_000;
const px = new Float64Array(N), py = new Float64Array(N);
let seed = 1; const rnd = () => ((seed = (seed * 16807) % 2147483647) / 2147483647);
for (let i = 0; i < N; i++) { px[i] = 500000 + (i % 2000) * 0.25; py[i] = 5700000 + Math.floor(i / 2000) * 0.5; }
const sx = new Float64Array(N), sy = new Float64Array(N), ox = new Float64Array(N), oy = new Float64Array(N);
for (let i = 0; i < N; i++) { const j = (i * 7919) % N; sx[i] = px[j] + (rnd() - 0.5) * 0.04; sy[i] = py[j] + (rnd() - 0.5) * 0.04; ox[i] = px[i] + (rnd() - 0.5) * 0.04; oy[i] = py[i] + (rnd() - 0.5) * 0.04;}
for (const ns of [16, 64]) for (const [nm, qx, qy] of [["random", sx, sy], ["ordered", ox, oy]]) {
  let t = performance.now();
  const tree = new KDBush(N, ns, Float64Array); for (let i = 0; i < N; i++) tree.add(px[i], py[i]); tree.finish();
  const tb = performance.now() - t; t = performance.now();
  const out = []; let c = 0;
  for (let i = 0; i < N; i++) c += tree.withinInto(qx[i], qy[i], 0.1, out);
  console.log(ns, nm, "build", tb.toFixed(0), "query", (performance.now() - t).toFixed(0), c);
}
