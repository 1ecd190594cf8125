"use client";
import type { ControlMarkDto } from "@/lib/plan/dto";
import { inputClass } from "@/app/_components/field-form/controls";
import { FieldworkFields, type FieldworkValues } from "@/app/_components/fieldwork/fieldwork-fields";

export interface SurveyFieldworkChoices {
  plans: { id: string; name: string; checkpoints: number }[];
  marks: ControlMarkDto[];
}

/**
 * The survey upload's optional fieldwork record: the plan the survey was made from, the control mark measured before
 * and after, the instrument, surveyor and method (the same controls and checks as the plan page's upload).
 */
export function FieldworkSection({
  choices,
  values,
  onChange,
  disabled,
}: {
  choices: SurveyFieldworkChoices;
  values: FieldworkValues;
  onChange: (next: FieldworkValues) => void;
  disabled?: boolean;
}) {
  return (
    <details className="mt-4 rounded-plot border border-chalk-line p-3" data-testid="upload-fieldwork">
      <summary className="cursor-pointer text-sm font-medium">
        Survey plan, control mark and instrument (optional)
      </summary>
      <div className="mt-3 grid gap-3">
        <div>
          <label htmlFor="upload-plan" className="mb-1 block text-sm font-medium">
            Survey plan this survey was made from
          </label>
          <select
            id="upload-plan"
            className={inputClass(false)}
            value={values.planId}
            disabled={disabled}
            onChange={(e) => onChange({ ...values, planId: e.target.value })}
          >
            <option value="">Not made from a plan</option>
            {choices.plans.map((p) => (
              <option key={p.id} value={p.id}>
                {p.name} ({p.checkpoints} checkpoints)
              </option>
            ))}
          </select>
          <p className="mt-1 text-xs text-ink-faint">
            With a plan the upload counts which planned points were surveyed, recorded dead or not found, or are absent;
            the audit then tells plants nobody was asked to survey from sampled plants not found.
          </p>
        </div>
        <FieldworkFields
          values={values}
          onChange={onChange}
          marks={choices.marks}
          showMissing={values.planId !== ""}
          disabled={disabled}
        />
      </div>
    </details>
  );
}
