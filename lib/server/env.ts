import "server-only";
import fs from "node:fs";
import path from "node:path";
import crypto from "node:crypto";
import { z } from "zod";

const EnvSchema = z.object({
  BETTER_AUTH_URL: z.url().default("http://localhost:3000"),
  BETTER_AUTH_SECRET: z.string().min(32, "BETTER_AUTH_SECRET must be at least 32 characters").optional(),
  PGLITE_DIR: z.string().optional(),
  PLOTPROOF_DEMO: z.enum(["0", "1"]).default("0"),
  AUTH_SIGNIN_PER_MINUTE: z.coerce.number().int().positive().default(10),
  /** Addresses or CIDR ranges of reverse proxies whose X-Forwarded-For is believed; none by default. */
  TRUSTED_PROXIES: z.string().default(""),
  /** "1": anyone may set up an organisation at /signup. Otherwise only the first account of an empty install. */
  OPEN_SIGNUP: z.enum(["0", "1"]).default("0"),
});

export type Env = z.infer<typeof EnvSchema> & { authSecret: string; trustedProxies: string[] };

let cached: Env | undefined;

/**
 * Environment, validated once. Without BETTER_AUTH_SECRET a random secret is generated and kept
 * beside the database, so sessions survive restarts of a local install.
 */
export function env(): Env {
  if (cached) return cached;
  const parsed = EnvSchema.parse(process.env);
  let authSecret = parsed.BETTER_AUTH_SECRET;
  if (!authSecret && process.env.DATABASE_URL)
    throw new Error(
      "BETTER_AUTH_SECRET is required in server mode (DATABASE_URL set): every app instance must sign sessions with the same secret.",
    );
  if (!authSecret) {
    const dataDir =
      parsed.PGLITE_DIR && !parsed.PGLITE_DIR.startsWith("memory://")
        ? path.dirname(parsed.PGLITE_DIR)
        : path.join(/* turbopackIgnore: true */ process.cwd(), "data");
    const file = path.join(dataDir, "auth-secret");
    if (fs.existsSync(file)) authSecret = fs.readFileSync(file, "utf8").trim();
    else {
      authSecret = crypto.randomBytes(32).toString("hex");
      fs.mkdirSync(dataDir, { recursive: true });
      fs.writeFileSync(file, authSecret, { mode: 0o600 });
    }
  }
  const trustedProxies = parsed.TRUSTED_PROXIES.split(",")
    .map((p) => p.trim())
    .filter(Boolean);
  cached = { ...parsed, authSecret, trustedProxies };
  return cached;
}
