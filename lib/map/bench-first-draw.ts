/**
 * Time to first draw of the audit map in headless Chromium (software WebGL) for synthetic fields of 100,000 and
 * 1,000,000 plants. The map page of a real audit is opened; its map-data request is answered with a synthetic
 * payload (lib/map/bench-map.ts), so the figure covers transfer over loopback, decoding, preparing the layers and
 * deck.gl's first frame — not the server's query (see the route's own timing for that).
 *
 *   npx tsx lib/map/bench-first-draw.ts --base http://127.0.0.1:3100 [--audit <id>] [--runs 3]
 *   npx tsx lib/map/bench-first-draw.ts --base http://127.0.0.1:3100 --audit <id> --real   # the audit's own payload
 *
 * Needs a running server with the demo accounts; without --audit it creates an audit of the demo files.
 * Playwright hands an intercepted body to the page through the DevTools protocol, which is far slower than a socket,
 * so "received → first draw" (decode, layer preparation, first frame submitted) is the figure to compare for synthetic
 * fields, and "pixels done" adds the time the software renderer (SwiftShader) needs to finish that frame;
 * with --real the request goes to the server (the first one includes building the payload; later ones are cached).
 */
import fs from "node:fs";
import path from "node:path";
import { chromium, type Page } from "playwright-core";
import { syntheticField, syntheticPayload } from "./bench-map";

const arg = (name: string, fallback?: string) => {
  const i = process.argv.indexOf(`--${name}`);
  return i > 0 ? process.argv[i + 1] : fallback;
};
const BASE = arg("base", "http://127.0.0.1:3100")!;
const RUNS = Number(arg("runs", "3"));

async function signIn(page: Page) {
  await page.goto(`${BASE}/login`);
  await page.getByLabel("E-mail").fill("tamsin@kestrelfen.example");
  await page.getByLabel("Password").fill("kestrel-demo-26");
  await page.getByRole("button", { name: "Sign in" }).click();
  await page.waitForURL((u) => !u.pathname.startsWith("/login"));
}

async function demoAudit(page: Page): Promise<string> {
  const { fields } = (await (await page.request.get(`${BASE}/api/fields`)).json()) as {
    fields: { id: string; name: string }[];
  };
  const field = fields.find((f) => f.name === "Long Acre")!;
  const upload = async (file: string, kind: string, crs: string) => {
    const res = await page.request.post(`${BASE}/api/fields/${field.id}/datasets`, {
      multipart: {
        file: { name: file, mimeType: "text/csv", buffer: fs.readFileSync(path.join("public/demo", file)) },
        kind,
        crs,
        acceptWarnings: "true",
      },
    });
    return ((await res.json()) as { dataset: { id: string } }).dataset.id;
  };
  const plantedDatasetId = await upload("long-acre-as-planted.csv", "planted", "EPSG:4326");
  const surveyDatasetId = await upload("long-acre-survey.csv", "survey", "EPSG:25831");
  const { profiles } = (await (await page.request.get(`${BASE}/api/profiles`)).json()) as {
    profiles: { id: string; name: string }[];
  };
  const profileId = profiles.find((p) => p.name === "In-row weeding around plants")!.id;
  const res = await page.request.post(`${BASE}/api/audits?wait=1`, {
    data: { fieldId: field.id, plantedDatasetId, surveyDatasetId, profileId },
  });
  return ((await res.json()) as { audit: { id: string } }).audit.id;
}

const median = (v: number[]) => [...v].sort((a, b) => a - b)[v.length >> 1];

async function main() {
  const browser = await chromium.launch({
    executablePath: process.env.CHROMIUM_PATH ?? "/usr/bin/chromium",
    args: [
      "--no-sandbox",
      "--disable-gpu",
      "--disable-quic",
      "--no-first-run",
      "--disable-background-networking",
      "--disable-component-update",
      "--disable-sync",
    ],
  });
  const context = await browser.newContext({ viewport: { width: 1400, height: 1000 } });
  const page = await context.newPage();
  await signIn(page);
  const auditId = arg("audit") ?? (await demoAudit(page));
  console.log(`audit ${auditId}; ${RUNS} runs each; median (min–max), milliseconds from navigation start`);
  console.log(
    "plants    | survey   | payload  | request→received | decode | received→first draw | request→first draw | navigation→first draw | navigation→pixels done",
  );
  const real = process.argv.includes("--real");
  // --cases 100000:12,1000000:1 picks plants:surveyEvery pairs (default: 100k and 1M plants, 1 in 12 and all surveyed).
  const cases: (readonly [number, number])[] = real
    ? [[0, 0]]
    : arg("cases", "100000:12,1000000:12,100000:1,1000000:1")!
        .split(",")
        .map((c) => c.split(":").map(Number) as [number, number]);
  for (const [plants, every] of cases) {
    const field = real ? null : syntheticField(plants, every);
    const body = field ? Buffer.from(syntheticPayload(field)) : null;
    const samples: {
      net: number;
      decode: number;
      afterReceived: number;
      fromRequest: number;
      fromNav: number;
      pixels: number;
    }[] = [];
    for (let r = 0; r < RUNS; r++) {
      const p = await context.newPage();
      if (body)
        await p.route(`**/api/audits/${auditId}/map-data`, (route) =>
          route.fulfill({ status: 200, contentType: "application/octet-stream", body }),
        );
      await p.goto(`${BASE}/audits/${auditId}/map`);
      await p.waitForFunction(() => performance.getEntriesByName("plotproof:map-first-draw").length > 0, null, {
        timeout: 600_000,
        polling: 100,
      });
      // deck.gl's first frame is submitted to WebGL when the mark is set; reading one pixel waits until the (software)
      // GPU has finished drawing it, so "pixels" is when the frame is really there.
      const pixels = await p.evaluate(() => {
        const gl = document.querySelector<HTMLCanvasElement>('[data-testid="map-frame"] canvas')!.getContext("webgl2")!;
        gl.readPixels(0, 0, 1, 1, gl.RGBA, gl.UNSIGNED_BYTE, new Uint8Array(4));
        return performance.now();
      });
      const m = await p.evaluate(() =>
        Object.fromEntries(
          ["request", "received", "decoded", "prepared", "gl-ready", "first-draw"].map((k) => [
            k,
            performance.getEntriesByName(`plotproof:map-${k}`)[0]?.startTime ?? NaN,
          ]),
        ),
      );
      m.pixels = pixels;
      if (process.env.BENCH_VERBOSE) console.log(JSON.stringify(m));
      samples.push({
        net: m.received - m.request,
        decode: m.decoded - m.received,
        afterReceived: m["first-draw"] - m.received,
        fromRequest: m["first-draw"] - m.request,
        fromNav: m["first-draw"],
        pixels: m.pixels,
      });
      if (!field && r === 0) {
        const shown = await p
          .getByTestId("field-map")
          .evaluate(
            (e) => Number((e as HTMLElement).dataset.pairsTotal) + Number((e as HTMLElement).dataset.unpairedShown),
          );
        const bytes = await p.evaluate(
          () =>
            (performance.getEntriesByType("resource") as PerformanceResourceTiming[]).find((e) =>
              e.name.includes("/map-data"),
            )?.decodedBodySize ?? 0,
        );
        console.log(`real audit: ${shown} points drawn, payload ${(bytes / 1e6).toFixed(2)} MB`);
      }
      await p.close();
    }
    const fmt = (k: keyof (typeof samples)[number]) => {
      const v = samples.map((s) => s[k]);
      return `${median(v).toFixed(0)} (${Math.min(...v).toFixed(0)}–${Math.max(...v).toFixed(0)})`;
    };
    console.log(
      [
        String(field?.plants ?? "audit").padEnd(9),
        (every === 0 ? "real" : every === 1 ? "all" : `1 in ${every}`).padEnd(8),
        body ? `${(body.byteLength / 1e6).toFixed(1)} MB`.padEnd(8) : "server  ",
        fmt("net").padEnd(16),
        fmt("decode").padEnd(6),
        fmt("afterReceived").padEnd(19),
        fmt("fromRequest").padEnd(18),
        fmt("fromNav").padEnd(21),
        fmt("pixels"),
      ].join(" | "),
    );
  }
  await browser.close();
}

main().catch((err) => {
  console.error(err);
  process.exit(1);
});
