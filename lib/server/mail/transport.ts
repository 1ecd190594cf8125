import "server-only";
import nodemailer from "nodemailer";
import type { MailConfig } from "./config";

/** An SMTP transport for the configuration; `capture` goes to the local fake server at host:port. */
export function createTransport(config: MailConfig, capture?: { host: string; port: number }) {
  const timeouts = { connectionTimeout: 10_000, greetingTimeout: 10_000, socketTimeout: 20_000 };
  if (config.mode === "smtp") {
    return nodemailer.createTransport({
      host: config.host,
      port: config.port,
      secure: config.secure,
      auth: config.user ? { user: config.user, pass: config.pass ?? "" } : undefined,
      ...timeouts,
    });
  }
  if (config.mode === "capture" && capture) {
    return nodemailer.createTransport({
      host: capture.host,
      port: capture.port,
      secure: false,
      ignoreTLS: true,
      ...timeouts,
    });
  }
  return null;
}
