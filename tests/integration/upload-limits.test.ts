import { beforeAll, describe, expect, it } from "vitest";
import { DEMO_PASSWORD, DEMO_PEOPLE } from "@/lib/demo/farm";
import { MAX_UPLOAD_BYTES } from "@/lib/validation/upload";
import { cookieFor, ctx, req, useMemoryDb } from "./helpers";

let cookie: string;
let fieldId: string;
let datasetsRoute: typeof import("@/app/api/fields/[fieldId]/datasets/route");

beforeAll(async () => {
  await useMemoryDb();
  const { seedDemo } = await import("@/lib/demo/seed");
  await seedDemo();
  const technician = DEMO_PEOPLE.find((p) => p.role === "technician")!;
  cookie = await cookieFor(technician.email, DEMO_PASSWORD);
  const fieldsRoute = await import("@/app/api/fields/route");
  datasetsRoute = await import("@/app/api/fields/[fieldId]/datasets/route");
  fieldId = (await (await fieldsRoute.GET(req("/api/fields", { cookie }), ctx({}))).json()).fields[0].id;
}, 120_000);

const BOUNDARY = "----plotproof-test-boundary";
const MB = 1024 * 1024;

/**
 * A multipart body of `fileBytes` bytes of CSV, produced lazily in fresh 1 MB chunks (as a network socket
 * hands them over) and sent without a Content-Length, as `Transfer-Encoding: chunked` does. `pulled()`
 * says how many bytes the server asked for.
 */
function chunkedUpload(fileBytes: number) {
  const enc = new TextEncoder();
  const head = enc.encode(
    `--${BOUNDARY}\r\nContent-Disposition: form-data; name="kind"\r\n\r\nplanted\r\n` +
      `--${BOUNDARY}\r\nContent-Disposition: form-data; name="file"; filename="huge.csv"\r\nContent-Type: text/csv\r\n\r\n`,
  );
  const tail = enc.encode(`\r\n--${BOUNDARY}--\r\n`);
  let sent = 0;
  let pulled = 0;
  const body = new ReadableStream<Uint8Array>({
    pull(controller) {
      if (sent === 0) {
        controller.enqueue(head);
        pulled += head.length;
      }
      if (sent >= fileBytes) {
        controller.enqueue(tail);
        controller.close();
        return;
      }
      const n = Math.min(MB, fileBytes - sent);
      const chunk = new Uint8Array(n).fill(0x31); // "1111…": a fresh buffer each time
      sent += n;
      pulled += n;
      controller.enqueue(chunk);
    },
  });
  const request = new Request(`http://localhost:3000/api/fields/${fieldId}/datasets`, {
    method: "POST",
    body,
    headers: { cookie, "content-type": `multipart/form-data; boundary=${BOUNDARY}` },
    duplex: "half",
  } as RequestInit);
  return { request, pulled: () => pulled };
}

describe("upload limits", () => {
  it("upload -- a chunked file over the limit gets 413 once the limit is crossed, and memory stays bounded", async () => {
    global.gc?.();
    const before = process.memoryUsage().rss;
    const { request, pulled } = chunkedUpload(MAX_UPLOAD_BYTES + 30 * MB); // 330 MB, no Content-Length
    const res = await datasetsRoute.POST(request, ctx({ fieldId }));
    const grew = process.memoryUsage().rss - before;
    expect(res.status).toBe(413);
    expect((await res.json()).error.message).toBe("Files up to 300 MB can be uploaded.");
    // Reading stopped at the limit (a few chunks in flight), not after the whole body.
    expect(pulled()).toBeLessThan(MAX_UPLOAD_BYTES + 4 * MB);
    // What was held is at most the limit itself; reading the whole form first needed twice the body.
    expect(grew).toBeLessThan(MAX_UPLOAD_BYTES + 100 * MB);
  }, 120_000);

  it("upload -- a declared Content-Length over the limit is refused before reading", async () => {
    const r = new Request(`http://localhost:3000/api/fields/${fieldId}/datasets`, {
      method: "POST",
      body: "x",
      headers: {
        cookie,
        "content-type": `multipart/form-data; boundary=${BOUNDARY}`,
        "content-length": String(MAX_UPLOAD_BYTES * 2),
      },
    });
    expect((await datasetsRoute.POST(r, ctx({ fieldId }))).status).toBe(413);
  });

  it("upload -- a body that is not multipart gets 415; two files or a field of megabytes get 422 naming the problem", async () => {
    const notMultipart = await datasetsRoute.POST(
      new Request(`http://localhost:3000/api/fields/${fieldId}/datasets`, {
        method: "POST",
        body: "plant_id,x,y\n",
        headers: { cookie, "content-type": "text/csv" },
      }),
      ctx({ fieldId }),
    );
    // Refused by the route's own cross-site guard (the proxy skips the upload route), as the proxy answers elsewhere.
    expect(notMultipart.status).toBe(415);
    expect((await notMultipart.json()).error.message).toContain("multipart/form-data");

    const two = new FormData();
    two.append("kind", "planted");
    two.append("file", new File(["a,b\n"], "a.csv"));
    two.append("file", new File(["a,b\n"], "b.csv"));
    const twoRes = await datasetsRoute.POST(
      new Request(`http://localhost:3000/api/fields/${fieldId}/datasets`, {
        method: "POST",
        body: two,
        headers: { cookie },
      }),
      ctx({ fieldId }),
    );
    expect(twoRes.status).toBe(422);
    expect((await twoRes.json()).error.message).toContain("one file at a time");

    const big = new FormData();
    big.append("kind", "planted");
    big.append("mapping", "x".repeat(2 * MB));
    big.append("file", new File(["a,b\n"], "a.csv"));
    const bigRes = await datasetsRoute.POST(
      new Request(`http://localhost:3000/api/fields/${fieldId}/datasets`, {
        method: "POST",
        body: big,
        headers: { cookie },
      }),
      ctx({ fieldId }),
    );
    expect(bigRes.status).toBe(422);
    expect((await bigRes.json()).error.message).toContain("'mapping'");
  });
});
