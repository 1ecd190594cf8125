/** Labelled form controls for react-hook-form: label, hint and error tied together for screen readers. */
import type { UseFormRegisterReturn } from "react-hook-form";

export function FieldShell({
  id,
  label,
  hint,
  error,
  children,
}: {
  id: string;
  label: React.ReactNode;
  hint?: React.ReactNode;
  error?: string;
  children: React.ReactNode;
}) {
  return (
    <div className="mb-4">
      <label htmlFor={id} className="mb-1 block text-sm font-medium">
        {label}
      </label>
      {children}
      {hint && !error ? (
        <p id={`${id}-hint`} className="mt-1 text-xs text-ink-faint">
          {hint}
        </p>
      ) : null}
      {error ? (
        <p id={`${id}-error`} role="alert" className="mt-1 text-sm text-alarm" data-field-error={id}>
          {error}
        </p>
      ) : null}
    </div>
  );
}

const control = (error?: string) =>
  `w-full rounded-plot border bg-white px-3 py-2 text-base outline-none focus:border-leaf ${error ? "border-alarm" : "border-ink-faint"}`;

function described(id: string, hint?: React.ReactNode, error?: string) {
  return error ? `${id}-error` : hint ? `${id}-hint` : undefined;
}

export function InputRow({
  id,
  label,
  hint,
  error,
  reg,
  type = "text",
  inputMode,
  placeholder,
  suffix,
}: {
  id: string;
  label: React.ReactNode;
  hint?: React.ReactNode;
  error?: string;
  reg: UseFormRegisterReturn;
  type?: string;
  inputMode?: "decimal" | "numeric" | "text";
  placeholder?: string;
  suffix?: string;
}) {
  return (
    <FieldShell id={id} label={label} hint={hint} error={error}>
      <div className="flex items-center gap-2">
        <input
          id={id}
          type={type}
          inputMode={inputMode}
          placeholder={placeholder}
          {...reg}
          aria-invalid={error ? true : undefined}
          aria-describedby={described(id, hint, error)}
          className={control(error)}
        />
        {suffix ? (
          <span className="text-sm text-ink-soft" aria-hidden="true">
            {suffix}
          </span>
        ) : null}
      </div>
    </FieldShell>
  );
}

export function SelectRow({
  id,
  label,
  hint,
  error,
  reg,
  children,
}: {
  id: string;
  label: React.ReactNode;
  hint?: React.ReactNode;
  error?: string;
  reg: UseFormRegisterReturn;
  children: React.ReactNode;
}) {
  return (
    <FieldShell id={id} label={label} hint={hint} error={error}>
      <select
        id={id}
        {...reg}
        aria-invalid={error ? true : undefined}
        aria-describedby={described(id, hint, error)}
        className={control(error)}
      >
        {children}
      </select>
    </FieldShell>
  );
}

/** "12.5" style decimal text → number of the same unit; "" → null. */
export function parseDecimal(text: string): number | null {
  const t = text.trim().replace(",", ".");
  if (t === "") return null;
  return /^[+-]?(\d+\.?\d*|\.\d+)$/.test(t) ? Number(t) : NaN;
}

/** Map the API's 422 issues (paths in API names) onto form fields. */
export function issuesByField(
  issues: unknown[] | undefined,
  rename: Record<string, string> = {},
): Record<string, string> {
  const out: Record<string, string> = {};
  for (const i of issues ?? []) {
    const issue = i as { path?: (string | number)[]; message?: string };
    const key = String(issue.path?.[0] ?? "");
    if (!key || !issue.message) continue;
    const name = rename[key] ?? key;
    out[name] = out[name] ? `${out[name]} ${issue.message}` : issue.message;
  }
  return out;
}
