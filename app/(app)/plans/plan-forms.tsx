"use client";
import { useRouter } from "next/navigation";
import { useState } from "react";
import { type ApiError, sendJson, toApiError } from "@/lib/fetcher";
import type { ControlMarkDto } from "@/lib/plan/dto";
import { FormError } from "@/app/_components/form";
import { buttonClass, inputClass } from "@/app/_components/field-form/controls";
import {
  emptyFieldwork,
  FieldworkFields,
  type FieldworkValues,
  fieldworkJson,
  TextInput,
  typedNumber,
} from "@/app/_components/fieldwork/fieldwork-fields";

/** Make a survey plan (QA lead or owner). */
export function NewPlanForm({
  fieldId,
  datasets,
  profiles,
}: {
  fieldId: string;
  datasets: { id: string; fileName: string }[];
  profiles: { id: string; name: string }[];
}) {
  const router = useRouter();
  const [v, setV] = useState({
    name: "",
    plantedDatasetId: datasets[0]?.id ?? "",
    profileId: profiles[0]?.id ?? "",
    allowedFailures: "0",
    nssda: true,
    asprs2023: true,
    bed: true,
    arm: false,
    crop: false,
    day: false,
    fix: false,
    minPerStratum: "3",
    sparesPerStratum: "1",
    minSpacingM: "1",
    bedEndM: "0",
    seed: "",
  });
  const [error, setError] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);
  const set = (k: keyof typeof v) => (x: string | boolean) => setV((o) => ({ ...o, [k]: x }));

  async function submit(e: React.FormEvent) {
    e.preventDefault();
    setBusy(true);
    setError(null);
    try {
      const res = await sendJson<{ plan: { id: string } }>(`/api/fields/${fieldId}/plans`, "POST", {
        name: v.name,
        plantedDatasetId: v.plantedDatasetId,
        profileId: v.profileId,
        allowedFailures: typedNumber(v.allowedFailures) ?? 0,
        standards: (["nssda", "asprs2023"] as const).filter((s) => v[s]),
        strataBy: (["bed", "arm", "crop", "day", "fix"] as const).filter((s) => v[s]),
        minPerStratum: typedNumber(v.minPerStratum) ?? 0,
        sparesPerStratum: typedNumber(v.sparesPerStratum) ?? 0,
        minSpacingM: typedNumber(v.minSpacingM) ?? 0,
        bedEndM: typedNumber(v.bedEndM) ?? 0,
        ...(typedNumber(v.seed) !== null ? { seed: typedNumber(v.seed) } : {}),
      });
      router.push(`/plans/${res.plan.id}`);
    } catch (err) {
      setError((err as ApiError).message);
      setBusy(false);
    }
  }

  const check = (k: "nssda" | "asprs2023" | "bed" | "arm" | "crop" | "day" | "fix", label: string) => (
    <label className="mr-4 inline-flex items-center gap-2 text-sm">
      <input
        type="checkbox"
        className="h-4 w-4 accent-leaf"
        checked={v[k]}
        onChange={(e) => set(k)(e.target.checked)}
      />
      {label}
    </label>
  );
  return (
    <form onSubmit={submit} aria-label="New survey plan" className="grid gap-4" data-testid="new-plan-form" noValidate>
      <FormError message={error} />
      <TextInput id="plan-name" label="Plan name" value={v.name} onChange={set("name")} />
      <div>
        <label htmlFor="plan-dataset" className="mb-1 block text-sm font-medium">
          As-planted records
        </label>
        <select
          id="plan-dataset"
          className={inputClass(false)}
          value={v.plantedDatasetId}
          onChange={(e) => set("plantedDatasetId")(e.target.value)}
        >
          {datasets.map((d) => (
            <option key={d.id} value={d.id}>
              {d.fileName}
            </option>
          ))}
        </select>
      </div>
      <div>
        <label htmlFor="plan-profile" className="mb-1 block text-sm font-medium">
          Tolerance profile
        </label>
        <select
          id="plan-profile"
          className={inputClass(false)}
          value={v.profileId}
          onChange={(e) => set("profileId")(e.target.value)}
        >
          {profiles.map((p) => (
            <option key={p.id} value={p.id}>
              {p.name}
            </option>
          ))}
        </select>
      </div>
      <div className="grid gap-4 sm:grid-cols-3">
        <TextInput
          id="plan-failures"
          label="Checkpoints outside allowed for"
          value={v.allowedFailures}
          onChange={set("allowedFailures")}
          hint="0 = the smallest sample; each allowed failure needs more checkpoints"
          type="number"
        />
        <TextInput
          id="plan-min"
          label="Minimum per stratum"
          value={v.minPerStratum}
          onChange={set("minPerStratum")}
          type="number"
        />
        <TextInput
          id="plan-spares"
          label="Spares per stratum"
          value={v.sparesPerStratum}
          onChange={set("sparesPerStratum")}
          type="number"
        />
        <TextInput
          id="plan-spacing"
          label="Minimum spacing (m)"
          value={v.minSpacingM}
          onChange={set("minSpacingM")}
          type="number"
        />
        <TextInput
          id="plan-bed-end"
          label="Leave out at each bed end (m)"
          value={v.bedEndM}
          onChange={set("bedEndM")}
          type="number"
        />
        <TextInput
          id="plan-seed"
          label="Seed (optional)"
          value={v.seed}
          onChange={set("seed")}
          hint="Same seed, same plants"
          type="number"
        />
      </div>
      <fieldset>
        <legend className="mb-1 text-sm font-medium">Never fewer than the minimum of</legend>
        {check("nssda", "NSSDA (20)")}
        {check("asprs2023", "ASPRS Edition 2 (30)")}
      </fieldset>
      <fieldset>
        <legend className="mb-1 text-sm font-medium">Strata by</legend>
        {check("bed", "Bed")}
        {check("arm", "Arm")}
        {check("crop", "Crop")}
        {check("day", "Planting day")}
        {check("fix", "Fix quality")}
      </fieldset>
      <div>
        <button type="submit" className={buttonClass.primary} disabled={busy}>
          {busy ? "Choosing plants…" : "Make plan"}
        </button>
      </div>
    </form>
  );
}

/** Add a control mark to the field (QA lead or owner). */
export function ControlMarkForm({ fieldId }: { fieldId: string }) {
  const router = useRouter();
  const [v, setV] = useState({ name: "", e: "", n: "", h: "", description: "", source: "" });
  const [error, setError] = useState<string | null>(null);
  const set = (k: keyof typeof v) => (x: string) => setV((o) => ({ ...o, [k]: x }));
  async function submit(e: React.FormEvent) {
    e.preventDefault();
    setError(null);
    try {
      await sendJson(`/api/fields/${fieldId}/control-marks`, "POST", {
        name: v.name,
        e: typedNumber(v.e),
        n: typedNumber(v.n),
        h: typedNumber(v.h),
        description: v.description.trim() || null,
        source: v.source.trim() || null,
      });
      setV({ name: "", e: "", n: "", h: "", description: "", source: "" });
      router.refresh();
    } catch (err) {
      setError((err as ApiError).message);
    }
  }
  return (
    <form onSubmit={submit} aria-label="New control mark" className="grid gap-3 sm:grid-cols-3" noValidate>
      <div className="sm:col-span-3">
        <FormError message={error} />
      </div>
      <TextInput id="mark-name" label="Mark name" value={v.name} onChange={set("name")} />
      <TextInput id="mark-e" label="Known easting (m)" value={v.e} onChange={set("e")} type="number" />
      <TextInput id="mark-n" label="Known northing (m)" value={v.n} onChange={set("n")} type="number" />
      <TextInput id="mark-h" label="Height (m, optional)" value={v.h} onChange={set("h")} type="number" />
      <TextInput id="mark-description" label="Description" value={v.description} onChange={set("description")} />
      <TextInput id="mark-source" label="Source of the position" value={v.source} onChange={set("source")} />
      <div>
        <button type="submit" className={buttonClass.secondary}>
          Add mark
        </button>
      </div>
    </form>
  );
}

/** Upload the survey made from this plan, with the control-mark check and the instrument (technician). */
export function PlanSurveyUpload({
  fieldId,
  planId,
  crs,
  marks,
}: {
  fieldId: string;
  planId: string;
  crs: string;
  marks: ControlMarkDto[];
}) {
  const router = useRouter();
  const [file, setFile] = useState<File | null>(null);
  const [fieldwork, setFieldwork] = useState<FieldworkValues>(() => emptyFieldwork(planId, marks[0]?.id ?? ""));
  const [error, setError] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);

  async function submit(e: React.FormEvent) {
    e.preventDefault();
    if (!file) {
      setError("Choose the survey file.");
      return;
    }
    setBusy(true);
    setError(null);
    const form = new FormData();
    form.set("file", file);
    form.set("kind", "survey");
    form.set("crs", crs);
    form.set("acceptWarnings", "true");
    form.set("fieldwork", fieldworkJson(fieldwork) ?? "{}");
    const res = await fetch(`/api/fields/${fieldId}/datasets`, {
      method: "POST",
      body: form,
      headers: { accept: "application/json" },
    });
    setBusy(false);
    if (!res.ok) {
      setError((await toApiError(res)).message);
      return;
    }
    setFile(null);
    router.refresh();
  }

  return (
    <form
      onSubmit={submit}
      aria-label="Upload the survey made from this plan"
      className="grid gap-3"
      noValidate
      data-testid="plan-survey-form"
    >
      <FormError message={error} />
      <div>
        <label htmlFor="survey-file" className="mb-1 block text-sm font-medium">
          Survey file (CSV, easting/northing in {crs}; the id column holds the plant id or the point name)
        </label>
        <input
          id="survey-file"
          type="file"
          accept=".csv,.txt,.geojson,.json"
          onChange={(e) => setFile(e.target.files?.[0] ?? null)}
        />
      </div>
      <FieldworkFields values={fieldwork} onChange={setFieldwork} marks={marks} showMissing />
      <div>
        <button type="submit" className={buttonClass.primary} disabled={busy}>
          {busy ? "Checking and saving…" : "Upload survey"}
        </button>
      </div>
    </form>
  );
}
