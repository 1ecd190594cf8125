"use client";
import { Controller } from "react-hook-form";
import { FormError } from "@/app/_components/form";
import { buttonClass, inputClass } from "@/app/_components/field-form/controls";
import { CrsPicker } from "@/app/_components/field-form/crs-picker";
import { guessColumns } from "./mapping-schema";
import { GEOGRAPHIC_DEFAULT, type Preview, type UploadField } from "./file-step-shared";
import { PresetBar } from "./preset-bar";
import { ColumnSelects } from "./column-selects";
import type { ColumnMappingState } from "./use-column-mapping";
import type { UploadState } from "./use-upload";

/** Step 3: which column is which, the file's coordinate system, an optional preset name, and the save button. */
export function MappingForm({
  mapping,
  upload,
  preview,
  field,
  locked,
}: {
  mapping: ColumnMappingState;
  upload: UploadState;
  preview: Preview;
  field: UploadField;
  locked: boolean;
}) {
  const { form, values, plan, coords, label, crsTouched, errors } = mapping;
  const { uploading, progress, result, formError } = upload;
  const onSubmit = form.handleSubmit((v) => upload.upload(v, false));
  return (
    <form onSubmit={onSubmit} noValidate aria-labelledby="step-columns">
      <fieldset
        disabled={locked}
        className="mb-6 rounded-plot border border-chalk-line bg-white p-5"
        data-testid="mapping-form"
      >
        <legend className="sr-only">Columns</legend>
        <h2 id="step-columns" className="mb-2 text-base font-semibold">
          3. Which column is which
        </h2>
        <p className="mb-4 text-sm text-ink-soft">
          Plotproof guessed these from the column names. Correct any that are wrong. Choose “not in this file” when the
          file does not hold that part: the column Plotproof guessed for it is then not read.
        </p>

        <PresetBar mapping={mapping} preview={preview} />
        <CoordinatesChoice mapping={mapping} preview={preview} field={field} />

        {preview.format === "geojson" ? (
          <p className="mb-4 text-sm" data-testid="geometry-note">
            <span className="font-medium">
              {label("x")} and {label("y")}:
            </span>{" "}
            from each feature&apos;s Point geometry
            {preview.positions[0] ? <span className="text-ink-soft"> (first: {preview.positions[0]})</span> : null}.
            {preview.featureIds && values.columns?.id === "" && !plan.guess.columns.id
              ? " The features' own ids are used as plant ids."
              : ""}
          </p>
        ) : null}

        <ColumnSelects mapping={mapping} preview={preview} />
        <PlanProblems problems={plan.problems} />

        <Controller
          control={form.control}
          name="crs"
          render={({ field: f }) => (
            <CrsPicker
              id="fileCrs"
              label="Coordinate system of the file"
              value={f.value}
              onChange={(v) => {
                crsTouched.current = true;
                f.onChange(v);
              }}
              onBlur={f.onBlur}
              error={errors.crs?.message}
              hint={
                coords === "projected"
                  ? `Easting/northing are read in this system; ${field.name} uses ${field.crs}.`
                  : "Latitude/longitude from GNSS receivers are usually WGS 84 (EPSG:4326) or ETRS89 (EPSG:4258)."
              }
            />
          )}
        />

        <PresetNameRow mapping={mapping} locked={locked} />
      </fieldset>

      <FormError message={formError} />
      {result.name === "saved" ? null : (
        <div className="mb-6 flex flex-wrap items-center gap-4">
          <button type="submit" className={buttonClass.primary} disabled={uploading}>
            {uploading ? "Saving…" : "Check and save the file"}
          </button>
          {uploading && progress?.stage === null ? (
            <button type="button" className={buttonClass.secondary} onClick={upload.cancel}>
              Cancel upload
            </button>
          ) : null}
          <span className="text-sm text-ink-soft">
            The server reads every row again; nothing is kept if it finds an error.
          </span>
        </div>
      )}
    </form>
  );
}

/** Degrees or metres; switching re-guesses the position columns and, unless chosen by hand, the CRS. */
function CoordinatesChoice({
  mapping,
  preview,
  field,
}: {
  mapping: ColumnMappingState;
  preview: Preview;
  field: UploadField;
}) {
  const { header, format } = preview;
  const { register, setValue } = mapping.form;
  return (
    <fieldset className="mb-4">
      <legend className="mb-1 text-sm font-medium">Positions are written as</legend>
      <div className="flex flex-wrap gap-5 text-sm">
        {(
          [
            ["geographic", "Latitude and longitude (degrees)"],
            ["projected", "Easting and northing (metres)"],
          ] as const
        ).map(([value, text]) => (
          <label key={value} className="flex items-center gap-2">
            <input
              type="radio"
              value={value}
              className="accent-leaf"
              {...register("coordinates", {
                onChange: () => {
                  const next = value;
                  if (format === "csv") {
                    const g = guessColumns(header, format, next);
                    setValue("columns.x", g.columns.x, { shouldValidate: true });
                    setValue("columns.y", g.columns.y, { shouldValidate: true });
                  }
                  if (!mapping.crsTouched.current)
                    setValue("crs", next === "projected" ? field.crs : GEOGRAPHIC_DEFAULT, {
                      shouldValidate: true,
                    });
                },
              })}
            />
            {text}
          </label>
        ))}
      </div>
    </fieldset>
  );
}

function PresetNameRow({ mapping, locked }: { mapping: ColumnMappingState; locked: boolean }) {
  const { register } = mapping.form;
  const { values, errors } = mapping;
  return (
    <>
      <div className="mb-2 flex flex-wrap items-center gap-3">
        <label className="flex items-center gap-2 text-sm">
          <input type="checkbox" className="accent-leaf" {...register("savePreset")} />
          Save this mapping as a preset named
        </label>
        <label htmlFor="presetName" className="sr-only">
          Name of the preset
        </label>
        <input
          id="presetName"
          type="text"
          autoComplete="off"
          placeholder="e.g. Planter export v2"
          disabled={!values.savePreset || locked}
          {...register("presetName")}
          aria-invalid={errors.presetName ? true : undefined}
          aria-describedby={errors.presetName ? "presetName-error" : undefined}
          className={`${inputClass(!!errors.presetName)} max-w-xs`}
        />
      </div>
      {errors.presetName?.message ? (
        <p id="presetName-error" className="mb-2 text-sm text-alarm" data-field-error="presetName">
          {errors.presetName.message}
        </p>
      ) : null}
    </>
  );
}

function PlanProblems({ problems }: { problems: { severity: "error" | "warning"; message: string; code: string }[] }) {
  if (problems.length === 0) return null;
  return (
    <ul
      className="mb-4 space-y-1 text-sm"
      data-testid="plan-problems"
      aria-label="What the server will say about these columns"
    >
      {problems.map((p, i) => (
        <li key={i} className={p.severity === "error" ? "text-alarm" : "text-loam"}>
          <span className="font-medium">{p.severity === "error" ? "Error: " : "Note: "}</span>
          {p.message}
        </li>
      ))}
    </ul>
  );
}
