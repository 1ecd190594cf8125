import type { NextConfig } from "next";

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
};

export default nextConfig;
