/**
 * The pure core's rule (style notes, habit 4 — common practice, no source): no I/O, clock,
 * environment, randomness, logging or framework. One list for the purity tests of geo/, lib/audit/
 * and lib/map/, which each choose their own files.
 */
import { readFileSync } from "node:fs";
import path from "node:path";

export const FORBIDDEN_IN_CORE: [RegExp, string][] = [
  [/\bDate\.now\s*\(/, "Date.now()"],
  [/\bnew Date\s*\(\s*\)/, "new Date() (reads the clock)"],
  [/\bprocess\./, "process"],
  [/\bMath\.random\s*\(/, "Math.random()"],
  [/\bconsole\./, "console"],
  [/from\s+["'](node:|fs|path|os|http|https|net|child_process|worker_threads)/, "Node built-in import"],
  [/from\s+["'](next|react|react-dom|drizzle-orm|better-auth|swr|@deck\.gl\/[a-z-]+)(\/|["'])/, "framework import"],
  [/from\s+["']@\/(db|app)\//, "database or app import"],
  [/\brequire\s*\(/, "require()"],
  [/\bfetch\s*\(/, "fetch()"],
];

/** "file: rule" for every rule a file breaks; paths relative to `root`. */
export function impurities(root: string, files: readonly string[]): string[] {
  const found: string[] = [];
  for (const file of files) {
    const text = readFileSync(path.resolve(root, file), "utf8");
    for (const [re, what] of FORBIDDEN_IN_CORE)
      if (re.test(text)) found.push(`${path.relative(root, path.resolve(root, file))}: ${what}`);
  }
  return found;
}
