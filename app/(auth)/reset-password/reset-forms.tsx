"use client";
import { useState } from "react";
import Link from "next/link";
import { z } from "zod";
import { authClient } from "@/lib/auth-client";
import { FormError, SubmitButton, TextField } from "@/app/_components/form";
import { PASSWORD_MIN, fieldErrors } from "@/lib/validation/account";

const RequestInput = z.object({ email: z.email("Enter a valid e-mail address, e.g. name@farm.example.") });
const NewPasswordInput = z
  .object({
    password: z
      .string()
      .min(PASSWORD_MIN, `Use at least ${PASSWORD_MIN} characters.`)
      .max(128, "Use at most 128 characters."),
    confirm: z.string(),
  })
  .refine((v) => v.password === v.confirm, { path: ["confirm"], message: "The two passwords differ." });

/** Ask for a reset link. The answer is the same whether or not the address has an account. */
export function RequestResetForm() {
  const [errors, setErrors] = useState<Record<string, string>>({});
  const [formError, setFormError] = useState<string | null>(null);
  const [sentTo, setSentTo] = useState<string | null>(null);
  const [pending, setPending] = useState(false);

  async function onSubmit(e: React.FormEvent<HTMLFormElement>) {
    e.preventDefault();
    const parsed = RequestInput.safeParse(Object.fromEntries(new FormData(e.currentTarget)));
    setFormError(null);
    if (!parsed.success) return setErrors(fieldErrors(parsed.error));
    setErrors({});
    setPending(true);
    const { error } = await authClient.requestPasswordReset({
      email: parsed.data.email,
      redirectTo: "/reset-password",
    });
    setPending(false);
    if (error)
      return setFormError(
        error.status === 429
          ? "Too many requests. Wait a minute and try again."
          : "That did not work. Try again in a moment.",
      );
    setSentTo(parsed.data.email);
  }

  if (sentTo) {
    return (
      <p
        role="status"
        className="rounded-plot border-l-4 border-leaf bg-leaf-pale p-3 text-sm"
        data-testid="reset-requested"
      >
        If {sentTo} has a Plotproof account, an e-mail with a link is on its way. The link works for one hour.
      </p>
    );
  }
  return (
    <form onSubmit={onSubmit} noValidate aria-label="Ask for a new password">
      <p className="mb-4 text-sm text-ink-soft">We e-mail you a link to choose a new one.</p>
      <FormError message={formError} />
      <TextField name="email" label="E-mail" type="email" autoComplete="email" error={errors.email} />
      <SubmitButton pending={pending}>E-mail me a link</SubmitButton>
    </form>
  );
}

export function NewPasswordForm({ token }: { token: string }) {
  const [errors, setErrors] = useState<Record<string, string>>({});
  const [formError, setFormError] = useState<string | null>(null);
  const [done, setDone] = useState(false);
  const [pending, setPending] = useState(false);

  async function onSubmit(e: React.FormEvent<HTMLFormElement>) {
    e.preventDefault();
    const parsed = NewPasswordInput.safeParse(Object.fromEntries(new FormData(e.currentTarget)));
    setFormError(null);
    if (!parsed.success) return setErrors(fieldErrors(parsed.error));
    setErrors({});
    setPending(true);
    const { error } = await authClient.resetPassword({ newPassword: parsed.data.password, token });
    setPending(false);
    if (error)
      return setFormError(
        error.code === "INVALID_TOKEN"
          ? "This link has expired or was already used. Ask for a new one."
          : "The password could not be changed. Try again.",
      );
    setDone(true);
  }

  if (done) {
    return (
      <p
        role="status"
        className="rounded-plot border-l-4 border-leaf bg-leaf-pale p-3 text-sm"
        data-testid="reset-done"
      >
        Your password is changed and you are signed out everywhere.{" "}
        <Link href="/login" className="font-medium text-leaf underline">
          Sign in
        </Link>{" "}
        with the new one.
      </p>
    );
  }
  return (
    <form onSubmit={onSubmit} noValidate aria-label="Choose a new password">
      <FormError message={formError} />
      <TextField
        name="password"
        label="New password"
        type="password"
        autoComplete="new-password"
        error={errors.password}
        hint="At least 10 characters."
      />
      <TextField
        name="confirm"
        label="The same password again"
        type="password"
        autoComplete="new-password"
        error={errors.confirm}
      />
      <SubmitButton pending={pending}>Change password</SubmitButton>
    </form>
  );
}
