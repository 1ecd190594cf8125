import "server-only";
import { z } from "zod";

/**
 * Mail settings, from the environment only:
 *   SMTP_HOST, SMTP_PORT (default 587, or 465 with SMTP_SECURE), SMTP_USER, SMTP_PASS,
 *   SMTP_SECURE ("true" = TLS from the start; otherwise STARTTLS when the server offers it),
 *   MAIL_FROM (e.g. "Plotproof <audits@farm.example>").
 * Without SMTP_HOST, demo mode (PLOTPROOF_DEMO=1) captures every message in a local fake SMTP server
 * (readable on /outbox); otherwise messages are not sent and the activity log says so.
 */
const MailEnv = z.object({
  SMTP_HOST: z.string().trim().min(1).optional(),
  SMTP_PORT: z.coerce.number().int().min(1).max(65535).optional(),
  SMTP_USER: z.string().optional(),
  SMTP_PASS: z.string().optional(),
  SMTP_SECURE: z.enum(["true", "false", "1", "0", "yes", "no"]).optional(),
  MAIL_FROM: z.string().trim().min(3).default("Plotproof <no-reply@plotproof.invalid>"),
  PLOTPROOF_DEMO: z.string().optional(),
  BETTER_AUTH_URL: z.url().default("http://localhost:3000"),
});

export type MailConfig =
  | {
      mode: "smtp";
      host: string;
      port: number;
      secure: boolean;
      user?: string;
      pass?: string;
      from: string;
      appUrl: string;
    }
  | { mode: "capture"; from: string; appUrl: string }
  | { mode: "off"; from: string; appUrl: string };

/** Read on every call (cheap), so tests can point the mailer elsewhere by changing the environment. */
export function mailConfig(env: NodeJS.ProcessEnv = process.env): MailConfig {
  const e = MailEnv.parse(env);
  const appUrl = e.BETTER_AUTH_URL.replace(/\/$/, "");
  if (e.SMTP_HOST) {
    const secure = e.SMTP_SECURE === "true" || e.SMTP_SECURE === "1" || e.SMTP_SECURE === "yes";
    return {
      mode: "smtp",
      host: e.SMTP_HOST,
      port: e.SMTP_PORT ?? (secure ? 465 : 587),
      secure,
      user: e.SMTP_USER || undefined,
      pass: e.SMTP_PASS || undefined,
      from: e.MAIL_FROM,
      appUrl,
    };
  }
  if (e.PLOTPROOF_DEMO === "1") return { mode: "capture", from: e.MAIL_FROM, appUrl };
  return { mode: "off", from: e.MAIL_FROM, appUrl };
}
