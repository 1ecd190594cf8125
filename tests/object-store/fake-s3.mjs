// A throwaway S3-compatible object store (s3rver) for the server-mode tests: a free port, a temporary directory, one
// bucket. Used by tests/integration/object-storage.test.ts and tests/e2e-server/deployment.ts.
import fs from "node:fs";
import net from "node:net";
import os from "node:os";
import path from "node:path";
import S3rver from "s3rver";

function freePort() {
  return new Promise((resolve, reject) => {
    const srv = net.createServer();
    srv.once("error", reject);
    srv.listen(0, "127.0.0.1", () => {
      const { port } = srv.address();
      srv.close(() => resolve(port));
    });
  });
}

/**
 * Start s3rver; resolves to the OBJECT_STORE_* variables that point the app at it, its data directory and `stop()`.
 * @param {{ bucket?: string }} [opts]
 */
export async function startFakeS3({ bucket = "plotproof-test" } = {}) {
  const directory = fs.mkdtempSync(path.join(os.tmpdir(), "plotproof-s3-"));
  const port = await freePort();
  const server = new S3rver({
    port,
    address: "127.0.0.1",
    directory,
    silent: true,
    configureBuckets: [{ name: bucket }],
  });
  await server.run();
  return {
    directory,
    env: {
      OBJECT_STORE_URL: `http://127.0.0.1:${port}`,
      OBJECT_STORE_BUCKET: bucket,
      OBJECT_STORE_ACCESS_KEY: "S3RVER",
      OBJECT_STORE_SECRET_KEY: "S3RVER",
      OBJECT_STORE_REGION: "us-east-1",
    },
    async stop() {
      await server.close().catch(() => {});
      fs.rmSync(directory, { recursive: true, force: true });
    },
  };
}
