"use client";
import { useRouter } from "next/navigation";
import { useState } from "react";
import { type ApiError, sendJson, toApiError } from "@/lib/fetcher";
import type { ControlMarkDto } from "@/lib/plan/dto";
import { FormError } from "@/app/_components/form";
import { buttonClass, inputClass } from "@/app/_components/field-form/controls";

const num = (s: string): number | null => (s.trim() === "" ? null : Number(s.replace(",", ".")));

function Text({
  id,
  label,
  value,
  onChange,
  hint,
  type = "text",
}: {
  id: string;
  label: string;
  value: string;
  onChange: (v: string) => void;
  hint?: string;
  type?: string;
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
        onChange={(e) => onChange(e.target.value)}
      />
      {hint ? <p className="mt-1 text-xs text-ink-faint">{hint}</p> : null}
    </div>
  );
}

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
        allowedFailures: num(v.allowedFailures) ?? 0,
        standards: (["nssda", "asprs2023"] as const).filter((s) => v[s]),
        strataBy: (["bed", "arm", "crop", "day", "fix"] as const).filter((s) => v[s]),
        minPerStratum: num(v.minPerStratum) ?? 0,
        sparesPerStratum: num(v.sparesPerStratum) ?? 0,
        minSpacingM: num(v.minSpacingM) ?? 0,
        bedEndM: num(v.bedEndM) ?? 0,
        ...(num(v.seed) !== null ? { seed: num(v.seed) } : {}),
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
      <Text id="plan-name" label="Plan name" value={v.name} onChange={set("name")} />
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
        <Text
          id="plan-failures"
          label="Checkpoints outside allowed for"
          value={v.allowedFailures}
          onChange={set("allowedFailures")}
          hint="0 = the smallest sample; each allowed failure needs more checkpoints"
          type="number"
        />
        <Text
          id="plan-min"
          label="Minimum per stratum"
          value={v.minPerStratum}
          onChange={set("minPerStratum")}
          type="number"
        />
        <Text
          id="plan-spares"
          label="Spares per stratum"
          value={v.sparesPerStratum}
          onChange={set("sparesPerStratum")}
          type="number"
        />
        <Text
          id="plan-spacing"
          label="Minimum spacing (m)"
          value={v.minSpacingM}
          onChange={set("minSpacingM")}
          type="number"
        />
        <Text
          id="plan-bed-end"
          label="Leave out at each bed end (m)"
          value={v.bedEndM}
          onChange={set("bedEndM")}
          type="number"
        />
        <Text
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
        e: num(v.e),
        n: num(v.n),
        h: num(v.h),
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
      <Text id="mark-name" label="Mark name" value={v.name} onChange={set("name")} />
      <Text id="mark-e" label="Known easting (m)" value={v.e} onChange={set("e")} type="number" />
      <Text id="mark-n" label="Known northing (m)" value={v.n} onChange={set("n")} type="number" />
      <Text id="mark-h" label="Height (m, optional)" value={v.h} onChange={set("h")} type="number" />
      <Text id="mark-description" label="Description" value={v.description} onChange={set("description")} />
      <Text id="mark-source" label="Source of the position" value={v.source} onChange={set("source")} />
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
  const [v, setV] = useState({
    controlMarkId: marks[0]?.id ?? "",
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
  const [error, setError] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);
  const set = (k: keyof typeof v) => (x: string) => setV((o) => ({ ...o, [k]: x }));

  async function submit(e: React.FormEvent) {
    e.preventDefault();
    if (!file) {
      setError("Choose the survey file.");
      return;
    }
    setBusy(true);
    setError(null);
    const missing = v.missing
      .split(/\r?\n/)
      .map((l) => l.trim())
      .filter(Boolean)
      .map((l) => {
        const [name, ...rest] = l.split(/\s+/);
        return { name, status: rest.join(" ").toLowerCase() === "not found" ? "not found" : "dead" };
      });
    const pos = (a: string, b: string) => (num(a) === null && num(b) === null ? null : { e: num(a), n: num(b) });
    const fieldwork = {
      planId,
      controlMarkId: v.controlMarkId || null,
      before: v.controlMarkId ? pos(v.beforeE, v.beforeN) : null,
      after: v.controlMarkId ? pos(v.afterE, v.afterN) : null,
      instrument: v.instrument.trim() || null,
      serial: v.serial.trim() || null,
      calibrationDate: v.calibrationDate || null,
      precisionMm: num(v.precisionMm),
      surveyor: v.surveyor.trim() || null,
      method: v.method.trim() || null,
      missing,
    };
    const form = new FormData();
    form.set("file", file);
    form.set("kind", "survey");
    form.set("crs", crs);
    form.set("acceptWarnings", "true");
    form.set("fieldwork", JSON.stringify(fieldwork));
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
      <fieldset className="grid gap-3 sm:grid-cols-2">
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
        </div>
        <Text
          id="before-e"
          label="Before: measured easting (m)"
          value={v.beforeE}
          onChange={set("beforeE")}
          type="number"
        />
        <Text
          id="before-n"
          label="Before: measured northing (m)"
          value={v.beforeN}
          onChange={set("beforeN")}
          type="number"
        />
        <Text
          id="after-e"
          label="After: measured easting (m)"
          value={v.afterE}
          onChange={set("afterE")}
          type="number"
        />
        <Text
          id="after-n"
          label="After: measured northing (m)"
          value={v.afterN}
          onChange={set("afterN")}
          type="number"
        />
      </fieldset>
      <fieldset className="grid gap-3 sm:grid-cols-3">
        <legend className="mb-1 text-sm font-medium">Instrument and surveyor</legend>
        <Text id="instrument" label="Instrument (make and model)" value={v.instrument} onChange={set("instrument")} />
        <Text id="serial" label="Serial number" value={v.serial} onChange={set("serial")} />
        <Text
          id="calibration"
          label="Calibration date"
          value={v.calibrationDate}
          onChange={set("calibrationDate")}
          type="date"
        />
        <Text
          id="precision"
          label="Stated horizontal precision (mm)"
          value={v.precisionMm}
          onChange={set("precisionMm")}
          type="number"
        />
        <Text id="surveyor" label="Surveyor" value={v.surveyor} onChange={set("surveyor")} />
        <Text id="method" label="Method" value={v.method} onChange={set("method")} />
      </fieldset>
      <div>
        <label htmlFor="missing" className="mb-1 block text-sm font-medium">
          Planned points not surveyed (one a line: point name, then &ldquo;dead&rdquo; or &ldquo;not found&rdquo;)
        </label>
        <textarea
          id="missing"
          rows={3}
          className={inputClass(false)}
          value={v.missing}
          onChange={(e) => set("missing")(e.target.value)}
        />
      </div>
      <div>
        <button type="submit" className={buttonClass.primary} disabled={busy}>
          {busy ? "Checking and saving…" : "Upload survey"}
        </button>
      </div>
    </form>
  );
}
