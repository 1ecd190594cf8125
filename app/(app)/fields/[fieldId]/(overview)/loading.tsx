export default function Loading() {
  return (
    <div className="mx-auto max-w-6xl px-6 py-8" aria-busy="true" aria-live="polite">
      <div className="h-6 w-48 animate-pulse rounded-plot bg-chalk-deep" />
      <p className="sr-only">Loading…</p>
    </div>
  );
}
