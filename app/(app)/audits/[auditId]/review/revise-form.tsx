"use client";
import { useState } from "react";
import { useRouter } from "next/navigation";
import { useForm } from "react-hook-form";
import { useSWRConfig } from "swr";
import { type ApiError, sendJson } from "@/lib/fetcher";
import { reviewKeys } from "@/lib/review/keys";
import type { ReviseInput } from "@/lib/review/validation";
import type { AuditDto } from "@/lib/api-types";
import { DEFAULT_MAX_PAIR_DISTANCE_M, MAX_PAIR_DISTANCE_CEILING_M, type AuditSettings } from "@/lib/audit/settings";
import { FormError } from "@/app/_components/form";
import { FieldRow, buttonClass, inputClass } from "@/app/_components/field-form/controls";
import { formatInZone } from "@/app/_components/ui";

export interface DatasetOption {
  id: string;
  kind: "planted" | "survey";
  fileName: string;
  rowCount: number;
  uploadedAt: string;
}

type Values = {
  plantedDatasetId: string;
  surveyDatasetId: string;
  profileId: string;
  match: AuditSettings["match"];
  maxDistanceMm: string;
  title: string;
};

/** Re-run a returned audit as its next revision, with other files, another profile or other pairing settings. */
export function ReviseForm({
  audit,
  revision,
  datasets,
  profiles,
}: {
  audit: AuditDto;
  revision: number;
  datasets: DatasetOption[];
  profiles: { id: string; name: string }[];
}) {
  const router = useRouter();
  const { mutate } = useSWRConfig();
  const [formError, setFormError] = useState<string | null>(null);
  const {
    register,
    handleSubmit,
    setError,
    formState: { errors, isSubmitting },
  } = useForm<Values>({
    defaultValues: {
      plantedDatasetId: audit.planted?.id ?? "",
      surveyDatasetId: audit.survey?.id ?? "",
      profileId: audit.profile?.id ?? profiles[0]?.id ?? "",
      match: audit.settings?.match ?? "auto",
      maxDistanceMm: String(Math.round((audit.settings?.maxDistanceM ?? DEFAULT_MAX_PAIR_DISTANCE_M) * 1000)),
      title: audit.title,
    },
  });

  async function onSubmit(v: Values) {
    setFormError(null);
    // The form asks in millimetres; the API and everything below it use metres (converted once, here).
    const maxMm = Number(v.maxDistanceMm.replace(",", "."));
    const ceilingMm = MAX_PAIR_DISTANCE_CEILING_M * 1000;
    if (!(maxMm > 0 && maxMm <= ceilingMm))
      return setError("maxDistanceMm", { message: `Between 1 and ${ceilingMm} mm.` });
    const body: ReviseInput = {
      plantedDatasetId: v.plantedDatasetId,
      surveyDatasetId: v.surveyDatasetId,
      profileId: v.profileId,
      match: v.match,
      maxDistanceM: maxMm / 1000,
      title: v.title.trim() || undefined,
    };
    try {
      const res = await sendJson<{ audit: AuditDto }>(`/api/audits/${audit.id}/revise`, "POST", body);
      await mutate(reviewKeys.review(audit.id));
      router.push(`/audits/${res.audit.id}`);
    } catch (err) {
      const e = err as ApiError;
      const issues = (e.issues ?? []) as { path?: string[]; message: string }[];
      for (const i of issues) {
        const key = i.path?.[0];
        if (key === "plantedDatasetId" || key === "surveyDatasetId" || key === "profileId")
          setError(key, { message: i.message });
      }
      if (!issues.length) setFormError(e.message);
    }
  }

  const option = (d: DatasetOption) => (
    <option key={d.id} value={d.id}>
      {d.fileName} · {d.rowCount} rows · {formatInZone(d.uploadedAt, audit.field.timeZone)}
    </option>
  );
  return (
    <form
      id="revise"
      onSubmit={handleSubmit(onSubmit)}
      noValidate
      aria-label="Correct and re-run"
      className="rounded-plot border border-chalk-line bg-white p-5"
      data-testid="revise-form"
    >
      <h2 className="text-base font-semibold">Correct and re-run as revision {revision + 1}</h2>
      <p className="mb-4 text-sm text-ink-soft">
        Upload corrected files on the field page first if needed. This revision stays readable; the new one is computed
        from the files and profile chosen here.
      </p>
      <FormError message={formError} />
      <div className="grid gap-x-6 md:grid-cols-2">
        <FieldRow id="plantedDatasetId" label="As-planted records" error={errors.plantedDatasetId?.message}>
          <select
            id="plantedDatasetId"
            className={inputClass(!!errors.plantedDatasetId)}
            {...register("plantedDatasetId")}
          >
            {datasets.filter((d) => d.kind === "planted").map(option)}
          </select>
        </FieldRow>
        <FieldRow id="surveyDatasetId" label="Survey of checkpoints" error={errors.surveyDatasetId?.message}>
          <select
            id="surveyDatasetId"
            className={inputClass(!!errors.surveyDatasetId)}
            {...register("surveyDatasetId")}
          >
            {datasets.filter((d) => d.kind === "survey").map(option)}
          </select>
        </FieldRow>
        <FieldRow id="profileId" label="Tolerance profile" error={errors.profileId?.message}>
          <select id="profileId" className={inputClass(!!errors.profileId)} {...register("profileId")}>
            {profiles.map((p) => (
              <option key={p.id} value={p.id}>
                {p.name}
              </option>
            ))}
          </select>
        </FieldRow>
        <FieldRow id="maxDistanceMm" label="Maximum pairing distance (mm)" error={errors.maxDistanceMm?.message}>
          <input
            id="maxDistanceMm"
            inputMode="decimal"
            className={inputClass(!!errors.maxDistanceMm)}
            {...register("maxDistanceMm")}
          />
        </FieldRow>
        <FieldRow id="match" label="Pair checkpoints with records by">
          <select id="match" className={inputClass(false)} {...register("match")}>
            <option value="auto">plant id, then position</option>
            <option value="id">plant id only</option>
            <option value="nearest">position only</option>
          </select>
        </FieldRow>
        <FieldRow id="reviseTitle" label="Title">
          <input id="reviseTitle" className={inputClass(false)} {...register("title")} />
        </FieldRow>
      </div>
      <button type="submit" disabled={isSubmitting} className={buttonClass.primary}>
        {isSubmitting ? "Starting…" : `Re-run as revision ${revision + 1}`}
      </button>
    </form>
  );
}
