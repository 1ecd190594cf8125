import "server-only";
import { getDb } from "@/db/client";
import { logActivity } from "@/db/queries/activity";
import { mailConfig } from "./config";
import { createTransport } from "./transport";
import { ensureDemoMailCapture } from "./demo";
import type { MailContent } from "./templates";

export type DeliveryStatus = "sent" | "failed" | "skipped";

export interface Delivery {
  status: DeliveryStatus;
  error?: string;
}

/**
 * Send one message to each address (one message per recipient, so nobody sees the others' addresses).
 * Never throws: a failure is logged, recorded in the organisation's activity when there is one, and returned.
 */
export async function deliver(
  mail: MailContent,
  to: string[],
  meta: { orgId: string | null; subject?: { type: string; id: string } },
): Promise<Delivery> {
  const recipients = [...new Set(to.map((t) => t.trim().toLowerCase()).filter(Boolean))];
  if (recipients.length === 0) return { status: "skipped", error: "no recipients" };
  const config = mailConfig();
  let result: Delivery;
  try {
    const capture = config.mode === "capture" ? await ensureDemoMailCapture() : undefined;
    const transport = createTransport(config, capture);
    if (!transport) result = { status: "skipped", error: "no SMTP server is configured (set SMTP_HOST)" };
    else {
      for (const address of recipients) {
        await transport.sendMail({
          from: config.from,
          to: address,
          subject: mail.subject,
          text: mail.text,
          html: mail.html,
          headers: { "X-Plotproof-Kind": mail.kind, ...(meta.orgId ? { "X-Plotproof-Org": meta.orgId } : {}) },
        });
      }
      transport.close();
      result = { status: "sent" };
    }
  } catch (err) {
    console.error(`[plotproof] e-mail "${mail.subject}" could not be sent`, err);
    result = { status: "failed", error: (err as Error).message };
  }
  if (meta.orgId) {
    try {
      await logActivity(await getDb(), {
        orgId: meta.orgId,
        actorId: null,
        action: `mail.${result.status}`,
        subjectType: meta.subject?.type ?? "mail",
        subjectId: meta.subject?.id,
        detail: {
          kind: mail.kind,
          subject: mail.subject,
          recipients: recipients.length,
          ...(result.error ? { error: result.error } : {}),
        },
      });
    } catch (err) {
      console.error("[plotproof] could not record the e-mail in the activity log", err);
    }
  }
  if (result.status === "skipped") console.warn(`[plotproof] e-mail "${mail.subject}" not sent: ${result.error}`);
  return result;
}
