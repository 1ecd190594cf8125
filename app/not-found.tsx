import Link from "next/link";
import { Wordmark } from "./_components/mark";

export default function NotFound() {
  return (
    <main className="mx-auto max-w-lg px-6 py-20" data-testid="not-found">
      <Wordmark />
      <h1 className="mt-8 text-xl font-semibold">Nothing here</h1>
      <p className="mt-2 text-ink-soft">
        This page does not exist, or it belongs to an organisation you are not part of.
      </p>
      <Link href="/" className="mt-6 inline-block font-medium text-leaf hover:underline">
        Back to your home
      </Link>
    </main>
  );
}
