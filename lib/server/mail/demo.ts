import "server-only";
import { getDb } from "@/db/client";
import { storeCapturedMail } from "@/db/queries/outbox";
import { startFakeSmtp, type FakeSmtp } from "./fake-smtp";

const g = globalThis as unknown as { __plotproofDemoSmtp?: Promise<FakeSmtp> };

/**
 * Demo mode: a fake SMTP server in this process that stores every message it receives in the
 * database for the outbox page. Started once at server start (instrumentation.ts) or at the first send.
 * `FAKE_SMTP_PORT` fixes its port (default: any free port on 127.0.0.1).
 */
export function ensureDemoMailCapture(): Promise<FakeSmtp> {
  if (!g.__plotproofDemoSmtp) {
    const port = Number(process.env.FAKE_SMTP_PORT ?? 0) || 0;
    g.__plotproofDemoSmtp = startFakeSmtp({
      port,
      onMessage: async (m) => {
        await storeCapturedMail(await getDb(), {
          orgId: m.headers["x-plotproof-org"] ?? null,
          kind: m.headers["x-plotproof-kind"] ?? null,
          envelopeFrom: m.envelopeFrom,
          envelopeTo: m.envelopeTo,
          subject: m.subject,
          text: m.text,
          raw: m.raw,
        });
      },
    });
    g.__plotproofDemoSmtp.catch(() => {
      g.__plotproofDemoSmtp = undefined;
    });
  }
  return g.__plotproofDemoSmtp;
}
