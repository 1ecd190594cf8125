import { z } from "zod";
import { API_KEY_SCOPES } from "@/lib/security/key-scope";

/** The instant a key with this expiry date (YYYY-MM-DD) stops working: the start of that day, UTC; null if no date. */
export function keyExpiryInstant(day: string): Date | null {
  const m = day.match(/^(\d{4})-(\d{2})-(\d{2})$/);
  if (!m) return null;
  const at = new Date(Date.UTC(Number(m[1]), Number(m[2]) - 1, Number(m[3])));
  return at.toISOString().slice(0, 10) === day ? at : null;
}

/**
 * A new API key: its name, scope (full unless chosen) and optional expiry date, which must be a day after `now`
 * (UTC); the key stops working at the start of that day, UTC.
 */
export function apiKeyInput(now: Date) {
  return z.object({
    name: z.string().trim().min(1, "Name the key after the script or machine that uses it.").max(80),
    scope: z.enum(API_KEY_SCOPES, { message: "Choose full, upload or read." }).default("full"),
    expiresOn: z
      .string()
      .nullish()
      .transform((v, c) => {
        if (v == null || v === "") return null;
        const at = keyExpiryInstant(v);
        if (!at) {
          c.addIssue({ code: "custom", message: "Give the expiry as a date, YYYY-MM-DD." });
          return z.NEVER;
        }
        if (at.getTime() <= now.getTime()) {
          c.addIssue({ code: "custom", message: "Choose an expiry date after today (UTC)." });
          return z.NEVER;
        }
        return at;
      }),
  });
}
