/**
 * Plotproof's layers, checked by dependency-cruiser (`npm run deps`; also a step of `npm test`).
 *
 *   app/  ->  lib/server/ (+ lib/demo/ seeding)  ->  db/queries, lib/audit, geo, pure lib/
 *
 * Nothing imports upward. The pure core (geo/, lib/audit/, lib/map/ and lib/review/ helpers) has no framework,
 * database, server or Node built-in; the rest of its purity (clock, randomness, environment, console) is checked by
 * Biome (biome.jsonc overrides, .biome/core-purity.grit). Test files (*.test.ts) and test helpers may import what
 * they need; they are left out of the layer rules, and production code may not import them.
 */

/** The server layer: modules that may read the database, the session, mail and the file system. */
const SERVER = ["^lib/server/", "^lib/demo/"];

/** Tests and the helpers only tests import. */
const TESTS = ["[.]test[.]tsx?$", "^tests/", "^lib/audit/test-helpers[.]ts$", "^lib/server/mail/testing[.]ts$"];

/**
 * The pure core. lib/map/bench-*.ts are command-line benchmarks; lib/review/hash.ts is the one review helper bound
 * to Node (SHA-256 from node:crypto), used by the server and the audit worker, never by the browser.
 */
const CORE = ["^geo/", "^lib/audit/", "^lib/map/", "^lib/review/", "^lib/plan/", "^lib/binary-frame[.]ts$"];
const NOT_CORE = [...TESTS, "^lib/map/bench-[^/]+[.]ts$", "^lib/review/hash[.]ts$"];

/** npm packages the core may use: reading and projecting coordinates (geo), statistics and option parsing (lib/audit). */
const GEO_PACKAGES = "(^|/)node_modules/(proj4|kdbush|papaparse)/";
const AUDIT_PACKAGES = "(^|/)node_modules/(simple-statistics|jstat|zod)/";

/** Frameworks, the database driver, the session and the browser map: never in the core. */
const PLATFORM = [
  "(^|/)node_modules/(next|react|react-dom|drizzle-orm|better-auth|swr|server-only|@electric-sql|nodemailer)/",
  "(^|/)node_modules/@deck[.]gl/",
  "^server-only$",
];

/** @type {import("dependency-cruiser").IConfiguration} */
module.exports = {
  forbidden: [
    {
      name: "geo-imports-only-geo",
      comment:
        "geo/ is the bottom of the core: it imports only geo/ and its coordinate packages (proj4, kdbush, papaparse).",
      severity: "error",
      from: { path: "^geo/", pathNot: TESTS },
      to: { pathNot: ["^geo/", GEO_PACKAGES] },
    },
    {
      name: "audit-imports-only-audit-and-geo",
      comment: "lib/audit/ (statistics, reports) imports only lib/audit/, geo/ and its maths packages.",
      severity: "error",
      from: { path: "^lib/audit/", pathNot: TESTS },
      to: { pathNot: ["^lib/audit/", "^geo/", AUDIT_PACKAGES, GEO_PACKAGES] },
    },
    {
      name: "core-not-to-node",
      comment:
        "The core runs in the browser and on worker threads: no Node built-in (fs, path, crypto, worker_threads…).",
      severity: "error",
      from: { path: CORE, pathNot: NOT_CORE },
      to: { dependencyTypes: ["core"] },
    },
    {
      name: "core-not-to-platform",
      comment:
        "The core takes plain objects and returns plain objects: no next, react, drizzle-orm, better-auth, swr, deck.gl or server-only.",
      severity: "error",
      from: { path: CORE, pathNot: NOT_CORE },
      to: { path: PLATFORM },
    },
    {
      name: "core-not-to-db-app-or-server",
      comment: "The core never reaches the database, a route or the server layer.",
      severity: "error",
      from: { path: CORE, pathNot: NOT_CORE },
      to: { path: ["^db/", "^app/", ...SERVER] },
    },
    {
      name: "db-not-to-server-or-app",
      comment:
        "db/ (schema, client, queries) is below the server layer: it never imports lib/server, the server-layer modules or app/.",
      severity: "error",
      from: { path: "^db/", pathNot: TESTS },
      to: { path: ["^app/", ...SERVER] },
    },
    {
      name: "db-imports-lib-types-only",
      comment:
        "db/ maps rows to the DTO types of lib/, but takes no value from lib/ (a value comes in from the caller); only the pure binary framing (lib/binary-frame.ts) that the points blob shares with the map payload, and the compact form of the planted records nobody surveyed (lib/review/planted-not-found.ts), which the readers of unpaired points rebuild rows from.",
      severity: "error",
      from: { path: "^db/", pathNot: TESTS },
      to: {
        path: "^lib/",
        pathNot: ["^lib/binary-frame[.]ts$", "^lib/review/planted-not-found[.]ts$"],
        dependencyTypesNot: ["type-only"],
      },
    },
    {
      name: "lib-not-to-server",
      comment:
        "Outside the server layer, lib/ (pure helpers, validation, worker entries, CLI) never imports lib/server or the server-layer modules.",
      severity: "error",
      from: { path: "^lib/", pathNot: [...SERVER, ...TESTS] },
      to: { path: SERVER },
    },
    {
      name: "lib-not-to-db",
      comment:
        "Outside the server layer, lib/ never imports the database: the server layer reads it and passes plain values in.",
      severity: "error",
      from: { path: "^lib/", pathNot: [...SERVER, ...TESTS] },
      to: { path: "^db/" },
    },
    {
      name: "worker-entries-stay-plain",
      comment:
        "Worker-thread entries are bundled by esbuild (lib/workers/bundle.ts): no server-only, next, database or server layer.",
      severity: "error",
      from: { path: ["^lib/audit-job/", "^lib/cli/read-worker[.]ts$"], pathNot: TESTS },
      to: { path: ["^db/", "^app/", ...SERVER, ...PLATFORM] },
    },
    {
      name: "only-app-imports-app",
      comment: "app/ is the top: routes, pages and their UI. Nothing outside app/ imports it.",
      severity: "error",
      from: { pathNot: ["^app/", ...TESTS] },
      to: { path: "^app/" },
    },
    {
      name: "no-test-code-in-production",
      comment: "Production modules never import tests, test files or test helpers.",
      severity: "error",
      from: { pathNot: TESTS },
      to: { path: TESTS },
    },
    {
      name: "no-circular",
      comment:
        "No import cycles between modules, type-only ones included. Between layers the direction rules above keep the " +
        "graph acyclic; a folder-scope cycle check would flag geo/index.ts, the barrel that re-exports geo/*/.",
      severity: "error",
      from: {},
      to: { circular: true },
    },
    {
      name: "not-to-unresolvable",
      comment: "Every import resolves to a file or an installed package.",
      severity: "error",
      from: {},
      to: { couldNotResolve: true, pathNot: PLATFORM },
    },
  ],
  options: {
    doNotFollow: { path: "node_modules" },
    // Test files may import anything a test needs; they are not part of any layer.
    exclude: { path: ["^[.]next/", "^[.]cache/", "^data/", "[.]test[.]tsx?$"] },
    // node_modules may be a symbolic link (worktrees); keep package paths under node_modules/.
    preserveSymlinks: true,
    // Keep `import type` (needed by db-imports-lib-types-only) and type-only packages in the graph.
    tsPreCompilationDeps: true,
    tsConfig: { fileName: "tsconfig.json" },
    enhancedResolveOptions: {
      exportsFields: ["exports"],
      conditionNames: ["import", "require", "node", "default", "types"],
      extensions: [".ts", ".tsx", ".d.ts", ".js", ".mjs", ".cjs", ".json"],
      mainFields: ["module", "main", "types", "typings"],
    },
    skipAnalysisNotInRules: true,
  },
};
