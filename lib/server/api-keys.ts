import "server-only";
import crypto from "node:crypto";

/** What every new key starts with. */
export const API_KEY_PREFIX = "plotkey_";
/** What keys made before `plotkey_` start with; they keep working until revoked. */
export const LEGACY_API_KEY_PREFIX = "ppk_";

/** A new key: shown to its creator once; only its SHA-256 is stored. */
export function newApiKey(): { key: string; prefix: string; hash: string } {
  const key = API_KEY_PREFIX + crypto.randomBytes(30).toString("base64url");
  return { key, prefix: key.slice(0, API_KEY_PREFIX.length + 6), hash: hashApiKey(key) };
}

export function hashApiKey(key: string): string {
  return crypto.createHash("sha256").update(key).digest("hex");
}

/** The key in `Authorization: Bearer plotkey_…` (or an older `Bearer ppk_…`), if any. */
export function bearerKey(headers: Headers): string | null {
  const auth = headers.get("authorization");
  const m = auth?.match(/^Bearer\s+((?:plotkey_|ppk_)[A-Za-z0-9_-]{20,})\s*$/);
  return m ? m[1] : null;
}
