/** Labelled input with its own error line, tied together for screen readers. */
export function TextField({
  name,
  label,
  type = "text",
  error,
  autoComplete,
  defaultValue,
  hint,
}: {
  name: string;
  label: string;
  type?: string;
  error?: string;
  autoComplete?: string;
  defaultValue?: string;
  hint?: string;
}) {
  const errId = `${name}-error`;
  return (
    <div className="mb-4">
      <label htmlFor={name} className="mb-1 block text-sm font-medium">
        {label}
      </label>
      <input
        id={name}
        name={name}
        type={type}
        autoComplete={autoComplete}
        defaultValue={defaultValue}
        aria-invalid={error ? true : undefined}
        aria-describedby={error ? errId : undefined}
        className={`w-full rounded-plot border bg-white px-3 py-2 text-base outline-none focus:border-leaf ${error ? "border-alarm" : "border-ink-faint"}`}
      />
      {hint && !error ? <p className="mt-1 text-xs text-ink-faint">{hint}</p> : null}
      {error ? (
        <p id={errId} role="alert" className="mt-1 text-sm text-alarm" data-field-error={name}>
          {error}
        </p>
      ) : null}
    </div>
  );
}

export function FormError({ message }: { message?: string | null }) {
  if (!message) return null;
  return (
    <p role="alert" className="mb-4 rounded-plot bg-alarm-pale px-3 py-2 text-sm text-alarm" data-form-error>
      {message}
    </p>
  );
}

export function SubmitButton({ children, pending }: { children: React.ReactNode; pending?: boolean }) {
  return (
    <button
      type="submit"
      disabled={pending}
      className="min-h-11 w-full rounded-plot bg-leaf px-4 py-2 font-medium text-white hover:bg-leaf-deep disabled:opacity-60"
    >
      {pending ? "Working…" : children}
    </button>
  );
}
