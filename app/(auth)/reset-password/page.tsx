import type { Metadata } from "next";
import Link from "next/link";
import { RequestResetForm, NewPasswordForm } from "./reset-forms";

export const metadata: Metadata = { title: "New password" };

/**
 * Without a token: ask for the e-mail address. With `?token=` (the link from the e-mail, after
 * better-auth checked it): choose the new password. `?error=INVALID_TOKEN` when the link was used or expired.
 */
export default async function ResetPasswordPage({
  searchParams,
}: {
  searchParams: Promise<Record<string, string | string[] | undefined>>;
}) {
  const sp = await searchParams;
  const token = typeof sp.token === "string" && sp.token.length <= 200 ? sp.token : null;
  const invalid = typeof sp.error === "string";
  return (
    <>
      <h1 className="mb-2 text-xl font-semibold">{token ? "Choose a new password" : "Forgot your password?"}</h1>
      {invalid ? (
        <p role="alert" className="mb-4 rounded-plot bg-alarm-pale px-3 py-2 text-sm text-alarm">
          That link has expired or was already used. Ask for a new one below.
        </p>
      ) : null}
      {token ? <NewPasswordForm token={token} /> : <RequestResetForm />}
      <p className="mt-6 text-sm text-ink-soft">
        <Link href="/login" className="font-medium text-leaf hover:underline">
          Back to sign in
        </Link>
      </p>
    </>
  );
}
