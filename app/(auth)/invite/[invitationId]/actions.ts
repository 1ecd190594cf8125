"use server";
import { headers } from "next/headers";
import { redirect } from "next/navigation";
import {
  type InviteState,
  type InviteSubmission,
  submitNewAccount,
  submitSignedIn,
  submitSignIn,
} from "@/lib/server/invites/forms";

function shown(s: InviteSubmission): InviteState {
  if (s.accepted) redirect("/");
  return s.state;
}

/** Public by nature (the invitee has no account yet): the invitation link is the proof of the e-mail address. */
export async function acceptNewAccountAction(_prev: InviteState, formData: FormData): Promise<InviteState> {
  return shown(await submitNewAccount(formData, await headers()));
}

export async function acceptSignInAction(_prev: InviteState, formData: FormData): Promise<InviteState> {
  return shown(await submitSignIn(formData, await headers()));
}

export async function acceptSignedInAction(_prev: InviteState, formData: FormData): Promise<InviteState> {
  return shown(await submitSignedIn(formData, await headers()));
}
