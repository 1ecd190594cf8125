"use client";
import { useEffect, useState } from "react";
import Link from "next/link";
import { useRouter } from "next/navigation";
import { Controller, useForm } from "react-hook-form";
import { zodResolver } from "@hookform/resolvers/zod";
import useSWR, { useSWRConfig } from "swr";
import { ApiError, fetcher, sendJson } from "@/lib/fetcher";
import { keys } from "@/lib/swr-keys";
import type { FieldDerivedDto, FieldDto } from "@/lib/api-types";
import { FormError } from "@/app/_components/form";
import { FieldRow, buttonClass, describedBy, inputClass } from "./controls";
import { CrsPicker } from "./crs-picker";
import { BoundaryPreview } from "./boundary-preview";
import {
  FieldFormSchema,
  isFieldFormKey,
  numberToText,
  readBoundaryText,
  type BoundaryPolygon,
  type FieldFormOutput,
  type FieldFormValues,
} from "./schema";

type BoundarySource = "none" | "current" | "records" | "file";

export type FieldFormProps = { mode: "create"; farms: string[] } | { mode: "edit"; field: FieldDto; farms: string[] };

function Section({ title, children, intro }: { title: string; children: React.ReactNode; intro?: React.ReactNode }) {
  return (
    <fieldset className="mb-6 rounded-plot border border-chalk-line bg-white p-5">
      <legend className="px-1 text-base font-semibold">{title}</legend>
      {intro ? <p className="mb-4 text-sm text-ink-soft">{intro}</p> : null}
      {children}
    </fieldset>
  );
}

/** Create or edit a field: name, farm, CRS, time zone, row bearing, bed geometry and boundary. */
export function FieldForm(props: FieldFormProps) {
  const router = useRouter();
  const { mutate } = useSWRConfig();
  const editing = props.mode === "edit" ? props.field : null;
  const [formError, setFormError] = useState<string | null>(null);
  const [zones, setZones] = useState<string[]>([]);
  const [boundarySource, setBoundarySource] = useState<BoundarySource>(editing?.boundary ? "current" : "none");
  const [boundaryFile, setBoundaryFile] = useState<{ name: string; polygon: BoundaryPolygon } | null>(null);
  const [boundaryFileError, setBoundaryFileError] = useState<string | null>(null);

  const derived = useSWR<FieldDerivedDto>(editing ? keys.fieldDerived(editing.id) : null, fetcher);

  const form = useForm<FieldFormValues, unknown, FieldFormOutput>({
    resolver: zodResolver(FieldFormSchema),
    mode: "onTouched",
    defaultValues: {
      name: editing?.name ?? "",
      farm: editing?.farm ?? (props.farms.length === 1 ? props.farms[0] : ""),
      crs: editing?.crs ?? "",
      timeZone: editing?.timeZone ?? "",
      rowBearingDeg: numberToText(editing?.rowBearingDeg),
      bedSpacingM: numberToText(editing?.bedSpacingM),
      rowsPerBed: numberToText(editing?.rowsPerBed),
      rowSpacingM: numberToText(editing?.rowSpacingM),
      boundary: (editing?.boundary ?? null) as BoundaryPolygon | null,
    },
  });
  const {
    register,
    handleSubmit,
    setValue,
    setError,
    clearErrors,
    formState: { errors, isSubmitting },
  } = form;

  // The browser's time zone is only known in the browser: fill it in after the first render.
  useEffect(() => {
    setZones(typeof Intl.supportedValuesOf === "function" ? Intl.supportedValuesOf("timeZone") : []);
    if (!form.getValues("timeZone")) setValue("timeZone", Intl.DateTimeFormat().resolvedOptions().timeZone);
  }, [form, setValue]);

  const chooseBoundary = (source: BoundarySource) => {
    setBoundarySource(source);
    clearErrors("boundary");
    const polygon =
      source === "current"
        ? (editing?.boundary ?? null)
        : source === "records"
          ? (derived.data?.boundary ?? null)
          : source === "file"
            ? (boundaryFile?.polygon ?? null)
            : null;
    setValue("boundary", polygon as BoundaryPolygon | null, { shouldDirty: true });
  };

  const readBoundaryFile = async (file: File | undefined) => {
    setBoundaryFileError(null);
    setBoundaryFile(null);
    setValue("boundary", null);
    if (!file) return;
    if (file.size > 5 * 1024 * 1024) {
      setBoundaryFileError(
        `“${file.name}” is ${(file.size / 1024 / 1024).toFixed(1)} MB; a boundary file should be a single polygon of a few kilobytes.`,
      );
      return;
    }
    const result = readBoundaryText(await file.text());
    if (!result.ok) {
      setBoundaryFileError(`“${file.name}”: ${result.message}`);
      return;
    }
    setBoundaryFile({ name: file.name, polygon: result.polygon });
    setValue("boundary", result.polygon, { shouldDirty: true });
    clearErrors("boundary");
  };

  const onSubmit = handleSubmit(async (values) => {
    setFormError(null);
    if (boundarySource === "file" && !values.boundary) {
      setError(
        "boundary",
        {
          message:
            boundaryFileError ?? "Choose a GeoJSON file with the field's boundary, or pick another boundary option.",
        },
        { shouldFocus: true },
      );
      return;
    }
    try {
      const { field } = editing
        ? await sendJson<{ field: FieldDto }>(keys.field(editing.id), "PATCH", values)
        : await sendJson<{ field: FieldDto }>(keys.fields(), "POST", values);
      await Promise.all([mutate(keys.fields()), mutate(keys.field(field.id))]);
      router.push(`/fields/${field.id}`);
      router.refresh();
    } catch (err) {
      if (!(err instanceof ApiError)) {
        setFormError("The server could not be reached. Check the connection and try again; nothing was saved.");
        return;
      }
      if (err.status === 409) {
        setError("name", { message: `${err.message} Choose another name.` }, { shouldFocus: true });
        return;
      }
      const placed = placeIssues(err.issues, setError);
      if (!placed) setFormError(err.message);
      else setFormError("Some values were not accepted; see the messages next to them.");
    }
  });

  const bearingHint =
    derived.data?.rowBearingDeg != null
      ? `The latest as-planted records run at ${derived.data.rowBearingDeg.toFixed(1)}°. Leave empty to derive the bearing when an audit runs.`
      : "Degrees clockwise from grid north, 0–180. Leave empty to derive it from the as-planted records when an audit runs.";

  return (
    <form
      onSubmit={onSubmit}
      noValidate
      aria-label={editing ? `Edit ${editing.name}` : "New field"}
      className="max-w-3xl"
    >
      <FormError message={formError} />

      <Section title="Field">
        <div className="grid gap-x-6 md:grid-cols-2">
          <FieldRow id="name" label="Field name" error={errors.name?.message}>
            <input
              id="name"
              type="text"
              autoComplete="off"
              {...register("name")}
              aria-invalid={errors.name ? true : undefined}
              aria-describedby={describedBy("name", { error: errors.name?.message })}
              className={inputClass(!!errors.name)}
            />
          </FieldRow>
          <FieldRow
            id="farm"
            label="Farm or site"
            error={errors.farm?.message}
            hint={props.farms.length ? `Your fields are on: ${props.farms.join(", ")}` : undefined}
          >
            <input
              id="farm"
              type="text"
              list="farm-list"
              autoComplete="off"
              {...register("farm")}
              aria-invalid={errors.farm ? true : undefined}
              aria-describedby={describedBy("farm", {
                error: errors.farm?.message,
                hint: props.farms.length ? 1 : undefined,
              })}
              className={inputClass(!!errors.farm)}
            />
            <datalist id="farm-list">
              {props.farms.map((f) => (
                <option key={f} value={f} />
              ))}
            </datalist>
          </FieldRow>
        </div>
      </Section>

      <Section
        title="Coordinates and time"
        intro="The coordinate system audits are computed in (metres, e.g. the local UTM zone) and the time zone planting times are read in when a file gives no UTC offset."
      >
        <Controller
          control={form.control}
          name="crs"
          render={({ field }) => (
            <CrsPicker
              id="crs"
              label="Coordinate system (CRS)"
              value={field.value}
              onChange={field.onChange}
              onBlur={field.onBlur}
              error={errors.crs?.message}
              hint={
                derived.data?.suggestedCrs && derived.data.suggestedCrs !== field.value ? (
                  <>
                    The as-planted records lie in {derived.data.suggestedCrs}.{" "}
                    <button
                      type="button"
                      className={buttonClass.quiet}
                      onClick={() =>
                        setValue("crs", derived.data!.suggestedCrs!, { shouldValidate: true, shouldDirty: true })
                      }
                    >
                      Use {derived.data.suggestedCrs}
                    </button>
                  </>
                ) : (
                  "A projected system in metres, such as EPSG:25831 (ETRS89 / UTM zone 31N)."
                )
              }
            />
          )}
        />
        <FieldRow
          id="timeZone"
          label="Time zone"
          error={errors.timeZone?.message}
          hint="IANA name such as Europe/Amsterdam; filled in from this browser."
        >
          <input
            id="timeZone"
            type="text"
            list="zone-list"
            autoComplete="off"
            spellCheck={false}
            {...register("timeZone")}
            aria-invalid={errors.timeZone ? true : undefined}
            aria-describedby={describedBy("timeZone", { error: errors.timeZone?.message, hint: 1 })}
            className={inputClass(!!errors.timeZone)}
          />
          <datalist id="zone-list">
            {zones.map((z) => (
              <option key={z} value={z} />
            ))}
          </datalist>
        </FieldRow>
      </Section>

      <Section
        title="Rows and beds"
        intro="Used to split errors into along-row and cross-row parts and to check the geometry of the records. All optional."
      >
        <FieldRow
          id="rowBearingDeg"
          label="Row bearing (° from grid north)"
          error={errors.rowBearingDeg?.message}
          hint={bearingHint}
        >
          <div className="flex flex-wrap items-center gap-3">
            <input
              id="rowBearingDeg"
              type="text"
              inputMode="decimal"
              autoComplete="off"
              {...register("rowBearingDeg")}
              aria-invalid={errors.rowBearingDeg ? true : undefined}
              aria-describedby={describedBy("rowBearingDeg", { error: errors.rowBearingDeg?.message, hint: 1 })}
              className={`${inputClass(!!errors.rowBearingDeg)} max-w-40`}
            />
            {editing ? (
              <button
                type="button"
                className={buttonClass.secondary}
                disabled={derived.data?.rowBearingDeg == null}
                title={
                  derived.error
                    ? "The records could not be read for suggestions just now"
                    : derived.data?.rowBearingDeg == null
                      ? "Upload as-planted records first"
                      : undefined
                }
                onClick={() =>
                  setValue("rowBearingDeg", derived.data!.rowBearingDeg!.toFixed(1), {
                    shouldValidate: true,
                    shouldDirty: true,
                  })
                }
              >
                Take from the as-planted records
              </button>
            ) : null}
          </div>
        </FieldRow>
        <div className="grid gap-x-6 md:grid-cols-3">
          {(
            [
              ["bedSpacingM", "Bed spacing (m)", "Centre of one bed to the next, e.g. 3.0"],
              ["rowsPerBed", "Rows per bed", "e.g. 5"],
              ["rowSpacingM", "Row spacing (m)", "Between rows of one bed, e.g. 0.5"],
            ] as const
          ).map(([name, label, hint]) => (
            <FieldRow key={name} id={name} label={label} error={errors[name]?.message} hint={hint}>
              <input
                id={name}
                type="text"
                inputMode={name === "rowsPerBed" ? "numeric" : "decimal"}
                autoComplete="off"
                {...register(name)}
                aria-invalid={errors[name] ? true : undefined}
                aria-describedby={describedBy(name, { error: errors[name]?.message, hint })}
                className={inputClass(!!errors[name])}
              />
            </FieldRow>
          ))}
        </div>
      </Section>

      <Section title="Boundary" intro="Optional. Used to spot records and checkpoints that fall outside the field.">
        <fieldset aria-describedby={errors.boundary ? "boundary-error" : undefined}>
          <legend className="sr-only">Where the boundary comes from</legend>
          <div className="space-y-2 text-sm">
            <BoundaryChoice value="none" current={boundarySource} onChoose={chooseBoundary} label="No boundary" />
            {editing?.boundary ? (
              <BoundaryChoice
                value="current"
                current={boundarySource}
                onChoose={chooseBoundary}
                label="Keep the current boundary"
              />
            ) : null}
            <BoundaryChoice
              value="records"
              current={boundarySource}
              onChoose={chooseBoundary}
              disabled={!derived.data?.boundary}
              label="Outline of the as-planted records"
              note={
                !editing
                  ? "available once as-planted records are uploaded"
                  : derived.isLoading
                    ? "looking at the records…"
                    : derived.error
                      ? "the records could not be read for suggestions just now"
                      : !derived.data?.boundary
                        ? "no as-planted records yet"
                        : undefined
              }
            />
            <BoundaryChoice
              value="file"
              current={boundarySource}
              onChoose={chooseBoundary}
              label="From a GeoJSON file (WGS 84 longitude/latitude)"
            />
          </div>
        </fieldset>
        {boundarySource === "file" ? (
          <FieldRow
            id="boundaryFile"
            label="Boundary file (.geojson or .json)"
            className="mt-4"
            error={boundaryFileError ?? undefined}
            hint="A Polygon, or a Feature or FeatureCollection holding exactly one polygon."
          >
            <input
              id="boundaryFile"
              type="file"
              accept=".geojson,.json,application/geo+json,application/json"
              onChange={(e) => void readBoundaryFile(e.target.files?.[0])}
              aria-invalid={boundaryFileError ? true : undefined}
              aria-describedby={describedBy("boundaryFile", { error: boundaryFileError ?? undefined, hint: 1 })}
              className="block text-sm file:mr-3 file:rounded-plot file:border file:border-chalk-line file:bg-white file:px-3 file:py-1.5 file:font-medium"
            />
          </FieldRow>
        ) : null}
        {errors.boundary?.message ? (
          <p id="boundary-error" className="mt-2 text-sm text-alarm" data-field-error="boundary">
            {errors.boundary.message}
          </p>
        ) : null}
        <BoundaryShown source={boundarySource} editing={editing} derived={derived.data} file={boundaryFile} />
      </Section>

      <div className="flex items-center gap-4">
        <button type="submit" disabled={isSubmitting} className={buttonClass.primary}>
          {isSubmitting ? "Saving…" : editing ? "Save changes" : "Create field"}
        </button>
        <Link href={editing ? `/fields/${editing.id}` : "/fields"} className={buttonClass.quiet}>
          Cancel
        </Link>
      </div>
    </form>
  );
}

function BoundaryChoice({
  value,
  current,
  onChoose,
  label,
  disabled,
  note,
}: {
  value: BoundarySource;
  current: BoundarySource;
  onChoose: (v: BoundarySource) => void;
  label: string;
  disabled?: boolean;
  note?: string;
}) {
  return (
    <label className={`flex items-center gap-2 ${disabled ? "text-ink-faint" : ""}`}>
      <input
        type="radio"
        name="boundarySource"
        value={value}
        checked={current === value}
        disabled={disabled}
        onChange={() => onChoose(value)}
        className="accent-leaf"
      />
      {label}
      {note ? <span className="text-xs text-ink-faint">({note})</span> : null}
    </label>
  );
}

function BoundaryShown({
  source,
  editing,
  derived,
  file,
}: {
  source: BoundarySource;
  editing: FieldDto | null;
  derived?: FieldDerivedDto;
  file: { name: string; polygon: BoundaryPolygon } | null;
}) {
  const shown =
    source === "current" && editing?.boundary
      ? { polygon: editing.boundary as BoundaryPolygon, label: "Current boundary" }
      : source === "records" && derived?.boundary
        ? { polygon: derived.boundary as BoundaryPolygon, label: "Outline of the latest as-planted records" }
        : source === "file" && file
          ? { polygon: file.polygon, label: `From ${file.name}` }
          : null;
  if (!shown) return null;
  return (
    <div className="mt-4">
      <BoundaryPreview polygon={shown.polygon} source={shown.label} />
    </div>
  );
}

/** Puts the API's 422 issues (`{ path, message }`) next to their inputs; true when at least one was placed. */
function placeIssues(
  issues: unknown[] | undefined,
  setError: (name: keyof FieldFormValues, error: { message: string }, options?: { shouldFocus: boolean }) => void,
): boolean {
  let placed = false;
  for (const issue of issues ?? []) {
    const i = issue as { path?: unknown[]; message?: unknown };
    const key = Array.isArray(i.path) ? i.path[0] : undefined;
    if (isFieldFormKey(key) && typeof i.message === "string") {
      setError(key, { message: i.message }, { shouldFocus: !placed });
      placed = true;
    }
  }
  return placed;
}
