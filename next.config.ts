import type { NextConfig } from "next";

const dev = process.env.NODE_ENV !== "production";

/**
 * Content Security Policy. Next's own bootstrap scripts are inline, so scripts keep 'unsafe-inline'
 * (nonces would make every page dynamic); everything else is this origin only. Workers (file preview,
 * map) start from blob: and same-origin URLs; the map's WebGL needs no eval. Dev mode needs eval for
 * React's fast refresh.
 */
const CSP = [
  "default-src 'self'",
  `script-src 'self' 'unsafe-inline'${dev ? " 'unsafe-eval'" : ""}`,
  "style-src 'self' 'unsafe-inline'",
  "img-src 'self' data: blob:",
  "font-src 'self'",
  `connect-src 'self'${dev ? " ws: wss:" : ""}`,
  "worker-src 'self' blob:",
  "object-src 'none'",
  "base-uri 'self'",
  "form-action 'self'",
  "frame-ancestors 'none'",
].join("; ");

/** Sent with every answer, pages, JSON, CSV and raw-file downloads alike. */
const SECURITY_HEADERS = [
  { key: "Content-Security-Policy", value: CSP },
  { key: "X-Frame-Options", value: "DENY" },
  { key: "X-Content-Type-Options", value: "nosniff" },
  { key: "Referrer-Policy", value: "strict-origin-when-cross-origin" },
  { key: "Permissions-Policy", value: "camera=(), microphone=(), geolocation=(self)" },
];

const nextConfig: NextConfig = {
  // PGlite loads its wasm and data files from node_modules; bundling would copy them into public static output.
  // turf's convex hull breaks when bundled for the server ("n is not a constructor").
  // esbuild bundles the audit worker at run time (lib/workers/bundle.ts) and ships a native binary.
  serverExternalPackages: ["@electric-sql/pglite", "@turf/turf", "esbuild"],
  poweredByHeader: false,
  // Types are checked once by `tsc --noEmit` in the test command; the build need not repeat it.
  typescript: { ignoreBuildErrors: true },
  // forbidden() / unauthorized() render app/forbidden.tsx and app/unauthorized.tsx with 403 / 401.
  experimental: { authInterrupts: true },
  async headers() {
    return [{ source: "/:path*", headers: SECURITY_HEADERS }];
  },
};

export default nextConfig;
