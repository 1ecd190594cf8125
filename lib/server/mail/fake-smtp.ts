import "server-only";
import type { AddressInfo } from "node:net";
import { parseMail, type ParsedMail } from "./mime";

export interface CapturedMessage extends ParsedMail {
  envelopeFrom: string | null;
  envelopeTo: string[];
  raw: string;
}

export interface FakeSmtp {
  host: string;
  port: number;
  close(): Promise<void>;
}

const MAX_BYTES = 2 * 1024 * 1024;

/**
 * A local SMTP server (the `smtp-server` package) that accepts every message on 127.0.0.1 and hands
 * it, parsed, to `onMessage`. Used by demo mode and by tests; never exposed beyond this machine.
 * `port` 0 picks a free port.
 */
export async function startFakeSmtp(opts: {
  port?: number;
  onMessage: (m: CapturedMessage) => Promise<void> | void;
}): Promise<FakeSmtp> {
  // Loaded from node_modules at run time, never bundled: only demo mode and tests use it (a dev dependency).
  const { SMTPServer } = await import(/* turbopackIgnore: true */ /* webpackIgnore: true */ "smtp-server");
  const server = new SMTPServer({
    authOptional: true,
    disabledCommands: ["STARTTLS", "AUTH"],
    logger: false,
    size: MAX_BYTES,
    banner: "Plotproof fake SMTP (messages are captured, never delivered)",
    onData(stream, session, callback) {
      const chunks: Buffer[] = [];
      stream.on("data", (c: Buffer) => chunks.push(c));
      stream.on("end", () => {
        const raw = Buffer.concat(chunks).toString("utf8");
        const parsed = parseMail(raw);
        const envelopeFrom = session.envelope.mailFrom ? session.envelope.mailFrom.address : null;
        const envelopeTo = session.envelope.rcptTo.map((r) => r.address.toLowerCase());
        Promise.resolve(opts.onMessage({ ...parsed, envelopeFrom, envelopeTo, raw }))
          .then(() => callback())
          .catch((err: Error) => callback(err));
      });
    },
  });
  await new Promise<void>((resolve, reject) => {
    server.once("error", reject);
    server.listen(opts.port ?? 0, "127.0.0.1", () => resolve());
  });
  const { port } = server.server.address() as AddressInfo;
  return { host: "127.0.0.1", port, close: () => new Promise<void>((r) => server.close(() => r())) };
}
