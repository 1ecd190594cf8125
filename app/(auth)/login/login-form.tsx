"use client";
import { useState } from "react";
import { useRouter } from "next/navigation";
import { authClient } from "@/lib/auth-client";
import { FormError, SubmitButton, TextField } from "@/app/_components/form";
import { SignInInput, fieldErrors } from "@/lib/validation/account";

export function LoginForm({ next = "/" }: { next?: string }) {
  const router = useRouter();
  const [errors, setErrors] = useState<Record<string, string>>({});
  const [formError, setFormError] = useState<string | null>(null);
  const [pending, setPending] = useState(false);

  async function onSubmit(e: React.FormEvent<HTMLFormElement>) {
    e.preventDefault();
    const data = Object.fromEntries(new FormData(e.currentTarget));
    const parsed = SignInInput.safeParse(data);
    setFormError(null);
    if (!parsed.success) return setErrors(fieldErrors(parsed.error));
    setErrors({});
    setPending(true);
    const { error } = await authClient.signIn.email({ email: parsed.data.email, password: parsed.data.password });
    setPending(false);
    if (error) {
      setFormError(
        error.status === 401 || error.code === "INVALID_EMAIL_OR_PASSWORD"
          ? "That e-mail and password do not match an account. Check both and try again."
          : error.status === 429
            ? "Too many attempts. Wait a minute and try again."
            : "Sign-in failed. Try again in a moment.",
      );
      return;
    }
    router.replace(next);
    router.refresh();
  }

  return (
    <form onSubmit={onSubmit} noValidate aria-label="Sign in">
      <FormError message={formError} />
      <TextField name="email" label="E-mail" type="email" autoComplete="email" error={errors.email} />
      <TextField
        name="password"
        label="Password"
        type="password"
        autoComplete="current-password"
        error={errors.password}
      />
      <SubmitButton pending={pending}>Sign in</SubmitButton>
    </form>
  );
}
