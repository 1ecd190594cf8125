// Plotproof's HTTP server: Next's request handler behind a plain Node server, so the client's address comes
// from the socket rather than from a header anyone can send (see peer-address.mjs). Used by `npm start`,
// `npm run demo` and the browser tests. Usage: node lib/server/http/serve.mjs [-p PORT] [--dev]
import { createServer } from "node:http";
import next from "next";
import { forwardedForToPass, isTrustedPeer, trustedProxyList } from "./peer-address.mjs";

const args = process.argv.slice(2);
const portAt = args.findIndex((a) => a === "-p" || a === "--port");
const port = Number(portAt >= 0 ? args[portAt + 1] : (process.env.PORT ?? 3000));
const hostname = process.env.HOSTNAME ?? "0.0.0.0";
const dev = args.includes("--dev");
const trusted = trustedProxyList(process.env.TRUSTED_PROXIES);

const app = next({ dev, hostname, port });
const handle = app.getRequestHandler();
await app.prepare();

createServer((req, res) => {
  const chain = forwardedForToPass(req.socket.remoteAddress, req.headers["x-forwarded-for"], trusted);
  if (chain) req.headers["x-forwarded-for"] = chain;
  else delete req.headers["x-forwarded-for"];
  // The same distrust for the other forwarded facts a client could invent.
  if (!isTrustedPeer(req.socket.remoteAddress, trusted)) {
    delete req.headers["x-forwarded-host"];
    delete req.headers["x-forwarded-proto"];
  }
  void handle(req, res);
}).listen(port, hostname, () => {
  console.log(`[plotproof] ready on http://${hostname === "0.0.0.0" ? "localhost" : hostname}:${port}`);
});
