/**
 * SHA-256 (FIPS 180-4) as lower-case hex, over UTF-8 text or bytes. Deterministic; uses node:crypto,
 * so import it from server code only.
 */
import { createHash, type Hash } from "node:crypto";

/** @example sha256Hex("abc") // "ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad" */
export function sha256Hex(data: string | Uint8Array): string {
  return createHash("sha256").update(data).digest("hex");
}

/** An incremental SHA-256 for many lines (e.g. one per residual row). */
export function sha256Stream(): { update(text: string): void; hex(): string } {
  const h: Hash = createHash("sha256");
  return {
    update(text: string) {
      h.update(text, "utf8");
    },
    hex() {
      return h.digest("hex");
    },
  };
}
