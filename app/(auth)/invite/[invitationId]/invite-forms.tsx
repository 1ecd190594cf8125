"use client";
import { useActionState } from "react";
import { FormError, SubmitButton, TextField } from "@/app/_components/form";
import type { InviteState } from "@/lib/server/invites/forms";
import { acceptNewAccountAction, acceptSignInAction, acceptSignedInAction } from "./actions";

export function NewAccountForm({ invitationId, email }: { invitationId: string; email: string }) {
  const [state, action, pending] = useActionState<InviteState, FormData>(acceptNewAccountAction, { errors: {} });
  return (
    <form action={action} noValidate aria-label="Set your password and join" data-testid="invite-new-account">
      <FormError message={state.formError} />
      <input type="hidden" name="invitationId" value={invitationId} />
      <p className="mb-4 text-sm">
        Your account will use <strong>{email}</strong>.
      </p>
      <TextField
        name="name"
        label="Your name"
        autoComplete="name"
        error={state.errors.name}
        defaultValue={state.name}
      />
      <TextField
        name="password"
        label="Choose a password"
        type="password"
        autoComplete="new-password"
        error={state.errors.password}
        hint="At least 10 characters."
      />
      <TextField
        name="confirm"
        label="The same password again"
        type="password"
        autoComplete="new-password"
        error={state.errors.confirm}
      />
      <SubmitButton pending={pending}>Set password and join</SubmitButton>
    </form>
  );
}

export function ExistingAccountForm({ invitationId, email }: { invitationId: string; email: string }) {
  const [state, action, pending] = useActionState<InviteState, FormData>(acceptSignInAction, { errors: {} });
  return (
    <form action={action} noValidate aria-label="Sign in and join" data-testid="invite-existing-account">
      <FormError message={state.formError} />
      <input type="hidden" name="invitationId" value={invitationId} />
      <p className="mb-4 text-sm">
        There is already a Plotproof account for <strong>{email}</strong>. Enter its password to join.
      </p>
      <TextField
        name="password"
        label="Password"
        type="password"
        autoComplete="current-password"
        error={state.errors.password}
      />
      <SubmitButton pending={pending}>Sign in and join</SubmitButton>
    </form>
  );
}

export function AcceptSignedInForm({ invitationId, orgName }: { invitationId: string; orgName: string }) {
  const [state, action, pending] = useActionState<InviteState, FormData>(acceptSignedInAction, { errors: {} });
  return (
    <form action={action} aria-label="Join" data-testid="invite-signed-in">
      <FormError message={state.formError} />
      <input type="hidden" name="invitationId" value={invitationId} />
      <SubmitButton pending={pending}>Join {orgName}</SubmitButton>
    </form>
  );
}
