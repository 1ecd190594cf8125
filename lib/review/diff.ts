/**
 * Where two JSON documents differ, as readable paths. Used to say loudly which figures of a
 * verification do not match the signed record. Pure.
 */
import { canonicalJson } from "./canonical";

export interface JsonDifference {
  /** e.g. "results.summary.rmseR" or "results.residuals.sha256". */
  path: string;
  signed: unknown;
  now: unknown;
}

/**
 * Compare after a canonical round trip (so NaN ≡ null and key order does not matter).
 * Stops after `limit` differences.
 * @example jsonDifferences({ a: 1, b: [1, 2] }, { a: 1, b: [1, 3] }) // [{ path: "b[1]", signed: 2, now: 3 }]
 */
export function jsonDifferences(signed: unknown, now: unknown, limit = 25): JsonDifference[] {
  const out: JsonDifference[] = [];
  walk(JSON.parse(canonicalJson(signed ?? null)), JSON.parse(canonicalJson(now ?? null)), "", out, limit);
  return out;
}

function walk(a: unknown, b: unknown, path: string, out: JsonDifference[], limit: number): void {
  if (out.length >= limit) return;
  if (a === b) return;
  const bothObjects = a !== null && b !== null && typeof a === "object" && typeof b === "object";
  if (!bothObjects || Array.isArray(a) !== Array.isArray(b)) {
    out.push({ path: path || "(whole document)", signed: a, now: b });
    return;
  }
  if (Array.isArray(a) && Array.isArray(b)) {
    if (a.length !== b.length) out.push({ path: `${path}.length`, signed: a.length, now: b.length });
    for (let i = 0; i < Math.min(a.length, b.length); i++) walk(a[i], b[i], `${path}[${i}]`, out, limit);
    return;
  }
  const ao = a as Record<string, unknown>,
    bo = b as Record<string, unknown>;
  const keys = [...new Set([...Object.keys(ao), ...Object.keys(bo)])].sort();
  for (const k of keys) walk(ao[k], bo[k], path ? `${path}.${k}` : k, out, limit);
}
