import "server-only";
import crypto from "node:crypto";

export const API_KEY_PREFIX = "ppk_";

/** A new key: shown to its creator once; only its SHA-256 is stored. */
export function newApiKey(): { key: string; prefix: string; hash: string } {
  const key = API_KEY_PREFIX + crypto.randomBytes(30).toString("base64url");
  return { key, prefix: key.slice(0, 12), hash: hashApiKey(key) };
}

export function hashApiKey(key: string): string {
  return crypto.createHash("sha256").update(key).digest("hex");
}

/** The key in `Authorization: Bearer ppk_…`, if any. */
export function bearerKey(headers: Headers): string | null {
  const auth = headers.get("authorization");
  const m = auth?.match(/^Bearer\s+(ppk_[A-Za-z0-9_-]{20,})\s*$/);
  return m ? m[1] : null;
}
