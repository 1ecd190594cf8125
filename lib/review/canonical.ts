/**
 * Canonical JSON, so that the same data always gives the same bytes and therefore the same hash.
 *
 * Rules (after RFC 8785, the JSON Canonicalization Scheme, §3.2):
 *  - object members sorted by key, comparing UTF-16 code units; members whose value is undefined are left out;
 *  - no whitespace;
 *  - numbers in ECMAScript's shortest round-trip form (`JSON.stringify`), −0 as 0;
 *  - non-finite numbers become null and undefined array items become null, as `JSON.stringify` does
 *    (JCS rejects them; we accept them because stored JSON has already turned them into null);
 *  - strings escaped as `JSON.stringify` does; dates as ISO 8601 strings (their `toJSON`);
 *  - typed arrays as plain arrays. BigInt, functions and symbols are refused.
 * Pure.
 *
 * @example canonicalJson({ b: [1, 2.50, -0], a: "x" }) // '{"a":"x","b":[1,2.5,0]}'
 */
export function canonicalJson(value: unknown): string {
  return write(value, "$");
}

function write(v: unknown, path: string): string {
  if (v === null || v === undefined) return "null";
  switch (typeof v) {
    case "boolean":
      return v ? "true" : "false";
    case "number":
      return Number.isFinite(v) ? (Object.is(v, -0) ? "0" : JSON.stringify(v)) : "null";
    case "string":
      return JSON.stringify(v);
    case "bigint":
    case "function":
    case "symbol":
      throw new TypeError(`canonicalJson: cannot represent a ${typeof v} at ${path}`);
  }
  if (ArrayBuffer.isView(v) && !(v instanceof DataView)) {
    return write(Array.from(v as unknown as ArrayLike<number>), path);
  }
  if (Array.isArray(v)) {
    return `[${v.map((item, i) => (item === undefined || typeof item === "function" ? "null" : write(item, `${path}[${i}]`))).join(",")}]`;
  }
  const withJson = v as { toJSON?: () => unknown };
  if (typeof withJson.toJSON === "function") return write(withJson.toJSON(), path);
  const obj = v as Record<string, unknown>;
  const keys = Object.keys(obj)
    .filter((k) => obj[k] !== undefined && typeof obj[k] !== "function")
    .sort(compareCodeUnits);
  return `{${keys.map((k) => `${JSON.stringify(k)}:${write(obj[k], `${path}.${k}`)}`).join(",")}}`;
}

/** Order by UTF-16 code units (RFC 8785 §3.2.3), not by locale. */
function compareCodeUnits(a: string, b: string): number {
  return a < b ? -1 : a > b ? 1 : 0;
}
