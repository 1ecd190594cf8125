import type { Metadata } from "next";
import Link from "next/link";
import { requirePageViewer } from "@/lib/server/access";
import { CAN_MANAGE_TEAM } from "@/lib/roles";
import { mailConfig } from "@/lib/server/mail/config";
import { PageTitle } from "@/app/_components/ui";
import { TeamManager } from "./team-manager";

export const metadata: Metadata = { title: "Team" };

export default async function TeamPage() {
  const viewer = await requirePageViewer(CAN_MANAGE_TEAM);
  const mail = mailConfig();
  return (
    <>
      <PageTitle sub={viewer.orgName}>Team</PageTitle>
      {mail.mode === "capture" ? (
        <p className="mb-4 text-sm text-ink-soft" data-testid="outbox-note">
          Demo mode: e-mails are not delivered but caught by a local fake mail server.{" "}
          <Link href="/outbox" className="font-medium text-leaf hover:underline">
            Read them in the outbox
          </Link>
          .
        </p>
      ) : mail.mode === "off" ? (
        <p className="mb-4 rounded-plot border-l-4 border-stake bg-stake-pale p-3 text-sm">
          No mail server is configured (SMTP_HOST), so invitations are not e-mailed: copy each invitation&apos;s link
          and send it yourself.
        </p>
      ) : null}
      <TeamManager viewerEmail={viewer.email} />
    </>
  );
}
