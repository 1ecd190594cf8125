"use client";
import type { ControlMarkDto } from "@/lib/plan/dto";
import { inputClass } from "@/app/_components/field-form/controls";

/** A number typed with a decimal point or comma; null when blank. */
export const typedNumber = (s: string): number | null => (s.trim() === "" ? null : Number(s.replace(",", ".")));

/** A labelled text or number input, as the plan forms and the survey upload use it. */
export function TextInput({
  id,
  label,
  value,
  onChange,
  hint,
  type = "text",
  disabled,
}: {
  id: string;
  label: string;
  value: string;
  onChange: (v: string) => void;
  hint?: string;
  type?: string;
  disabled?: boolean;
}) {
  return (
    <div>
      <label htmlFor={id} className="mb-1 block text-sm font-medium">
        {label}
      </label>
      <input
        id={id}
        type={type}
        inputMode={type === "text" ? undefined : "decimal"}
        className={inputClass(false)}
        value={value}
        disabled={disabled}
        onChange={(e) => onChange(e.target.value)}
      />
      {hint ? <p className="mt-1 text-xs text-ink-faint">{hint}</p> : null}
    </div>
  );
}

/** What the survey upload forms hold about the fieldwork, as typed. */
export interface FieldworkValues {
  planId: string;
  controlMarkId: string;
  beforeE: string;
  beforeN: string;
  afterE: string;
  afterN: string;
  instrument: string;
  serial: string;
  calibrationDate: string;
  precisionMm: string;
  surveyor: string;
  method: string;
  /** One a line: point name, then "dead" or "not found". */
  missing: string;
}

export const emptyFieldwork = (planId = "", controlMarkId = ""): FieldworkValues => ({
  planId,
  controlMarkId,
  beforeE: "",
  beforeN: "",
  afterE: "",
  afterN: "",
  instrument: "",
  serial: "",
  calibrationDate: "",
  precisionMm: "",
  surveyor: "",
  method: "",
  missing: "",
});

/**
 * The `fieldwork` part of a survey upload (JSON, lib/validation/plan.ts FieldworkInput), or null when nothing was
 * filled in (the upload then records no fieldwork at all). The server validates it and answers with the messages.
 */
export function fieldworkJson(v: FieldworkValues): string | null {
  // Reported missing points belong to a plan; without one the list is not sent.
  const missing = (v.planId ? v.missing : "")
    .split(/\r?\n/)
    .map((l) => l.trim())
    .filter(Boolean)
    .map((l) => {
      const [name, ...rest] = l.split(/\s+/);
      return { name, status: rest.join(" ").toLowerCase() === "not found" ? "not found" : "dead" };
    });
  const pos = (a: string, b: string) =>
    typedNumber(a) === null && typedNumber(b) === null ? null : { e: typedNumber(a), n: typedNumber(b) };
  const fieldwork = {
    planId: v.planId || null,
    controlMarkId: v.controlMarkId || null,
    before: v.controlMarkId ? pos(v.beforeE, v.beforeN) : null,
    after: v.controlMarkId ? pos(v.afterE, v.afterN) : null,
    instrument: v.instrument.trim() || null,
    serial: v.serial.trim() || null,
    calibrationDate: v.calibrationDate || null,
    precisionMm: typedNumber(v.precisionMm),
    surveyor: v.surveyor.trim() || null,
    method: v.method.trim() || null,
    missing,
  };
  const empty = Object.entries(fieldwork).every(([k, x]) => (k === "missing" ? missing.length === 0 : x === null));
  return empty ? null : JSON.stringify(fieldwork);
}

/**
 * The control mark measured before and after the survey, the instrument and surveyor, and (with a plan) the planned
 * points not surveyed: one set of controls for the plan page's upload and the general survey upload.
 */
export function FieldworkFields({
  values: v,
  onChange,
  marks,
  showMissing,
  disabled,
}: {
  values: FieldworkValues;
  onChange: (next: FieldworkValues) => void;
  marks: ControlMarkDto[];
  showMissing: boolean;
  disabled?: boolean;
}) {
  const set = (k: keyof FieldworkValues) => (x: string) => onChange({ ...v, [k]: x });
  return (
    <>
      <fieldset className="grid gap-3 sm:grid-cols-2" disabled={disabled}>
        <legend className="mb-1 text-sm font-medium">Control mark measured before and after the survey</legend>
        <div className="sm:col-span-2">
          <label htmlFor="survey-mark" className="mb-1 block text-sm font-medium">
            Control mark
          </label>
          <select
            id="survey-mark"
            className={inputClass(false)}
            value={v.controlMarkId}
            onChange={(e) => set("controlMarkId")(e.target.value)}
          >
            <option value="">No mark measured</option>
            {marks.map((m) => (
              <option key={m.id} value={m.id}>
                {m.name} (E {m.e.toFixed(3)}, N {m.n.toFixed(3)})
              </option>
            ))}
          </select>
          {marks.length === 0 ? (
            <p className="mt-1 text-xs text-ink-faint">
              This field has no control marks yet: QA leads and owners add them under Survey plans.
            </p>
          ) : null}
        </div>
        <TextInput
          id="before-e"
          label="Before: measured easting (m)"
          value={v.beforeE}
          onChange={set("beforeE")}
          type="number"
        />
        <TextInput
          id="before-n"
          label="Before: measured northing (m)"
          value={v.beforeN}
          onChange={set("beforeN")}
          type="number"
        />
        <TextInput
          id="after-e"
          label="After: measured easting (m)"
          value={v.afterE}
          onChange={set("afterE")}
          type="number"
        />
        <TextInput
          id="after-n"
          label="After: measured northing (m)"
          value={v.afterN}
          onChange={set("afterN")}
          type="number"
        />
      </fieldset>
      <fieldset className="grid gap-3 sm:grid-cols-3" disabled={disabled}>
        <legend className="mb-1 text-sm font-medium">Instrument and surveyor</legend>
        <TextInput
          id="instrument"
          label="Instrument (make and model)"
          value={v.instrument}
          onChange={set("instrument")}
        />
        <TextInput id="serial" label="Serial number" value={v.serial} onChange={set("serial")} />
        <TextInput
          id="calibration"
          label="Calibration date"
          value={v.calibrationDate}
          onChange={set("calibrationDate")}
          type="date"
        />
        <TextInput
          id="precision"
          label="Stated horizontal precision (mm)"
          value={v.precisionMm}
          onChange={set("precisionMm")}
          type="number"
        />
        <TextInput id="surveyor" label="Surveyor" value={v.surveyor} onChange={set("surveyor")} />
        <TextInput id="method" label="Method" value={v.method} onChange={set("method")} />
      </fieldset>
      {showMissing ? (
        <div>
          <label htmlFor="missing" className="mb-1 block text-sm font-medium">
            Planned points not surveyed (one a line: point name, then &ldquo;dead&rdquo; or &ldquo;not found&rdquo;)
          </label>
          <textarea
            id="missing"
            rows={3}
            className={inputClass(false)}
            value={v.missing}
            disabled={disabled}
            onChange={(e) => set("missing")(e.target.value)}
          />
          <p className="mt-1 text-xs text-ink-faint">
            Or in the file: a status column with &ldquo;dead&rdquo; or &ldquo;not found&rdquo; and no position.
          </p>
        </div>
      ) : null}
    </>
  );
}
