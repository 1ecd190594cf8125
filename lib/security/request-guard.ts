/**
 * Cross-site request refusal for every state-changing request (pure: no Next, no environment).
 *
 * A browser attaches the session cookie to a form or fetch sent from any site; what it cannot forge
 * are `Sec-Fetch-Site` and `Origin` (Fetch Metadata, W3C Working Draft; RFC 6454 §7). Requests that
 * carry neither come from scripts and tools, which hold no one's cookie by accident. A JSON body
 * must say so in its content type: a form or `text/plain` POST is what a cross-site page can send
 * without asking the browser first (CORS "simple request", Fetch Standard §3.2.3).
 */

const STATE_CHANGING = new Set(["POST", "PUT", "PATCH", "DELETE"]);

/** Content types a body sent to the product's own API may have. */
const API_BODY_TYPES = ["application/json", "multipart/form-data"];

export interface GuardedRequest {
  method: string;
  /** Path of the request, e.g. /api/fields. */
  pathname: string;
  headers: Headers;
}

export interface Refusal {
  status: 403 | 415;
  code: "forbidden" | "unsupported_media_type";
  message: string;
}

/**
 * Why this request must be refused, or null to let it through. `ownOrigins` are the origins the
 * product is served from (scheme://host:port), e.g. the configured public URL and the request's own.
 * The sign-in routes (/api/auth) keep their own origin check and content types; only the origin
 * rule applies there.
 */
export function refuseCrossSite(req: GuardedRequest, ownOrigins: readonly string[]): Refusal | null {
  if (!STATE_CHANGING.has(req.method.toUpperCase())) return null;
  const h = req.headers;
  const withCookie = !!h.get("cookie");
  // An API key is sent on purpose by a script; it is not an ambient credential a page can borrow.
  if (!withCookie && /^bearer\s/i.test(h.get("authorization") ?? "")) return null;

  const site = h.get("sec-fetch-site");
  if (site && site !== "same-origin" && site !== "none") {
    return {
      status: 403,
      code: "forbidden",
      message: `Refused: this request was sent from another site (Sec-Fetch-Site: ${site}). Use Plotproof's own pages or an API key.`,
    };
  }
  const origin = h.get("origin");
  if (origin !== null && !ownOrigins.includes(origin)) {
    return {
      status: 403,
      code: "forbidden",
      message: `Refused: this request was sent from ${origin === "null" ? "an opaque origin" : origin}, not from Plotproof. Use Plotproof's own pages or an API key.`,
    };
  }

  if (req.pathname.startsWith("/api/") && !req.pathname.startsWith("/api/auth/") && hasBody(h)) {
    const type = (h.get("content-type") ?? "").split(";")[0].trim().toLowerCase();
    if (!API_BODY_TYPES.includes(type)) {
      return {
        status: 415,
        code: "unsupported_media_type",
        message: `Send the body as JSON (Content-Type: application/json)${type ? `, not ${type}` : ""}; files go as multipart/form-data.`,
      };
    }
  }
  return null;
}

function hasBody(h: Headers): boolean {
  const length = h.get("content-length");
  if (length !== null) return Number(length) > 0;
  return h.has("transfer-encoding") || h.has("content-type");
}

/**
 * The origins this product is being reached at: the one the browser used (scheme and Host header; a Host a
 * page on another site cannot choose) and the configured public URL. The server's own listening address
 * (e.g. 0.0.0.0) is never one of them.
 */
export function ownOrigins(
  req: { protocol: string; host: string | null },
  configuredUrl: string | undefined,
): string[] {
  const own = new Set<string>();
  const asked = req.host ? originOf(`${req.protocol}//${req.host}`) : null;
  if (asked) own.add(asked);
  const configured = originOf(configuredUrl);
  if (configured) own.add(configured);
  return [...own];
}

/** The origin (scheme://host[:port]) of a URL, or null when it is not one. */
export function originOf(url: string | undefined): string | null {
  if (!url) return null;
  try {
    return new URL(url).origin;
  } catch {
    return null;
  }
}
