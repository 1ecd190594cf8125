"use client";

export default function ErrorPage({ error, reset }: { error: Error & { digest?: string }; reset: () => void }) {
  return (
    <main className="mx-auto max-w-lg px-6 py-20" role="alert">
      <h1 className="text-xl font-semibold">Something went wrong</h1>
      <p className="mt-2 text-ink-soft">
        Nothing you uploaded or signed has been changed. Try again; if it keeps happening, quote this reference:{" "}
        {error.digest ?? "none"}.
      </p>
      <button type="button" onClick={reset} className="mt-6 rounded-plot bg-leaf px-4 py-2 font-medium text-white">
        Try again
      </button>
    </main>
  );
}
