"use client";
import { useEffect, useState } from "react";
import useSWR, { useSWRConfig } from "swr";
import { useForm } from "react-hook-form";
import { zodResolver } from "@hookform/resolvers/zod";
import { z } from "zod";
import { ApiError, fetcher, sendJson } from "@/lib/fetcher";
import { keys } from "@/lib/swr-keys";
import type { ToleranceProfileDto } from "@/lib/api-types";
import { FormError } from "@/app/_components/form";
import { InputRow, issuesByField, parseDecimal } from "@/app/_components/audit/form-bits";
import { formatMm, formatPct } from "@/app/_components/audit/format";
import { Empty, Panel } from "@/app/_components/ui";
import { LocalTime } from "@/app/_components/local-time";
import { TOLERANCE_LIMIT_CEILING_M } from "@/lib/audit/profile";

const profileUrl = (id: string) => `${keys.profiles()}/${encodeURIComponent(id)}`;

const CEILING_MM = TOLERANCE_LIMIT_CEILING_M * 1000;
const optionalMm = z.string().refine((s) => {
  const v = parseDecimal(s);
  return v === null || (v > 0 && v <= CEILING_MM);
}, `Enter millimetres between 0 and ${CEILING_MM}, or leave empty to not check this limit.`);

const Schema = z
  .object({
    name: z.string().trim().min(1, "Give the profile a name.").max(80, "At most 80 characters."),
    operation: z
      .string()
      .trim()
      .min(1, "Say which operation will use the records.")
      .max(200, "At most 200 characters."),
    radialMm: optionalMm,
    crossMm: optionalMm,
    alongMm: optionalMm,
    requiredSharePct: z.string().refine((s) => {
      const v = parseDecimal(s);
      return v !== null && v > 0 && v <= 100;
    }, "Enter a percentage above 0 and at most 100."),
    confidencePct: z.string().refine((s) => {
      const v = parseDecimal(s);
      return v !== null && v >= 50 && v <= 99.9;
    }, "Enter a confidence from 50 to 99.9 %."),
    minCheckpoints: z
      .string()
      .refine(
        (s) => /^\d+$/.test(s.trim()) && Number(s) >= 1 && Number(s) <= 100_000,
        "Enter a whole number of checkpoints, at least 1.",
      ),
    note: z.string().trim().max(500, "At most 500 characters."),
  })
  .refine((v) => [v.radialMm, v.crossMm, v.alongMm].some((s) => s.trim() !== ""), {
    message: "Set at least one limit (radial, cross-row or along-row).",
    path: ["radialMm"],
  })
  .transform((v) => ({
    name: v.name,
    operation: v.operation,
    radialM: mmToM(v.radialMm),
    crossM: mmToM(v.crossMm),
    alongM: mmToM(v.alongMm),
    requiredShare: round(parseDecimal(v.requiredSharePct)! / 100, 6),
    confidence: round(parseDecimal(v.confidencePct)! / 100, 6),
    minCheckpoints: Number(v.minCheckpoints),
    note: v.note === "" ? null : v.note,
  }));
type FormIn = z.input<typeof Schema>;
type Body = z.output<typeof Schema>;

function round(v: number, digits: number) {
  const f = 10 ** digits;
  return Math.round(v * f) / f;
}
function mmToM(s: string): number | null {
  const v = parseDecimal(s);
  return v === null ? null : round(v / 1000, 7);
}
function mText(m: number | null): string {
  return m === null ? "" : String(round(m * 1000, 4));
}

const API_TO_FORM: Record<string, string> = {
  radialM: "radialMm",
  crossM: "crossMm",
  alongM: "alongMm",
  requiredShare: "requiredSharePct",
  confidence: "confidencePct",
};

const EMPTY_FORM: FormIn = {
  name: "",
  operation: "",
  radialMm: "",
  crossMm: "",
  alongMm: "",
  requiredSharePct: "95",
  confidencePct: "95",
  minCheckpoints: "30",
  note: "",
};

function toForm(p: ToleranceProfileDto): FormIn {
  return {
    name: p.name,
    operation: p.operation,
    radialMm: mText(p.radialM),
    crossMm: mText(p.crossM),
    alongMm: mText(p.alongM),
    requiredSharePct: String(round(p.requiredShare * 100, 4)),
    confidencePct: String(round(p.confidence * 100, 4)),
    minCheckpoints: String(p.minCheckpoints),
    note: p.note ?? "",
  };
}

type Editing = { mode: "new" } | { mode: "edit"; profile: ToleranceProfileDto } | null;

/** The organisation's tolerance profiles; create, edit and delete for QA leads and owners. */
export function ProfilesManager({ canEdit }: { canEdit: boolean }) {
  const { data, error, isLoading } = useSWR<{ profiles: ToleranceProfileDto[] }>(keys.profiles(), fetcher);
  const [editing, setEditing] = useState<Editing>(null);
  const [deleting, setDeleting] = useState<ToleranceProfileDto | null>(null);
  const [notice, setNotice] = useState<string | null>(null);
  const profiles = data?.profiles ?? [];

  return (
    <div className="grid gap-6">
      <Panel
        title="Profiles"
        action={
          canEdit && editing?.mode !== "new" ? (
            <button
              type="button"
              className="rounded-plot bg-leaf px-3 py-1.5 text-sm font-medium text-white hover:bg-leaf-deep"
              onClick={() => {
                setNotice(null);
                setEditing({ mode: "new" });
              }}
            >
              New profile
            </button>
          ) : undefined
        }
      >
        {notice ? (
          <p role="status" className="mb-3 rounded-plot bg-leaf-pale px-3 py-2 text-sm" data-testid="profile-notice">
            {notice}
          </p>
        ) : null}
        {error ? (
          <p role="alert" className="text-sm text-alarm">
            The profiles could not be loaded: {(error as Error).message}
          </p>
        ) : null}
        {isLoading ? (
          <Empty>Loading…</Empty>
        ) : profiles.length === 0 && !error ? (
          <Empty>No profiles yet.</Empty>
        ) : (
          <div
            className="relative overflow-x-auto"
            role="region"
            aria-label="Tolerance profiles"
            // biome-ignore lint/a11y/noNoninteractiveTabindex: a scrolling region must be reachable by keyboard
            tabIndex={0}
          >
            <table className="w-full text-left text-sm tabular-nums" data-testid="profiles-table">
              <caption className="sr-only">Tolerance profiles: limits in millimetres</caption>
              <thead className="text-xs text-ink-faint">
                <tr>
                  <th scope="col" className="py-1 pr-3 font-medium">
                    Name and operation
                  </th>
                  <th scope="col" className="pr-3 text-right font-medium">
                    Radial
                  </th>
                  <th scope="col" className="pr-3 text-right font-medium">
                    Cross-row
                  </th>
                  <th scope="col" className="pr-3 text-right font-medium">
                    Along-row
                  </th>
                  <th scope="col" className="pr-3 text-right font-medium">
                    Required share
                  </th>
                  <th scope="col" className="pr-3 text-right font-medium">
                    Confidence
                  </th>
                  <th scope="col" className="pr-3 text-right font-medium">
                    Min. checkpoints
                  </th>
                  {canEdit ? (
                    <th scope="col" className="font-medium">
                      <span className="sr-only">Actions</span>
                    </th>
                  ) : null}
                </tr>
              </thead>
              <tbody className="divide-y divide-chalk-deep">
                {profiles.map((p) => (
                  <tr key={p.id} data-testid="profile-row" data-profile-name={p.name}>
                    <th scope="row" className="py-2 pr-3 align-top font-normal">
                      <span className="font-medium">{p.name}</span>
                      <span className="block text-ink-soft">{p.operation}</span>
                      {p.builtIn ? (
                        <span
                          className="mt-1 inline-block rounded-plot bg-stake-pale px-1.5 py-0.5 text-xs"
                          data-testid="built-in-label"
                        >
                          Starting values from common practice, not a standard
                        </span>
                      ) : null}
                      {p.note ? <span className="block text-xs text-ink-faint">{p.note}</span> : null}
                      <span className="block text-xs text-ink-faint">
                        Changed <LocalTime iso={p.updatedAt} />
                      </span>
                    </th>
                    <td className="pr-3 text-right align-top whitespace-nowrap" data-col="radial">
                      {p.radialM !== null ? formatMm(p.radialM) : "–"}
                    </td>
                    <td className="pr-3 text-right align-top whitespace-nowrap" data-col="cross">
                      {p.crossM !== null ? formatMm(p.crossM) : "–"}
                    </td>
                    <td className="pr-3 text-right align-top whitespace-nowrap" data-col="along">
                      {p.alongM !== null ? formatMm(p.alongM) : "–"}
                    </td>
                    <td className="pr-3 text-right align-top whitespace-nowrap">{formatPct(p.requiredShare, 0)}</td>
                    <td className="pr-3 text-right align-top whitespace-nowrap">{formatPct(p.confidence, 0)}</td>
                    <td className="pr-3 text-right align-top whitespace-nowrap">{p.minCheckpoints}</td>
                    {canEdit ? (
                      <td className="align-top whitespace-nowrap">
                        <button
                          type="button"
                          className="mr-2 font-medium text-leaf hover:underline"
                          onClick={() => {
                            setNotice(null);
                            setDeleting(null);
                            setEditing({ mode: "edit", profile: p });
                          }}
                          aria-label={`Edit ${p.name}`}
                        >
                          Edit
                        </button>
                        <button
                          type="button"
                          className="font-medium text-alarm hover:underline"
                          onClick={() => {
                            setNotice(null);
                            setEditing(null);
                            setDeleting(p);
                          }}
                          aria-label={`Delete ${p.name}`}
                        >
                          Delete
                        </button>
                      </td>
                    ) : null}
                  </tr>
                ))}
              </tbody>
            </table>
          </div>
        )}
        <p className="mt-3 text-xs text-ink-soft">
          A limit left empty is not checked. The share is tested on its lower confidence bound: with few checkpoints
          even a perfect result cannot show a high share.
        </p>
      </Panel>

      {canEdit && deleting ? (
        <DeleteConfirm
          profile={deleting}
          onDone={(msg) => {
            setDeleting(null);
            if (msg) setNotice(msg);
          }}
        />
      ) : null}
      {canEdit && editing ? (
        <ProfileForm
          key={editing.mode === "edit" ? editing.profile.id : "new"}
          editing={editing}
          onDone={(msg) => {
            setEditing(null);
            if (msg) setNotice(msg);
          }}
        />
      ) : null}
    </div>
  );
}

function ProfileForm({ editing, onDone }: { editing: NonNullable<Editing>; onDone: (message: string | null) => void }) {
  const { mutate } = useSWRConfig();
  const [formError, setFormError] = useState<string | null>(null);
  const {
    register,
    handleSubmit,
    setError,
    setFocus,
    formState: { errors, isSubmitting },
  } = useForm<FormIn, unknown, Body>({
    resolver: zodResolver(Schema),
    defaultValues: editing.mode === "edit" ? toForm(editing.profile) : EMPTY_FORM,
  });
  useEffect(() => {
    setFocus("name");
  }, [setFocus]);

  async function onSubmit(body: Body) {
    setFormError(null);
    try {
      const { profile } =
        editing.mode === "edit"
          ? await sendJson<{ profile: ToleranceProfileDto }>(profileUrl(editing.profile.id), "PATCH", body)
          : await sendJson<{ profile: ToleranceProfileDto }>(keys.profiles(), "POST", body);
      await mutate(keys.profiles());
      onDone(editing.mode === "edit" ? `Saved “${profile.name}”.` : `Created “${profile.name}”.`);
    } catch (err) {
      if (err instanceof ApiError && err.status === 409) {
        setError("name", { message: "Another profile already has this name. Choose a different name." });
        setFormError(err.message);
      } else if (err instanceof ApiError && err.status === 422) {
        const byField = issuesByField(err.issues, API_TO_FORM);
        for (const [name, message] of Object.entries(byField))
          if (name in EMPTY_FORM) setError(name as keyof FormIn, { message });
        setFormError(`Check the marked fields. ${err.message}`);
      } else if (err instanceof ApiError && err.status === 403) {
        setFormError("Only QA leads and owners can change tolerance profiles.");
      } else {
        setFormError(err instanceof Error ? err.message : "The profile could not be saved.");
      }
    }
  }

  const title = editing.mode === "edit" ? `Edit “${editing.profile.name}”` : "New profile";
  return (
    <Panel title={title}>
      <form onSubmit={handleSubmit(onSubmit)} noValidate aria-label={title} data-testid="profile-form">
        <FormError message={formError} />
        {editing.mode === "edit" && editing.profile.builtIn ? (
          <p className="mb-4 text-sm text-ink-soft">
            These are starting values from common practice, not a standard: adjust them to your machines and crops.
          </p>
        ) : null}
        <div className="grid gap-x-6 sm:grid-cols-2">
          <InputRow id="name" label="Name" error={errors.name?.message} reg={register("name")} />
          <InputRow
            id="operation"
            label="Operation that will use the records"
            error={errors.operation?.message}
            reg={register("operation")}
          />
          <InputRow
            id="radialMm"
            label="Radial limit"
            suffix="mm"
            inputMode="decimal"
            error={errors.radialMm?.message}
            reg={register("radialMm")}
            hint="Largest distance between record and plant. Empty = not checked."
          />
          <InputRow
            id="crossMm"
            label="Cross-row limit"
            suffix="mm"
            inputMode="decimal"
            error={errors.crossMm?.message}
            reg={register("crossMm")}
            hint="Largest error across the row. Empty = not checked."
          />
          <InputRow
            id="alongMm"
            label="Along-row limit"
            suffix="mm"
            inputMode="decimal"
            error={errors.alongMm?.message}
            reg={register("alongMm")}
            hint="Largest error along the row. Empty = not checked."
          />
          <InputRow
            id="requiredSharePct"
            label="Required share within every limit"
            suffix="%"
            inputMode="decimal"
            error={errors.requiredSharePct?.message}
            reg={register("requiredSharePct")}
          />
          <InputRow
            id="confidencePct"
            label="Confidence for that share"
            suffix="%"
            inputMode="decimal"
            error={errors.confidencePct?.message}
            reg={register("confidencePct")}
          />
          <InputRow
            id="minCheckpoints"
            label="Minimum checkpoints"
            inputMode="numeric"
            error={errors.minCheckpoints?.message}
            reg={register("minCheckpoints")}
          />
        </div>
        <InputRow id="note" label="Note (optional)" error={errors.note?.message} reg={register("note")} />
        <div className="flex gap-3">
          <button
            type="submit"
            disabled={isSubmitting}
            className="rounded-plot bg-leaf px-4 py-2 font-medium text-white hover:bg-leaf-deep disabled:opacity-60"
          >
            {isSubmitting ? "Saving…" : editing.mode === "edit" ? "Save profile" : "Create profile"}
          </button>
          <button
            type="button"
            className="rounded-plot border border-chalk-line px-4 py-2"
            onClick={() => onDone(null)}
          >
            Cancel
          </button>
        </div>
      </form>
    </Panel>
  );
}

function DeleteConfirm({
  profile,
  onDone,
}: {
  profile: ToleranceProfileDto;
  onDone: (message: string | null) => void;
}) {
  const { mutate } = useSWRConfig();
  const [pending, setPending] = useState(false);
  const [err, setErr] = useState<string | null>(null);
  async function confirm() {
    setPending(true);
    setErr(null);
    try {
      await sendJson<void>(profileUrl(profile.id), "DELETE");
      await mutate(keys.profiles());
      onDone(`Deleted “${profile.name}”.`);
    } catch (e) {
      setErr(e instanceof Error ? e.message : "The profile could not be deleted.");
      setPending(false);
    }
  }
  return (
    <section
      role="alertdialog"
      aria-labelledby="delete-heading"
      aria-describedby="delete-text"
      className="rounded-plot border-l-4 border-alarm bg-white p-5"
      data-testid="delete-confirm"
    >
      <h2 id="delete-heading" className="text-base font-semibold">
        Delete “{profile.name}”?
      </h2>
      <p id="delete-text" className="mt-1 text-sm text-ink-soft">
        Past audits keep their own copy of its limits, so their verdicts do not change. New audits can no longer choose
        it.
      </p>
      <FormError message={err} />
      <div className="mt-3 flex gap-3">
        <button
          type="button"
          disabled={pending}
          onClick={confirm}
          className="rounded-plot bg-alarm px-4 py-2 font-medium text-white disabled:opacity-60"
        >
          {pending ? "Deleting…" : "Delete profile"}
        </button>
        <button type="button" onClick={() => onDone(null)} className="rounded-plot border border-chalk-line px-4 py-2">
          Keep it
        </button>
      </div>
    </section>
  );
}
