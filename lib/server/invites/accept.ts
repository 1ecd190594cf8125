import "server-only";
import { isAPIError } from "better-auth/api";
import { getAuth } from "@/lib/server/auth";
import { getDb } from "@/db/client";
import { logActivity } from "@/db/queries/activity";
import { deleteUserById } from "@/db/queries/organisations";
import { getInvitation, userExistsWithEmail, type InvitationRow } from "@/db/queries/team";

export type AcceptResult =
  | { ok: true; orgId: string }
  | { ok: false; errors?: Record<string, string>; formError?: string };

/** Why an invitation cannot be used, in words for the invitee; null when it can. */
export function invitationProblem(inv: InvitationRow | null): string | null {
  if (!inv) return "This invitation does not exist. Check that you opened the whole link from the e-mail.";
  if (inv.status === "expired")
    return `This invitation to ${inv.orgName} has expired. Ask its owner to send you a new one.`;
  if (inv.status === "accepted") return "This invitation has already been accepted. Sign in instead.";
  if (inv.status !== "pending")
    return `This invitation to ${inv.orgName} was withdrawn. Ask its owner if you should still join.`;
  return null;
}

/** The Cookie header a browser would send after these Set-Cookie headers. */
function cookieHeader(setCookies: Headers): Headers {
  const h = new Headers();
  h.set(
    "cookie",
    setCookies
      .getSetCookie()
      .map((c) => c.split(";")[0])
      .join("; "),
  );
  return h;
}

async function accept(invitationId: string, session: Headers, inv: InvitationRow, userId: string): Promise<void> {
  await (await getAuth()).api.acceptInvitation({ headers: session, body: { invitationId } });
  await logActivity(await getDb(), {
    orgId: inv.orgId,
    actorId: userId,
    action: "invitation.accepted",
    subjectType: "invitation",
    subjectId: invitationId,
    detail: { email: inv.email, role: inv.role },
  });
}

/** A first-time invitee: create the account for the invited address, then accept. Nothing is left behind on failure. */
export async function acceptWithNewAccount(
  invitationId: string,
  input: { name: string; password: string },
  requestHeaders: Headers,
): Promise<AcceptResult> {
  const db = await getDb();
  const inv = await getInvitation(db, { id: invitationId });
  const problem = invitationProblem(inv);
  if (problem || !inv) return { ok: false, formError: problem ?? "This invitation cannot be used." };
  if (await userExistsWithEmail(db, { email: inv.email }))
    return { ok: false, formError: `There is already a Plotproof account for ${inv.email}: sign in to accept.` };
  const auth = await getAuth();
  let userId: string;
  let session: Headers;
  try {
    const signedUp = await auth.api.signUpEmail({
      body: { name: input.name, email: inv.email, password: input.password },
      headers: requestHeaders,
      returnHeaders: true,
    });
    userId = signedUp.response.user.id;
    session = cookieHeader(signedUp.headers);
  } catch (err) {
    if (isAPIError(err) && String(err.body?.code ?? "").startsWith("PASSWORD_TOO"))
      return { ok: false, errors: { password: "Use 10 to 128 characters." } };
    console.error("[plotproof] sign-up from an invitation failed", err);
    return { ok: false, formError: "We could not create your account. Nothing was saved; try again." };
  }
  try {
    await accept(invitationId, session, inv, userId);
  } catch (err) {
    console.error("[plotproof] accepting an invitation failed", err);
    await deleteUserById(db, { userId });
    return {
      ok: false,
      formError:
        "The invitation could not be accepted (it may just have expired). Nothing was saved; ask the owner for a new one.",
    };
  }
  return { ok: true, orgId: inv.orgId };
}

/** An invitee who already has an account: sign in with its password, then accept. */
export async function acceptWithSignIn(
  invitationId: string,
  input: { password: string },
  requestHeaders: Headers,
): Promise<AcceptResult> {
  const db = await getDb();
  const inv = await getInvitation(db, { id: invitationId });
  const problem = invitationProblem(inv);
  if (problem || !inv) return { ok: false, formError: problem ?? "This invitation cannot be used." };
  const auth = await getAuth();
  let session: Headers;
  let userId: string;
  try {
    const signedIn = await auth.api.signInEmail({
      body: { email: inv.email, password: input.password },
      headers: requestHeaders,
      returnHeaders: true,
    });
    userId = signedIn.response.user.id;
    session = cookieHeader(signedIn.headers);
  } catch (err) {
    if (isAPIError(err) && err.statusCode === 429)
      return { ok: false, formError: "Too many attempts. Wait a minute and try again." };
    return { ok: false, errors: { password: "That password does not match the account." } };
  }
  try {
    await accept(invitationId, session, inv, userId);
  } catch (err) {
    console.error("[plotproof] accepting an invitation failed", err);
    return { ok: false, formError: "The invitation could not be accepted; ask the owner for a new one." };
  }
  return { ok: true, orgId: inv.orgId };
}

/** Someone already signed in as the invited address. */
export async function acceptSignedIn(invitationId: string, requestHeaders: Headers): Promise<AcceptResult> {
  const db = await getDb();
  const inv = await getInvitation(db, { id: invitationId });
  const problem = invitationProblem(inv);
  if (problem || !inv) return { ok: false, formError: problem ?? "This invitation cannot be used." };
  const session = await (await getAuth()).api.getSession({ headers: requestHeaders });
  if (!session) return { ok: false, formError: "Sign in first." };
  if (session.user.email.toLowerCase() !== inv.email.toLowerCase())
    return { ok: false, formError: `This invitation is for ${inv.email}; you are signed in as ${session.user.email}.` };
  try {
    await accept(invitationId, requestHeaders, inv, session.user.id);
  } catch (err) {
    console.error("[plotproof] accepting an invitation failed", err);
    return { ok: false, formError: "The invitation could not be accepted; ask the owner for a new one." };
  }
  return { ok: true, orgId: inv.orgId };
}
