"use client";
import { useEffect, useMemo, useRef, useState } from "react";
import Link from "next/link";
import { useRouter } from "next/navigation";
import { Controller, useForm, useWatch } from "react-hook-form";
import { zodResolver } from "@hookform/resolvers/zod";
import useSWR, { useSWRConfig } from "swr";
import type { ColumnRole, CoordinateKind } from "@/geo";
import { fetcher } from "@/lib/fetcher";
import { keys } from "@/lib/swr-keys";
import type { InputIssue, PresetDto, UploadOkDto } from "@/lib/api-types";
import { FormError } from "@/app/_components/form";
import { FieldRow, Notice, buttonClass, describedBy, inputClass } from "@/app/_components/field-form/controls";
import { CrsPicker } from "@/app/_components/field-form/crs-picker";
import type { CsvPreview, GeoJsonPreview } from "./preview-types";
import {
  ROLE_ORDER,
  bestPreset,
  guessColumns,
  mappingSchema,
  notInFileValue,
  planFor,
  presetColumns,
  presetFits,
  roleLabel,
  toColumnMapping,
  type FileKind,
  type MappingValues,
} from "./mapping-schema";
import { sendUpload, asIssues, type ServerStage, type UploadOutcome } from "./send-upload";
import { ProgressBar } from "./progress";
import { IssueTable } from "./issue-table";
import { downloadText, issuesCsv, safeFileName } from "./errors-csv";

export interface UploadField {
  id: string;
  name: string;
  crs: string;
}

type Preview = CsvPreview | GeoJsonPreview;

type Result =
  | { name: "none" }
  | { name: "saved"; body: UploadOkDto }
  | { name: "invalid"; message: string; issues: InputIssue[] }
  | { name: "warnings"; message: string; issues: InputIssue[] }
  | { name: "failed"; message: string };

interface Progress {
  transfer: number | null;
  stage: ServerStage | null;
  stageFraction: number;
  done: ServerStage[];
  /** The server refused the file at `stage`; nothing was saved. */
  stopped?: boolean;
}

const STAGES: { stage: ServerStage; label: string }[] = [
  { stage: "reading", label: "Reading the rows" },
  { stage: "checking", label: "Checking positions and values" },
  { stage: "saving", label: "Saving the file and its points" },
];

const DELIMITER_NAME: Record<CsvPreview["delimiter"], string> = {
  ",": "comma",
  ";": "semicolon",
  "\t": "tab",
  "|": "pipe",
};
const KIND_NOUN: Record<FileKind, string> = { planted: "as-planted records", survey: "survey checkpoints" };
const GEOGRAPHIC_DEFAULT = "EPSG:4326";

function formatBytes(n: number): string {
  if (n < 1024) return `${n} bytes`;
  if (n < 1024 * 1024) return `${(n / 1024).toFixed(1)} kB`;
  return `${(n / 1024 / 1024).toFixed(1)} MB`;
}

/** UTM zone number of a WGS 84 or ETRS89 UTM code, for comparing a suggestion with the field's CRS. */
function utmZone(code: string): string | null {
  const m = /^EPSG:(?:326|327|258)(\d\d)$/.exec(code);
  return m ? m[1] : null;
}

/**
 * One chosen file after its preview: the first rows, the column mapping (with presets), the upload with
 * its progress, and what the server answered.
 */
export function FileStep({
  file,
  preview,
  field,
  kind,
  onBusy,
  onReset,
}: {
  file: File;
  preview: Preview;
  field: UploadField;
  kind: FileKind;
  onBusy: (busy: boolean) => void;
  onReset: () => void;
}) {
  const router = useRouter();
  const { mutate } = useSWRConfig();
  const { header, format } = preview;
  const presets = useSWR<{ presets: PresetDto[] }>(keys.presets(kind), fetcher);

  const initial = useMemo<MappingValues>(() => {
    const guess = guessColumns(header, format, format === "geojson" ? preview.coordinateKind : undefined);
    const coordinates: CoordinateKind =
      guess.coordinates ?? (format === "geojson" ? preview.coordinateKind : "geographic");
    const crs =
      (format === "geojson" ? preview.crsHint : null) ?? (coordinates === "projected" ? field.crs : GEOGRAPHIC_DEFAULT);
    return { columns: guess.columns, coordinates, crs, savePreset: false, presetName: "" };
  }, [header, format, preview, field.crs]);

  const schema = useMemo(() => mappingSchema(header, format, kind), [header, format, kind]);
  const form = useForm<MappingValues>({ resolver: zodResolver(schema), defaultValues: initial, mode: "onChange" });
  const {
    register,
    control,
    handleSubmit,
    setValue,
    reset,
    setError,
    formState: { errors },
  } = form;
  const values = useWatch({ control }) as MappingValues;

  const [appliedPreset, setAppliedPreset] = useState<{ preset: PresetDto; auto: boolean } | null>(null);
  const [chosenPresetId, setChosenPresetId] = useState("");
  const presetDecided = useRef(false);
  const crsTouched = useRef(false);

  const applyPreset = (preset: PresetDto, auto: boolean) => {
    const coordinates = preset.mapping.coordinates ?? form.getValues("coordinates");
    reset({
      columns: presetColumns(preset, header, format),
      coordinates,
      crs:
        preset.crs ??
        (coordinates === "projected"
          ? field.crs
          : format === "geojson" && preview.crsHint
            ? preview.crsHint
            : GEOGRAPHIC_DEFAULT),
      savePreset: false,
      presetName: "",
    });
    crsTouched.current = !!preset.crs;
    setAppliedPreset({ preset, auto });
    void form.trigger();
  };

  // A saved preset whose columns are all in this file is applied at once (and the page says so).
  // biome-ignore lint/correctness/useExhaustiveDependencies: decided once, when the presets arrive; later edits to the form must not re-apply one.
  useEffect(() => {
    if (presetDecided.current || !presets.data) return;
    presetDecided.current = true;
    const best = bestPreset(presets.data.presets, header, format);
    if (best) applyPreset(best, true);
  }, [presets.data]);

  const plan = useMemo(() => planFor(header, format, toColumnMapping(values, format)), [header, format, values]);
  const notInFile = useMemo(() => notInFileValue(header), [header]);

  const [result, setResult] = useState<Result>({ name: "none" });
  const [progress, setProgress] = useState<Progress | null>(null);
  const [uploading, setUploading] = useState(false);
  const [acceptChecked, setAcceptChecked] = useState(false);
  const [formError, setFormError] = useState<string | null>(null);
  const abortRef = useRef<(() => void) | null>(null);
  const resultRef = useRef<HTMLDivElement>(null);

  useEffect(() => {
    onBusy(uploading);
  }, [uploading, onBusy]);
  useEffect(() => {
    if (!uploading) return;
    const warn = (e: BeforeUnloadEvent) => {
      e.preventDefault();
    };
    window.addEventListener("beforeunload", warn);
    return () => window.removeEventListener("beforeunload", warn);
  }, [uploading]);
  useEffect(() => {
    if (result.name !== "none") resultRef.current?.focus();
  }, [result]);

  const upload = async (v: MappingValues, acceptWarnings: boolean) => {
    setFormError(null);
    setResult({ name: "none" });
    setAcceptChecked(false);
    setUploading(true);
    setProgress({ transfer: 0, stage: null, stageFraction: 0, done: [] });
    const body = new FormData();
    body.set("file", file, file.name);
    body.set("kind", kind);
    body.set("crs", v.crs.trim());
    body.set("mapping", JSON.stringify(toColumnMapping(v, format)));
    body.set("acceptWarnings", acceptWarnings ? "true" : "false");
    if (v.savePreset && v.presetName.trim()) body.set("presetName", v.presetName.trim());
    const { done, abort } = sendUpload(keys.fieldDatasets(field.id), body, {
      onTransfer: (transfer) => setProgress((p) => (p ? { ...p, transfer } : p)),
      onStage: (stage, fraction) =>
        setProgress((p) => {
          if (!p) return p;
          const order = STAGES.map((s) => s.stage);
          const finished = order.slice(0, order.indexOf(stage));
          return {
            ...p,
            transfer: 1,
            stage,
            stageFraction: fraction,
            done: fraction >= 1 ? [...finished, stage] : finished,
          };
        }),
    });
    abortRef.current = abort;
    const outcome = await done;
    abortRef.current = null;
    setUploading(false);
    await handleOutcome(outcome, v);
  };

  const handleOutcome = async (outcome: UploadOutcome, v: MappingValues) => {
    if (outcome.kind === "saved") {
      setProgress({ transfer: 1, stage: "saving", stageFraction: 1, done: ["reading", "checking", "saving"] });
      setResult({ name: "saved", body: outcome.body });
      await Promise.all([
        mutate(keys.field(field.id)),
        mutate(keys.fieldDatasets(field.id)),
        mutate(keys.fields()),
        mutate(keys.fieldDerived(field.id)),
        v.savePreset ? mutate(keys.presets(kind)) : Promise.resolve(),
      ]);
      router.refresh();
      return;
    }
    if (outcome.kind === "aborted") {
      setProgress(null);
      setFormError("The upload was cancelled before the file reached the server. Nothing was saved.");
      return;
    }
    if (outcome.kind === "network") {
      setProgress((p) => (p ? { ...p, stopped: true } : p));
      setResult({ name: "failed", message: outcome.message });
      return;
    }
    setProgress((p) => (p ? { ...p, stopped: true } : p));
    const issues = asIssues(outcome.issues);
    if (outcome.code === "invalid_file") return setResult({ name: "invalid", message: outcome.message, issues });
    if (outcome.code === "warnings_unaccepted")
      return setResult({ name: "warnings", message: outcome.message, issues });
    if (outcome.code === "invalid_input") {
      // Problems with the form fields sent along (crs, mapping, kind) go next to their controls.
      let placed = false;
      for (const raw of outcome.issues) {
        const i = raw as { path?: unknown[]; message?: string };
        const key = Array.isArray(i.path) ? i.path[0] : null;
        if (key === "crs" && i.message) {
          setError("crs", { message: i.message }, { shouldFocus: true });
          placed = true;
        }
        if (key === "presetName" && i.message) {
          setError("presetName", { message: i.message }, { shouldFocus: true });
          placed = true;
        }
      }
      setProgress(null);
      setFormError(
        placed
          ? "The server did not accept some settings; see the messages next to them. Nothing was saved."
          : `${outcome.message} Nothing was saved.`,
      );
      return;
    }
    const words: Record<number, string> = {
      401: "Your session has ended. Sign in again in another tab, then save again.",
      403: "Your role cannot upload files to this field.",
      404: "This field no longer exists, or is not part of your organisation.",
      413: outcome.message,
    };
    setResult({ name: "failed", message: words[outcome.status] ?? outcome.message });
  };

  const onSubmit = handleSubmit((v) => upload(v, false));
  const coords = values.coordinates ?? initial.coordinates;
  const label = (r: ColumnRole) => roleLabel(r, coords, kind);
  const roles = ROLE_ORDER[kind].filter((r) => !(format === "geojson" && (r === "x" || r === "y")));
  const samples = useMemo(() => {
    const out = new Map<string, string>();
    header.forEach((h, i) => {
      const v = preview.rows.map((r) => r.cells[i]).find((c) => c !== undefined && c.trim() !== "");
      if (v !== undefined) out.set(h, v);
    });
    return out;
  }, [header, preview.rows]);
  // What the server will read, guesses included, so the preview never calls a guessed column "not read".
  const roleOf = useMemo(() => {
    const m = new Map<string, ColumnRole>();
    for (const r of roles) {
      const name = plan.guess.columns[r];
      if (name && header.includes(name)) m.set(name, r);
    }
    return m;
  }, [roles, plan, header]);
  const guessed = useMemo(() => guessColumns(header, format, coords).columns, [header, format, coords]);
  const locked = uploading || result.name === "saved";
  const allPresets = presets.data?.presets ?? [];

  return (
    <>
      <section
        aria-labelledby="step-preview"
        className="mb-6 rounded-plot border border-chalk-line bg-white p-5"
        data-testid="upload-preview"
      >
        <h2 id="step-preview" className="mb-2 text-base font-semibold">
          2. The first rows, as read in this browser
        </h2>
        <PreviewFacts preview={preview} file={file} />
        <PreviewTable preview={preview} roleOf={roleOf} label={label} />
      </section>

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
            Plotproof guessed these from the column names. Correct any that are wrong. Choose “not in this file” when
            the file does not hold that part: the column Plotproof guessed for it is then not read.
          </p>

          {allPresets.length > 0 ? (
            <div className="mb-4 flex flex-wrap items-end gap-3">
              <div>
                <label htmlFor="preset" className="mb-1 block text-sm font-medium">
                  Use a saved mapping
                </label>
                <select
                  id="preset"
                  value={chosenPresetId}
                  onChange={(e) => setChosenPresetId(e.target.value)}
                  className={`${inputClass(false)} max-w-sm`}
                >
                  <option value="">Choose a preset…</option>
                  {allPresets.map((p) => (
                    <option key={p.id} value={p.id}>
                      {p.name}
                      {presetFits(p, header, format) ? "" : " (names columns this file lacks)"}
                    </option>
                  ))}
                </select>
              </div>
              <button
                type="button"
                className={buttonClass.secondary}
                disabled={!chosenPresetId}
                onClick={() => {
                  const p = allPresets.find((x) => x.id === chosenPresetId);
                  if (p) applyPreset(p, false);
                }}
              >
                Use preset
              </button>
            </div>
          ) : null}
          {appliedPreset ? (
            <div className="mb-4" data-testid="preset-applied">
              <Notice tone="ok">
                {appliedPreset.auto ? (
                  <>
                    The saved mapping <strong>“{appliedPreset.preset.name}”</strong> was applied, because every column
                    it names is in this file.
                  </>
                ) : (
                  <>
                    The saved mapping <strong>“{appliedPreset.preset.name}”</strong> is applied.
                  </>
                )}{" "}
                <button
                  type="button"
                  className={buttonClass.quiet}
                  onClick={() => {
                    reset(initial);
                    crsTouched.current = false;
                    setAppliedPreset(null);
                  }}
                >
                  Use Plotproof&apos;s guess instead
                </button>
              </Notice>
            </div>
          ) : null}

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
                        if (!crsTouched.current)
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

          {format === "geojson" ? (
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

          <div className="grid gap-x-6 md:grid-cols-3">
            {roles.map((role) => {
              const id = `map-${role}`;
              const err = errors.columns?.[role]?.message;
              const chosen = values.columns?.[role];
              const position = role === "x" || role === "y";
              const read = plan.guess.columns[role];
              const hint =
                chosen === null
                  ? guessed[role]
                    ? `“${guessed[role]}” is not read.`
                    : undefined
                  : chosen === ""
                    ? read
                      ? `Plotproof's guess: “${read}”.`
                      : undefined
                    : chosen && samples.has(chosen)
                      ? `e.g. ${samples.get(chosen)}`
                      : undefined;
              return (
                <FieldRow key={role} id={id} label={label(role)} error={err} hint={hint}>
                  <Controller
                    control={control}
                    name={`columns.${role}`}
                    rules={{ deps: roles.filter((o) => o !== role).map((o) => `columns.${o}` as const) }}
                    render={({ field: f }) => (
                      <select
                        id={id}
                        ref={f.ref}
                        name={f.name}
                        onBlur={f.onBlur}
                        value={f.value === null ? notInFile : f.value}
                        onChange={(e) => f.onChange(e.target.value === notInFile ? null : e.target.value)}
                        aria-invalid={err ? true : undefined}
                        aria-describedby={describedBy(id, { error: err, hint })}
                        className={inputClass(!!err)}
                      >
                        {/* Positions are required, so x/y offer neither the guess nor "not in this file". */}
                        <option value="">{position ? "— choose a column —" : "— Plotproof's guess —"}</option>
                        {position ? null : <option value={notInFile}>— not in this file —</option>}
                        {header.map((h, i) => (
                          <option key={`${i}-${h}`} value={h}>
                            {h}
                          </option>
                        ))}
                        {chosen && !header.includes(chosen) ? (
                          <option value={chosen}>{chosen} (not in this file)</option>
                        ) : null}
                      </select>
                    )}
                  />
                </FieldRow>
              );
            })}
          </div>

          <PlanProblems problems={plan.problems} />

          <Controller
            control={control}
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
        </fieldset>

        <FormError message={formError} />
        {result.name === "saved" ? null : (
          <div className="mb-6 flex flex-wrap items-center gap-4">
            <button type="submit" className={buttonClass.primary} disabled={uploading}>
              {uploading ? "Saving…" : "Check and save the file"}
            </button>
            {uploading && progress?.stage === null ? (
              <button type="button" className={buttonClass.secondary} onClick={() => abortRef.current?.()}>
                Cancel upload
              </button>
            ) : null}
            <span className="text-sm text-ink-soft">
              The server reads every row again; nothing is kept if it finds an error.
            </span>
          </div>
        )}
      </form>

      {progress ? (
        <section aria-labelledby="step-save" className="mb-6 rounded-plot border border-chalk-line bg-white p-5">
          <h2 id="step-save" className="mb-3 text-base font-semibold">
            4. Saving
          </h2>
          <ProgressBar
            id="upload-transfer"
            label="Sending the file"
            value={progress.transfer}
            detail={
              progress.transfer === null
                ? undefined
                : `${formatBytes(Math.round((progress.transfer ?? 0) * file.size))} of ${formatBytes(file.size)}`
            }
          />
          <ProgressBar
            id="upload-server"
            label={`On the server: ${progress.stopped ? "stopped while " : ""}${STAGES.find((s) => s.stage === progress.stage)?.label.toLowerCase() ?? (progress.stopped ? "answered before reading" : "waiting for the file")}`}
            value={progress.stage ? progress.stageFraction : 0}
            detail={progress.stopped ? "nothing saved" : undefined}
          />
          <ol className="flex flex-wrap gap-x-6 gap-y-1 text-sm" aria-label="Server steps">
            {STAGES.map((s, i) => {
              const state = progress.done.includes(s.stage)
                ? "done"
                : progress.stage === s.stage
                  ? progress.stopped
                    ? "stopped"
                    : "now"
                  : "later";
              return (
                <li
                  key={s.stage}
                  className={
                    state === "done"
                      ? "text-leaf"
                      : state === "now"
                        ? "font-medium"
                        : state === "stopped"
                          ? "font-medium text-alarm"
                          : "text-ink-faint"
                  }
                >
                  {state === "done" ? "✓ " : state === "stopped" ? "✕ " : `${i + 1}. `}
                  {s.label}
                  <span className="sr-only">
                    {state === "done"
                      ? " (done)"
                      : state === "now"
                        ? " (in progress)"
                        : state === "stopped"
                          ? " (stopped here)"
                          : ""}
                  </span>
                </li>
              );
            })}
          </ol>
        </section>
      ) : null}

      <p role="status" className="sr-only">
        {result.name === "saved"
          ? `Saved: ${result.body.dataset.fileName}, ${result.body.dataset.rowCount} rows.`
          : result.name === "invalid"
            ? `Nothing was saved: the file has ${result.issues.filter((i) => i.severity === "error").length} errors, listed below.`
            : result.name === "warnings"
              ? "Not saved yet: read the warnings below and confirm to save."
              : result.name === "failed"
                ? `The file was not saved. ${result.message}`
                : ""}
      </p>
      <div ref={resultRef} tabIndex={-1} className="outline-none">
        {result.name === "saved" ? <Saved body={result.body} field={field} kind={kind} onReset={onReset} /> : null}
        {result.name === "invalid" ? <Invalid result={result} file={file} field={field} /> : null}
        {result.name === "warnings" ? (
          <section
            className="mb-6 rounded-plot border border-stake bg-white p-5"
            data-testid="upload-warnings"
            aria-labelledby="warnings-title"
          >
            <h2 id="warnings-title" className="mb-1 text-base font-semibold">
              Read these warnings before saving
            </h2>
            <p className="mb-3 text-sm text-ink-soft">{result.message} The file has not been saved.</p>
            <IssueTable issues={result.issues} caption="Warnings about the file" testId="warning-table" />
            <label className="mt-4 flex items-start gap-2 text-sm">
              <input
                type="checkbox"
                className="mt-1 accent-leaf"
                checked={acceptChecked}
                onChange={(e) => setAcceptChecked(e.target.checked)}
              />
              I have read these warnings and want to save the file anyway
            </label>
            <div className="mt-3 flex gap-3">
              <button
                type="button"
                className={buttonClass.primary}
                disabled={!acceptChecked || uploading}
                onClick={() => void upload(form.getValues(), true)}
              >
                Save with these warnings
              </button>
              <button type="button" className={buttonClass.secondary} onClick={onReset}>
                Choose another file
              </button>
            </div>
          </section>
        ) : null}
        {result.name === "failed" ? (
          <div className="mb-6" data-testid="upload-failed">
            <Notice tone="alarm">
              <p className="font-medium">The file was not saved.</p>
              <p>{result.message}</p>
            </Notice>
          </div>
        ) : null}
      </div>
    </>
  );
}

function PreviewFacts({ preview, file }: { preview: Preview; file: File }) {
  return (
    <dl className="mb-3 grid grid-cols-2 gap-x-6 gap-y-1 text-sm md:grid-cols-4" data-testid="preview-facts">
      <div>
        <dt className="text-ink-faint">File</dt>
        <dd className="break-all">
          {file.name} · {formatBytes(file.size)}
        </dd>
      </div>
      {preview.format === "csv" ? (
        <>
          <div>
            <dt className="text-ink-faint">Rows</dt>
            <dd>
              {preview.rowCountExact ? "" : "about "}
              {preview.rowCount.toLocaleString("en-GB")}
            </dd>
          </div>
          <div>
            <dt className="text-ink-faint">Delimiter</dt>
            <dd data-testid="preview-delimiter">{DELIMITER_NAME[preview.delimiter]}</dd>
          </div>
          <div>
            <dt className="text-ink-faint">Decimal comma</dt>
            <dd data-testid="preview-decimal-comma">
              {preview.decimalCommaSeen
                ? "found — 52,5 is read as 52.5"
                : preview.decimalCommaAccepted
                  ? "none seen (would be read as a decimal point)"
                  : "no — comma separates columns"}
            </dd>
          </div>
        </>
      ) : (
        <>
          <div>
            <dt className="text-ink-faint">Features</dt>
            <dd>{preview.featureCount.toLocaleString("en-GB")}</dd>
          </div>
          <div>
            <dt className="text-ink-faint">Format</dt>
            <dd>GeoJSON FeatureCollection</dd>
          </div>
          <div>
            <dt className="text-ink-faint">CRS named in the file</dt>
            <dd>{preview.crsHint ?? "none (GeoJSON means WGS 84)"}</dd>
          </div>
        </>
      )}
      {preview.format === "geojson" && Object.keys(preview.otherGeometries).length > 0 ? (
        <div className="col-span-full text-alarm">
          Not points:{" "}
          {Object.entries(preview.otherGeometries)
            .map(([t, n]) => `${n} ${t}`)
            .join(", ")}
          . Each plant must be one Point feature.
        </div>
      ) : null}
      {preview.header.length > 0 &&
      preview.header.every((h) => h !== "" && Number.isFinite(Number(h.replace(",", ".")))) ? (
        <div className="col-span-full text-alarm">
          The first line holds numbers, not column names. Add a header line such as plant_id,lat,lon.
        </div>
      ) : null}
    </dl>
  );
}

function PreviewTable({
  preview,
  roleOf,
  label,
}: {
  preview: Preview;
  roleOf: Map<string, ColumnRole>;
  label: (r: ColumnRole) => string;
}) {
  if (preview.rows.length === 0) return <p className="text-sm text-alarm">The file has a header but no rows.</p>;
  return (
    <div className="max-h-96 overflow-auto rounded-plot border border-chalk-line">
      <table className="w-full text-left font-mono text-xs" data-testid="preview-table">
        <caption className="sr-only">
          First {preview.rows.length} rows of the file, with the part each column plays
        </caption>
        <thead className="sticky top-0 bg-chalk">
          <tr>
            <th scope="col" className="px-2 py-1.5 font-sans font-medium text-ink-faint">
              {preview.format === "csv" ? "Line" : "Feature"}
            </th>
            {preview.format === "geojson" ? (
              <th scope="col" className="px-2 py-1.5 font-sans font-medium">
                geometry<span className="block text-leaf">position</span>
              </th>
            ) : null}
            {preview.header.map((h, i) => {
              const role = roleOf.get(h);
              return (
                <th key={`${i}-${h}`} scope="col" className="px-2 py-1.5 align-bottom font-medium">
                  {h}
                  <span className={`block font-sans text-[11px] ${role ? "text-leaf" : "text-ink-faint"}`}>
                    {role ? label(role) : "not read"}
                  </span>
                </th>
              );
            })}
          </tr>
        </thead>
        <tbody className="divide-y divide-chalk-deep">
          {preview.rows.map((r, n) => (
            <tr key={r.line}>
              <td className="px-2 py-1 text-ink-faint">{r.line}</td>
              {preview.format === "geojson" ? <td className="px-2 py-1">{preview.positions[n]}</td> : null}
              {preview.header.map((_, i) => (
                <td key={i} className="px-2 py-1 whitespace-nowrap">
                  {r.cells[i] ?? ""}
                </td>
              ))}
            </tr>
          ))}
        </tbody>
      </table>
    </div>
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

function Saved({
  body,
  field,
  kind,
  onReset,
}: {
  body: UploadOkDto;
  field: UploadField;
  kind: FileKind;
  onReset: () => void;
}) {
  const d = body.dataset;
  const other: FileKind = kind === "planted" ? "survey" : "planted";
  const suggestedZone = body.suggestedCrs ? utmZone(body.suggestedCrs) : null;
  const fieldZone = utmZone(field.crs);
  return (
    <section
      className="mb-6 rounded-plot border border-leaf bg-white p-5"
      data-testid="upload-saved"
      aria-labelledby="saved-title"
    >
      <h2 id="saved-title" className="mb-1 text-base font-semibold text-leaf">
        Saved: {d.fileName}
      </h2>
      <p className="mb-3 text-sm text-ink-soft">
        The file is kept exactly as uploaded, and its points are stored with {field.name}.
      </p>
      <dl className="mb-4 grid grid-cols-2 gap-x-6 gap-y-2 text-sm md:grid-cols-4">
        <div>
          <dt className="text-ink-faint">Rows read</dt>
          <dd data-testid="saved-rows">{d.rowCount.toLocaleString("en-GB")}</dd>
        </div>
        <div>
          <dt className="text-ink-faint">SHA-256</dt>
          <dd className="font-mono" title={d.sha256} data-testid="saved-sha">
            {d.sha256.slice(0, 12)}…
          </dd>
        </div>
        <div>
          <dt className="text-ink-faint">Size</dt>
          <dd>{formatBytes(d.sizeBytes)}</dd>
        </div>
        <div>
          <dt className="text-ink-faint">Read in</dt>
          <dd className="font-mono">{d.crs}</dd>
        </div>
        <div>
          <dt className="text-ink-faint">Warnings kept</dt>
          <dd data-testid="saved-warnings">{body.warnings.length}</dd>
        </div>
      </dl>
      {body.warnings.length > 0 ? (
        <div className="mb-4">
          <h3 className="mb-2 text-sm font-semibold">Warnings you accepted (kept with the file)</h3>
          <IssueTable issues={body.warnings} caption="Warnings kept with the file" testId="kept-warning-table" />
        </div>
      ) : null}
      {suggestedZone && fieldZone && suggestedZone !== fieldZone ? (
        <div className="mb-4">
          <Notice tone="caution">
            These points lie in UTM zone {suggestedZone} ({body.suggestedCrs}), but {field.name} is set to {field.crs}.{" "}
            <Link href={`/fields/${field.id}/edit`} className={buttonClass.quiet}>
              Check the field&apos;s coordinate system
            </Link>
          </Notice>
        </div>
      ) : null}
      <div className="flex flex-wrap items-center gap-4">
        <Link href={`/fields/${field.id}`} className={buttonClass.primary}>
          Back to {field.name}
        </Link>
        <Link href={`/fields/${field.id}/upload?kind=${other}`} className={buttonClass.secondary}>
          Upload the {KIND_NOUN[other]}
        </Link>
        <button type="button" className={buttonClass.quiet} onClick={onReset}>
          Upload another file of {KIND_NOUN[kind]}
        </button>
      </div>
    </section>
  );
}

function Invalid({
  result,
  file,
  field,
}: {
  result: { message: string; issues: InputIssue[] };
  file: File;
  field: UploadField;
}) {
  const errors = result.issues.filter((i) => i.severity === "error").length;
  const warnings = result.issues.length - errors;
  return (
    <section
      className="mb-6 rounded-plot border border-alarm bg-white p-5"
      data-testid="upload-invalid"
      aria-labelledby="invalid-title"
    >
      <h2 id="invalid-title" className="mb-1 text-base font-semibold text-alarm">
        Nothing was saved: the file has {errors} error{errors === 1 ? "" : "s"}
      </h2>
      <p className="mb-1 text-sm">{result.message}</p>
      <p className="mb-3 text-sm text-ink-soft">
        Correct the file and choose it again, or change the columns above and save again.
        {warnings > 0 ? ` ${warnings} warning${warnings === 1 ? " is" : "s are"} listed too.` : ""}
        {result.issues.length >= 50 ? " Each kind of problem is listed up to 50 times." : ""}
      </p>
      <div className="mb-3">
        <button
          type="button"
          className={buttonClass.secondary}
          onClick={() =>
            downloadText(
              issuesCsv(result.issues),
              safeFileName(field.name, file.name.replace(/\.[^.]+$/, ""), "problems"),
            )
          }
        >
          Download errors as CSV
        </button>
      </div>
      <IssueTable
        issues={result.issues}
        caption={`Problems found in ${file.name}; nothing was saved`}
        testId="error-table"
      />
    </section>
  );
}
