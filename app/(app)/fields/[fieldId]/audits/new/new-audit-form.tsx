"use client";
import { useEffect, useMemo, useState } from "react";
import { useRouter } from "next/navigation";
import Link from "next/link";
import useSWR from "swr";
import { useForm } from "react-hook-form";
import { zodResolver } from "@hookform/resolvers/zod";
import { z } from "zod";
import { ApiError, fetcher, sendJson } from "@/lib/fetcher";
import { keys } from "@/lib/swr-keys";
import type { AuditDto, DatasetDto, ToleranceProfileDto } from "@/lib/api-types";
import {
  DEFAULT_MAX_PAIR_DISTANCE_M,
  MATCH_MODES as MATCH_VALUES,
  MAX_PAIR_DISTANCE_CEILING_M,
} from "@/lib/audit/settings";
import { FormError, SubmitButton } from "@/app/_components/form";
import { InputRow, SelectRow, issuesByField, parseDecimal } from "@/app/_components/audit/form-bits";
import { ProfileLimits } from "@/app/_components/audit/profile-limits";
import { formatInZone } from "@/app/_components/ui";

const MATCH_MODES = [
  {
    value: "auto",
    label: "Plant id, then position",
    explain: "Pair by plant id where the survey has one; pair the rest with the nearest record.",
  },
  {
    value: "id",
    label: "Plant id only",
    explain: "Pair only checkpoints whose plant id is in the records; checkpoints without an id stay unpaired.",
  },
  {
    value: "nearest",
    label: "Position only",
    explain: "Ignore ids and pair each checkpoint with the nearest record within the maximum distance.",
  },
] as const;

// The form asks in millimetres; the API and everything below it use metres (converted once, on submit).
const CEILING_MM = MAX_PAIR_DISTANCE_CEILING_M * 1000;

const Schema = z.object({
  title: z.string().trim().min(1, "Give the audit a title.").max(120, "At most 120 characters."),
  plantedDatasetId: z.string().min(1, "Choose the as-planted file."),
  surveyDatasetId: z.string().min(1, "Choose the survey file."),
  profileId: z.string().min(1, "Choose a tolerance profile."),
  match: z.enum(MATCH_VALUES),
  maxDistanceMm: z
    .string()
    .refine((s) => {
      const v = parseDecimal(s);
      return v !== null && v > 0;
    }, "Enter a distance in millimetres, more than 0.")
    .refine(
      (s) => (parseDecimal(s) ?? 0) <= CEILING_MM,
      `At most ${CEILING_MM} mm: pairing farther apart would pair unrelated plants.`,
    )
    .transform((s) => parseDecimal(s)!),
  rowBearingDeg: z
    .string()
    .refine((s) => {
      const v = parseDecimal(s);
      return v === null || (v >= 0 && v < 360);
    }, "Enter degrees from 0 to 360 clockwise from grid north, or leave empty.")
    .transform((s) => parseDecimal(s)),
});
type FormIn = z.input<typeof Schema>;
type FormOut = z.output<typeof Schema>;

const API_TO_FORM: Record<string, string> = { maxDistanceM: "maxDistanceMm" };

export function NewAuditForm({
  field,
}: {
  field: { id: string; name: string; crs: string; rowBearingDeg: number | null; timeZone: string };
}) {
  const router = useRouter();
  const datasets = useSWR<{ datasets: DatasetDto[] }>(keys.fieldDatasets(field.id), fetcher);
  const profiles = useSWR<{ profiles: ToleranceProfileDto[] }>(keys.profiles(), fetcher);
  const [formError, setFormError] = useState<string | null>(null);

  const planted = useMemo(() => (datasets.data?.datasets ?? []).filter((d) => d.kind === "planted"), [datasets.data]);
  const surveys = useMemo(() => (datasets.data?.datasets ?? []).filter((d) => d.kind === "survey"), [datasets.data]);

  const {
    register,
    handleSubmit,
    watch,
    setValue,
    setError,
    getValues,
    formState: { errors, isSubmitting },
  } = useForm<FormIn, unknown, FormOut>({
    resolver: zodResolver(Schema),
    defaultValues: {
      title: `${field.name} — ${new Date().toISOString().slice(0, 10)}`,
      plantedDatasetId: "",
      surveyDatasetId: "",
      profileId: "",
      match: "auto",
      maxDistanceMm: String(DEFAULT_MAX_PAIR_DISTANCE_M * 1000),
      rowBearingDeg: "",
    },
  });

  // Preselect the newest file of each kind (the list comes newest first) and the first profile, once loaded.
  useEffect(() => {
    if (!getValues("plantedDatasetId") && planted[0]) setValue("plantedDatasetId", planted[0].id);
    if (!getValues("surveyDatasetId") && surveys[0]) setValue("surveyDatasetId", surveys[0].id);
  }, [planted, surveys, getValues, setValue]);
  useEffect(() => {
    const first = profiles.data?.profiles[0];
    if (!getValues("profileId") && first) setValue("profileId", first.id);
  }, [profiles.data, getValues, setValue]);

  const profileId = watch("profileId");
  const chosenProfile = profiles.data?.profiles.find((p) => p.id === profileId) ?? null;

  async function onSubmit(v: FormOut) {
    setFormError(null);
    try {
      const { audit } = await sendJson<{ audit: AuditDto }>(keys.audits(), "POST", {
        fieldId: field.id,
        plantedDatasetId: v.plantedDatasetId,
        surveyDatasetId: v.surveyDatasetId,
        profileId: v.profileId,
        title: v.title,
        match: v.match,
        maxDistanceM: v.maxDistanceMm / 1000,
        ...(v.rowBearingDeg !== null ? { rowBearingDeg: v.rowBearingDeg } : {}),
      });
      router.push(`/audits/${audit.id}`);
    } catch (err) {
      if (err instanceof ApiError && err.status === 422) {
        const byField = issuesByField(err.issues, API_TO_FORM);
        const known = Object.keys(Schema.shape);
        for (const [name, message] of Object.entries(byField))
          if (known.includes(name)) setError(name as keyof FormIn, { message });
        setFormError(err.message);
      } else {
        setFormError(err instanceof Error ? err.message : "The audit could not be started.");
      }
    }
  }

  const loadError = datasets.error ?? profiles.error;
  const noFiles = datasets.data && (planted.length === 0 || surveys.length === 0);

  return (
    <form
      onSubmit={handleSubmit(onSubmit)}
      noValidate
      aria-label="New audit"
      className="grid max-w-3xl gap-6"
      data-testid="new-audit-form"
    >
      <FormError message={formError} />
      {loadError ? <FormError message={`Could not load the choices: ${(loadError as Error).message}`} /> : null}

      <fieldset className="rounded-plot border border-chalk-line bg-white p-5">
        <legend className="px-1 text-base font-semibold">What to compare</legend>
        <InputRow id="title" label="Title" error={errors.title?.message} reg={register("title")} />
        {noFiles ? (
          <p className="mb-4 rounded-plot bg-stake-pale p-3 text-sm">
            This field needs {planted.length === 0 ? "an as-planted file" : ""}
            {planted.length === 0 && surveys.length === 0 ? " and " : ""}
            {surveys.length === 0 ? "a survey file" : ""} before it can be audited.{" "}
            <Link href={`/fields/${field.id}`} className="font-medium text-leaf underline">
              Upload on the field page
            </Link>
            .
          </p>
        ) : null}
        <SelectRow
          id="plantedDatasetId"
          label="As-planted records"
          error={errors.plantedDatasetId?.message}
          reg={register("plantedDatasetId")}
          hint="The planting machine's file: one row per plant."
        >
          <option value="">{datasets.isLoading ? "Loading…" : "Choose a file"}</option>
          {planted.map((d) => (
            <option key={d.id} value={d.id}>
              {datasetLabel(d, field.timeZone)}
            </option>
          ))}
        </SelectRow>
        <SelectRow
          id="surveyDatasetId"
          label="Survey of checkpoints"
          error={errors.surveyDatasetId?.message}
          reg={register("surveyDatasetId")}
          hint="Your independent measurement of a sample of plants."
        >
          <option value="">{datasets.isLoading ? "Loading…" : "Choose a file"}</option>
          {surveys.map((d) => (
            <option key={d.id} value={d.id}>
              {datasetLabel(d, field.timeZone)}
            </option>
          ))}
        </SelectRow>
      </fieldset>

      <fieldset className="rounded-plot border border-chalk-line bg-white p-5">
        <legend className="px-1 text-base font-semibold">Judge against</legend>
        <SelectRow
          id="profileId"
          label="Tolerance profile"
          error={errors.profileId?.message}
          reg={register("profileId")}
          hint={
            <>
              The limits the next operation needs.{" "}
              <Link href="/profiles" className="text-leaf underline">
                See all profiles
              </Link>
              .
            </>
          }
        >
          <option value="">{profiles.isLoading ? "Loading…" : "Choose a profile"}</option>
          {(profiles.data?.profiles ?? []).map((p) => (
            <option key={p.id} value={p.id}>
              {p.name} — {p.operation}
            </option>
          ))}
        </SelectRow>
        {chosenProfile ? <ProfileLimits profile={chosenProfile} /> : null}
      </fieldset>

      <fieldset className="rounded-plot border border-chalk-line bg-white p-5">
        <legend className="px-1 text-base font-semibold">Pairing</legend>
        <fieldset className="mb-4">
          <legend className="mb-1 text-sm font-medium">Pair checkpoints with records by</legend>
          <div className="grid gap-2">
            {MATCH_MODES.map((m) => (
              <label
                key={m.value}
                className="flex items-start gap-2 rounded-plot border border-chalk-line p-2 text-sm has-[:checked]:border-leaf has-[:checked]:bg-leaf-pale"
              >
                <input type="radio" value={m.value} {...register("match")} className="mt-1 accent-leaf" />
                <span>
                  <span className="font-medium">{m.label}</span>
                  <span className="block text-ink-soft">{m.explain}</span>
                </span>
              </label>
            ))}
          </div>
          {errors.match?.message ? (
            <p role="alert" className="mt-1 text-sm text-alarm">
              {errors.match.message}
            </p>
          ) : null}
        </fieldset>
        <InputRow
          id="maxDistanceMm"
          label="Maximum pairing distance"
          suffix="mm"
          inputMode="decimal"
          error={errors.maxDistanceMm?.message}
          reg={register("maxDistanceMm")}
          hint="A checkpoint farther than this from every record stays unpaired. Keep it under half the plant spacing."
        />
        <InputRow
          id="rowBearingDeg"
          label="Row direction (optional)"
          suffix="° from grid north"
          inputMode="decimal"
          error={errors.rowBearingDeg?.message}
          reg={register("rowBearingDeg")}
          placeholder={field.rowBearingDeg !== null ? String(field.rowBearingDeg) : "derived"}
          hint={
            field.rowBearingDeg !== null
              ? `Leave empty to use the field's ${field.rowBearingDeg}°.`
              : "Leave empty to derive it from the as-planted records (the field has none set)."
          }
        />
      </fieldset>

      <div className="max-w-xs">
        <SubmitButton pending={isSubmitting}>Run the audit</SubmitButton>
      </div>
    </form>
  );
}

function datasetLabel(d: DatasetDto, timeZone: string): string {
  return `${d.fileName} · ${d.rowCount.toLocaleString("en-GB")} rows · ${d.crs} · ${formatInZone(d.uploadedAt, timeZone)}`;
}
