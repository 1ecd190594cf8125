import type { Metadata } from "next";
import Link from "next/link";
import { headers } from "next/headers";
import { getAuth } from "@/lib/server/auth";
import { getDb } from "@/db/client";
import { getInvitation, userExistsWithEmail } from "@/db/queries/team";
import { ROLE_DUTY, ROLE_LABEL } from "@/lib/roles";
import { LocalTime } from "@/app/_components/local-time";
import { invitationProblem } from "@/lib/server/invites/accept";
import { AcceptSignedInForm, ExistingAccountForm, NewAccountForm } from "./invite-forms";

export const metadata: Metadata = { title: "Invitation" };
export const dynamic = "force-dynamic";

/** Public: the link from the invitation e-mail. The invitation id itself is the secret. */
export default async function InvitePage({ params }: { params: Promise<{ invitationId: string }> }) {
  const { invitationId } = await params;
  const db = await getDb();
  const inv = invitationId.length <= 100 ? await getInvitation(db, { id: invitationId }) : null;
  const problem = invitationProblem(inv);
  if (problem || !inv) {
    return (
      <div role="alert" data-testid="invitation-problem">
        <h1 className="mb-3 text-xl font-semibold">This invitation cannot be used</h1>
        <p className="text-sm text-ink-soft">{problem}</p>
        <p className="mt-6 text-sm">
          <Link href="/login" className="font-medium text-leaf hover:underline">
            Sign in
          </Link>
        </p>
      </div>
    );
  }
  const session = await (await getAuth()).api.getSession({ headers: await headers() });
  const hasAccount = await userExistsWithEmail(db, { email: inv.email });
  return (
    <div data-testid="invitation">
      <h1 className="mb-2 text-xl font-semibold">Join {inv.orgName}</h1>
      <p className="mb-1 text-sm">
        {inv.invitedBy ?? "The owner"} invited <strong>{inv.email}</strong> as{" "}
        <strong data-testid="invitation-role">{ROLE_LABEL[inv.role]}</strong>.
      </p>
      <p className="mb-1 text-sm text-ink-soft">{ROLE_DUTY[inv.role]}</p>
      <p className="mb-6 text-xs text-ink-faint">
        The invitation works until <LocalTime iso={inv.expiresAt.toISOString()} />.
      </p>
      {session ? (
        session.user.email.toLowerCase() === inv.email.toLowerCase() ? (
          <AcceptSignedInForm invitationId={inv.id} orgName={inv.orgName} />
        ) : (
          <p role="alert" className="rounded-plot bg-alarm-pale p-3 text-sm text-alarm">
            You are signed in as {session.user.email}. Sign out first, then open the link again to accept as {inv.email}
            .
          </p>
        )
      ) : hasAccount ? (
        <ExistingAccountForm invitationId={inv.id} email={inv.email} />
      ) : (
        <NewAccountForm invitationId={inv.id} email={inv.email} />
      )}
    </div>
  );
}
