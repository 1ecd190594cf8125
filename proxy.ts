import { type NextRequest, NextResponse } from "next/server";
import { ownOrigins, refuseCrossSite } from "@/lib/security/request-guard";

/**
 * Runs before every page and route handler:
 * - refuses state-changing requests sent from another site (lib/security/request-guard.ts);
 * - tells server components which page was asked for, so sign-in can return there;
 * - asks browsers to keep to https once the product is served over it (HSTS).
 * Access itself is checked in every page, route handler and action, never here.
 */
export function proxy(req: NextRequest) {
  // Not req.nextUrl.origin: behind lib/server/http/serve.mjs that is the listening address (http://0.0.0.0:3000).
  const own = ownOrigins(
    { protocol: req.nextUrl.protocol, host: req.headers.get("host") },
    process.env.BETTER_AUTH_URL,
  );
  const refusal = refuseCrossSite({ method: req.method, pathname: req.nextUrl.pathname, headers: req.headers }, own);
  if (refusal) {
    return NextResponse.json(
      { error: { code: refusal.code, message: refusal.message } },
      { status: refusal.status, headers: { "cache-control": "no-store" } },
    );
  }
  const headers = new Headers(req.headers);
  headers.set("x-plotproof-path", req.nextUrl.pathname + req.nextUrl.search);
  const res = NextResponse.next({ request: { headers } });
  if (req.nextUrl.protocol === "https:") res.headers.set("strict-transport-security", "max-age=31536000");
  return res;
}

// Not the upload route: Next would buffer a copy of its body here, cut at 10 MB (experimental.proxyClientMaxBodySize),
// and the route would read the cut copy. The route refuses cross-site requests itself (lib/server/cross-site.ts).
export const config = { matcher: ["/((?!_next/static|_next/image|mark.svg|demo/|api/fields/[^/]+/datasets$).*)"] };
