/**
 * For tests: a fake SMTP server in the test process, with the mailer pointed at it through the same
 * environment variables a real installation uses (SMTP_HOST, SMTP_PORT). Messages arrive parsed.
 *
 *   const mail = await captureMail();
 *   … do something that sends …
 *   const m = await mail.waitFor((m) => m.to.includes("idris@kestrelfen.example"));
 *   await mail.stop();
 */
import { startFakeSmtp, type CapturedMessage } from "./fake-smtp";

export type { CapturedMessage };

export interface MailCapture {
  messages: CapturedMessage[];
  /** Resolves with the first message (already received or arriving within `timeoutMs`) that matches. */
  waitFor(match: (m: CapturedMessage) => boolean, timeoutMs?: number): Promise<CapturedMessage>;
  clear(): void;
  stop(): Promise<void>;
}

export async function captureMail(): Promise<MailCapture> {
  const messages: CapturedMessage[] = [];
  const waiters: { match: (m: CapturedMessage) => boolean; resolve: (m: CapturedMessage) => void }[] = [];
  const server = await startFakeSmtp({
    onMessage: (m) => {
      messages.push(m);
      for (const w of [...waiters])
        if (w.match(m)) {
          waiters.splice(waiters.indexOf(w), 1);
          w.resolve(m);
        }
    },
  });
  const saved = { host: process.env.SMTP_HOST, port: process.env.SMTP_PORT, secure: process.env.SMTP_SECURE };
  process.env.SMTP_HOST = server.host;
  process.env.SMTP_PORT = String(server.port);
  process.env.SMTP_SECURE = "false";
  return {
    messages,
    waitFor(match, timeoutMs = 5000) {
      const found = messages.find(match);
      if (found) return Promise.resolve(found);
      return new Promise((resolve, reject) => {
        const w = {
          match,
          resolve: (m: CapturedMessage) => {
            clearTimeout(timer);
            resolve(m);
          },
        };
        const timer = setTimeout(() => {
          waiters.splice(waiters.indexOf(w), 1);
          reject(
            new Error(
              `no matching e-mail within ${timeoutMs} ms; received: ${messages.map((m) => `${m.to.join(",")}: ${m.subject}`).join(" | ") || "none"}`,
            ),
          );
        }, timeoutMs);
        waiters.push(w);
      });
    },
    clear() {
      messages.length = 0;
    },
    async stop() {
      for (const [k, v] of [
        ["SMTP_HOST", saved.host],
        ["SMTP_PORT", saved.port],
        ["SMTP_SECURE", saved.secure],
      ] as const) {
        if (v === undefined) delete process.env[k];
        else process.env[k] = v;
      }
      await server.close();
    },
  };
}
