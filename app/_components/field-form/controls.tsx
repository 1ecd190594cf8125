/** Small building blocks for forms driven by react-hook-form: a label, the control, a hint and an error, tied together. */

export const inputClass = (invalid: boolean) =>
  `w-full rounded-plot border bg-white px-3 py-2 text-base outline-none focus:border-leaf ${invalid ? "border-alarm" : "border-ink-faint"}`;

export const buttonClass = {
  primary:
    "inline-flex min-h-11 items-center justify-center rounded-plot bg-leaf px-4 py-2 font-medium text-white hover:bg-leaf-deep disabled:opacity-60",
  secondary:
    "inline-flex min-h-11 items-center justify-center rounded-plot border border-ink-faint bg-white px-3 py-1.5 text-sm font-medium text-ink hover:border-leaf hover:text-leaf disabled:opacity-50 disabled:hover:border-ink-faint disabled:hover:text-ink",
  quiet:
    "inline-flex min-h-6 items-center text-sm font-medium text-leaf underline-offset-2 hover:underline disabled:opacity-50",
};

/** Ids of a control's hint and error, for aria-describedby. */
export function describedBy(
  id: string,
  { hint, error }: { hint?: React.ReactNode; error?: string },
): string | undefined {
  const ids = [error ? `${id}-error` : null, hint ? `${id}-hint` : null].filter(Boolean);
  return ids.length ? ids.join(" ") : undefined;
}

/**
 * A labelled row: `children` is the control (it must carry `id` and `aria-describedby={describedBy(id, …)}`).
 * The error line carries `data-field-error` with the form path so tests and people can find it.
 */
export function FieldRow({
  id,
  label,
  hint,
  error,
  children,
  className = "mb-4",
}: {
  id: string;
  label: React.ReactNode;
  hint?: React.ReactNode;
  error?: string;
  children: React.ReactNode;
  className?: string;
}) {
  return (
    <div className={className}>
      <label htmlFor={id} className="mb-1 block text-sm font-medium">
        {label}
      </label>
      {children}
      {hint ? (
        <p id={`${id}-hint`} className="mt-1 text-xs text-ink-faint">
          {hint}
        </p>
      ) : null}
      {error ? (
        <p id={`${id}-error`} className="mt-1 text-sm text-alarm" data-field-error={id}>
          {error}
        </p>
      ) : null}
    </div>
  );
}

export function Notice({
  tone = "info",
  children,
  testId,
}: {
  tone?: "info" | "caution" | "alarm" | "ok";
  children: React.ReactNode;
  testId?: string;
}) {
  const tones = {
    info: "border-chalk-line bg-chalk",
    caution: "border-stake bg-stake-pale",
    alarm: "border-alarm bg-alarm-pale",
    ok: "border-leaf bg-leaf-pale",
  } as const;
  return (
    <div className={`rounded-plot border-l-4 p-3 text-sm ${tones[tone]}`} data-testid={testId}>
      {children}
    </div>
  );
}
