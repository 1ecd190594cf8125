import "server-only";
import { ownOrigins, refuseCrossSite } from "@/lib/security/request-guard";
import { env } from "./env";

type Handler<C> = (req: Request, ctx: C) => Promise<Response>;

/**
 * The proxy's cross-site refusal (proxy.ts), applied by a route handler itself. For the upload route only, which the
 * proxy must skip: Next buffers a copy of every body the proxy sees, at most 10 MB, and hands the route the cut copy,
 * so a larger file arrived as "Unexpected end of form".
 */
export function refusingCrossSite<C>(handler: Handler<C>): Handler<C> {
  return async (req, ctx) => {
    const url = new URL(req.url);
    const own = ownOrigins({ protocol: url.protocol, host: req.headers.get("host") }, env().BETTER_AUTH_URL);
    const refusal = refuseCrossSite({ method: req.method, pathname: url.pathname, headers: req.headers }, own);
    if (refusal)
      return Response.json(
        { error: { code: refusal.code, message: refusal.message } },
        { status: refusal.status, headers: { "cache-control": "no-store" } },
      );
    return handler(req, ctx);
  };
}
