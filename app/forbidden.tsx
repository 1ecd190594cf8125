import Link from "next/link";
import { Wordmark } from "./_components/mark";

export default function Forbidden() {
  return (
    <main className="mx-auto max-w-lg px-6 py-20" data-testid="forbidden">
      <Wordmark />
      <h1 className="mt-8 text-xl font-semibold">This page is not part of your role</h1>
      <p className="mt-2 text-ink-soft">
        Your role in this organisation does not include this page. Ask your organisation&apos;s owner if you need it.
      </p>
      <Link href="/" className="mt-6 inline-block font-medium text-leaf hover:underline">
        Back to your home
      </Link>
    </main>
  );
}
