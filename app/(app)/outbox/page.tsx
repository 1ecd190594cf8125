import type { Metadata } from "next";
import { notFound } from "next/navigation";
import { requirePageViewer } from "@/lib/server/access";
import { CAN_READ_OUTBOX } from "@/lib/roles";
import { getDb } from "@/db/client";
import { listCapturedMail } from "@/db/queries/outbox";
import { mailConfig } from "@/lib/server/mail/config";
import { Empty, PageTitle, Panel } from "@/app/_components/ui";
import { LocalTime } from "@/app/_components/local-time";

export const metadata: Metadata = { title: "Outbox" };
export const dynamic = "force-dynamic";

/** Turn the bare links of a plain-text e-mail into anchors. */
function Linked({ text }: { text: string }) {
  const parts = text.split(/(https?:\/\/[^\s<>"')]+)/g);
  return (
    <>
      {parts.map((p, i) =>
        i % 2 === 1 ? (
          <a key={i} href={p} className="break-all font-medium text-leaf underline">
            {p}
          </a>
        ) : (
          p
        ),
      )}
    </>
  );
}

/** Demo mode only: the messages the local fake mail server caught, for this organisation's owner. */
export default async function OutboxPage() {
  const viewer = await requirePageViewer(CAN_READ_OUTBOX);
  if (mailConfig().mode !== "capture") notFound();
  const messages = await listCapturedMail(await getDb(), { orgId: viewer.orgId });
  return (
    <>
      <PageTitle sub="Demo mode: nothing is delivered. These are the e-mails Plotproof sent for your organisation and its members, as the fake mail server received them.">
        Outbox
      </PageTitle>
      <Panel title={`${messages.length} message${messages.length === 1 ? "" : "s"}`}>
        {messages.length === 0 ? (
          <Empty>No e-mail yet. Invite someone or submit an audit.</Empty>
        ) : (
          <ul className="divide-y divide-chalk-deep" data-testid="outbox">
            {messages.map((m) => (
              <li
                key={m.id}
                className="py-3"
                data-testid="outbox-message"
                data-to={m.to.join(",")}
                data-kind={m.kind ?? ""}
              >
                <details>
                  <summary className="cursor-pointer">
                    <span className="font-medium">{m.subject}</span>
                    <span className="text-sm text-ink-soft">
                      {" "}
                      · to {m.to.join(", ")} · <LocalTime iso={m.receivedAt} />
                    </span>
                  </summary>
                  <pre
                    className="mt-2 whitespace-pre-wrap rounded-plot bg-chalk p-3 font-sans text-sm"
                    data-testid="outbox-body"
                  >
                    <Linked text={m.text} />
                  </pre>
                </details>
              </li>
            ))}
          </ul>
        )}
      </Panel>
    </>
  );
}
