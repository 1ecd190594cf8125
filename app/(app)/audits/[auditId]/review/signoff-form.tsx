"use client";
import { useEffect, useMemo, useState } from "react";
import { useForm } from "react-hook-form";
import { zodResolver } from "@hookform/resolvers/zod";
import { z } from "zod";
import useSWR, { useSWRConfig } from "swr";
import { fetcher } from "@/lib/fetcher";
import type { SurveyRecordDto } from "@/lib/plan/dto";
import { MarkEvidence, markEvidenceNote } from "@/app/(app)/plans/mark-evidence";
import { type ApiError, sendJson } from "@/lib/fetcher";
import { reviewKeys } from "@/lib/review/keys";
import { INSTRUMENT_RATIO, namesMatch, type ChecklistContext } from "@/lib/review/checklist";
import { DEVIATION_COMMENT_MIN, type SignoffInput } from "@/lib/review/validation";
import type { ReviewDto } from "@/lib/review/types";
import type { Verdict } from "@/lib/api-types";
import { FormError } from "@/app/_components/form";
import { buttonClass, inputClass } from "@/app/_components/field-form/controls";

const mm = (m: number) => `${(m * 1000).toFixed(1)} mm`;

type Values = {
  checkpoints: boolean;
  instrument: boolean;
  instrumentPrecisionMm: string;
  controlMark: boolean;
  controlMarkNote: string;
  profileFits: boolean;
  comment: string;
  typedName: string;
};

/** The QA lead's sign-off: four confirmations checked against the audit's figures, a comment when accepting with deviation, the typed name. */
export function SignoffForm({
  auditId,
  viewerName,
  context,
  verdict,
  surveyDatasetId = null,
}: {
  auditId: string;
  viewerName: string;
  context: ChecklistContext;
  verdict: Verdict;
  /** The audit's survey: its upload may carry a control-mark check, shown instead of the bare confirmation. */
  surveyDatasetId?: string | null;
}) {
  const { data: surveyRecord } = useSWR<{ record: SurveyRecordDto | null }>(
    surveyDatasetId ? `/api/datasets/${surveyDatasetId}/survey-record` : null,
    fetcher,
  );
  const markCheck = surveyRecord?.record?.instrumentCheck ? surveyRecord.record : null;
  const { mutate } = useSWRConfig();
  const [formError, setFormError] = useState<string | null>(null);
  const deviation = !verdict.passed;
  const failed = verdict.criteria.filter((c) => !c.passed);
  const tooFew = context.pairs < context.minCheckpoints;

  const schema = useMemo(
    () =>
      z
        .object({
          checkpoints: z.boolean(),
          instrument: z.boolean(),
          instrumentPrecisionMm: z.string(),
          controlMark: z.boolean(),
          controlMarkNote: z.string().max(300, "Keep it under 300 characters."),
          profileFits: z.boolean(),
          comment: z.string().max(2000, "Keep the comment under 2,000 characters."),
          typedName: z.string(),
        })
        .superRefine((v, ctx) => {
          const need = (path: keyof Values, ok: boolean, message: string) => {
            if (!ok) ctx.addIssue({ code: "custom", path: [path], message });
          };
          need("checkpoints", v.checkpoints, "Confirm the number of checkpoints.");
          need("instrument", v.instrument, "Confirm the survey instrument's precision.");
          need("controlMark", v.controlMark, "Confirm that the control mark was checked.");
          need("profileFits", v.profileFits, "Confirm that this is the right profile.");
          if (context.filePrecisionM === null) {
            const n = Number(v.instrumentPrecisionMm.replace(",", "."));
            need(
              "instrumentPrecisionMm",
              v.instrumentPrecisionMm.trim() !== "" && Number.isFinite(n) && n > 0,
              "Enter the instrument's stated precision in millimetres.",
            );
          }
          if (deviation)
            need(
              "comment",
              v.comment.trim().length >= DEVIATION_COMMENT_MIN,
              `Say why you accept it although criteria failed (at least ${DEVIATION_COMMENT_MIN} characters).`,
            );
          need("typedName", namesMatch(v.typedName, viewerName), `Type your name as on your account: ${viewerName}.`);
        }),
    [context.filePrecisionM, deviation, viewerName],
  );

  const {
    register,
    handleSubmit,
    watch,
    setValue,
    setError,
    formState: { errors, isSubmitting },
  } = useForm<Values>({
    resolver: zodResolver(schema),
    defaultValues: {
      checkpoints: false,
      instrument: false,
      instrumentPrecisionMm: "",
      controlMark: false,
      controlMarkNote: "",
      profileFits: false,
      comment: "",
      typedName: "",
    },
  });

  // A recorded control-mark check stands for the confirmation: confirmed unless it failed, its figures as the note.
  useEffect(() => {
    if (!markCheck?.instrumentCheck) return;
    setValue("controlMark", markCheck.instrumentCheck.word !== "fails");
    setValue("controlMarkNote", markEvidenceNote(markCheck));
  }, [markCheck, setValue]);

  const stated = watch("instrumentPrecisionMm");
  const precisionM =
    context.filePrecisionM ?? (Number(stated.replace(",", ".")) > 0 ? Number(stated.replace(",", ".")) / 1000 : null);
  const ratio = precisionM && context.tightestLimitM ? context.tightestLimitM / precisionM : null;

  async function onSubmit(v: Values) {
    setFormError(null);
    const body: SignoffInput = {
      checklist: {
        checkpoints: v.checkpoints,
        instrument: v.instrument,
        controlMark: v.controlMark,
        profileFits: v.profileFits,
        instrumentPrecisionMm:
          context.filePrecisionM === null ? Number(v.instrumentPrecisionMm.replace(",", ".")) : null,
        controlMarkNote: v.controlMarkNote.trim() || null,
      },
      comment: v.comment.trim() || null,
      typedName: v.typedName,
    };
    try {
      const res = await sendJson<{ review: ReviewDto }>(`/api/audits/${auditId}/signoff`, "POST", body);
      await mutate(reviewKeys.review(auditId), res, { revalidate: false });
      await mutate(reviewKeys.audit(auditId));
      await mutate(reviewKeys.activity(auditId));
      window.scrollTo({ top: 0, behavior: "smooth" });
    } catch (err) {
      const e = err as ApiError;
      let placed = false;
      for (const issue of (e.issues ?? []) as { path?: (string | number)[]; message: string }[]) {
        const key = String(issue.path?.at(-1) ?? "") as keyof Values;
        if (
          [
            "checkpoints",
            "instrument",
            "instrumentPrecisionMm",
            "controlMark",
            "profileFits",
            "comment",
            "typedName",
          ].includes(key)
        ) {
          setError(key, { message: issue.message });
          placed = true;
        }
      }
      if (!placed) setFormError(e.message);
    }
  }

  const box = (
    name: "checkpoints" | "instrument" | "controlMark" | "profileFits",
    title: string,
    detail: React.ReactNode,
    disabled = false,
  ) => (
    <div className="py-3" data-check={name}>
      <label className="flex gap-3">
        <input
          type="checkbox"
          className="mt-1 h-4 w-4 accent-leaf"
          disabled={disabled}
          {...register(name)}
          aria-describedby={errors[name] ? `${name}-error` : `${name}-detail`}
        />
        <span>
          <span className="block font-medium">{title}</span>
          <span id={`${name}-detail`} className="block text-sm text-ink-soft">
            {detail}
          </span>
        </span>
      </label>
      {errors[name] ? (
        <p id={`${name}-error`} className="ml-7 mt-1 text-sm text-alarm" data-field-error={name}>
          {errors[name]?.message}
        </p>
      ) : null}
    </div>
  );

  return (
    <form
      onSubmit={handleSubmit(onSubmit)}
      noValidate
      aria-label="Sign off"
      className="rounded-plot border border-chalk-line bg-white p-5"
      data-testid="signoff-form"
    >
      <h2 className="text-base font-semibold">Sign off</h2>
      <p className="mb-2 text-sm text-ink-soft">
        Signing fixes the audit, its two files and its results for good and records a SHA-256 of them all.
      </p>
      <FormError message={formError} />
      <fieldset className="divide-y divide-chalk-deep">
        <legend className="sr-only">Checklist</legend>
        {box(
          "checkpoints",
          "Enough checkpoints for this profile",
          tooFew ? (
            <span className="text-alarm">
              Only {context.pairs} paired; the profile asks for {context.minCheckpoints}. Return the audit for more
              checkpoints.
            </span>
          ) : (
            <>
              {context.pairs} paired; the profile asks for at least {context.minCheckpoints}.
            </>
          ),
          tooFew,
        )}
        {box(
          "instrument",
          `Survey instrument at least ${INSTRUMENT_RATIO}× more precise than the tolerance`,
          <>
            {context.filePrecisionM !== null ? (
              <>The survey file states {mm(context.filePrecisionM)}. </>
            ) : (
              <>The survey file states no precision; enter the instrument&apos;s below. </>
            )}
            {context.tightestLimitM !== null ? (
              <>
                The tightest limit is {mm(context.tightestLimitM)}, so {mm(context.tightestLimitM / INSTRUMENT_RATIO)}{" "}
                or better is needed.
              </>
            ) : null}
            {ratio !== null ? (
              <span className={ratio >= INSTRUMENT_RATIO ? " text-leaf" : " font-semibold text-alarm"}>
                {" "}
                Ratio {ratio.toFixed(1)}×.
              </span>
            ) : null}
          </>,
        )}
        {context.filePrecisionM === null ? (
          <div className="py-3 pl-7">
            <label htmlFor="instrumentPrecisionMm" className="mb-1 block text-sm font-medium">
              Instrument&apos;s stated horizontal precision (mm)
            </label>
            <input
              id="instrumentPrecisionMm"
              inputMode="decimal"
              className={`${inputClass(!!errors.instrumentPrecisionMm)} max-w-40`}
              {...register("instrumentPrecisionMm")}
            />
            {errors.instrumentPrecisionMm ? (
              <p className="mt-1 text-sm text-alarm" data-field-error="instrumentPrecisionMm">
                {errors.instrumentPrecisionMm.message}
              </p>
            ) : null}
          </div>
        ) : null}
        {markCheck ? (
          <div className="py-3" data-check="controlMark">
            <MarkEvidence record={markCheck} />
            {errors.controlMark ? (
              <p className="mt-1 text-sm text-alarm" data-field-error="controlMark">
                {errors.controlMark.message}
              </p>
            ) : null}
          </div>
        ) : (
          <>
            {box(
              "controlMark",
              "Control mark checked before the survey",
              <>
                The surveyor measured a known mark before the checkpoints and it agreed.{" "}
                <span className="text-loam" data-testid="control-mark-manual-note">
                  No control-mark check was recorded with this survey&apos;s upload: confirm it by hand.
                </span>
              </>,
            )}
            <div className="py-3 pl-7">
              <label htmlFor="controlMarkNote" className="mb-1 block text-sm font-medium">
                Which mark, and how far off (optional)
              </label>
              <input
                id="controlMarkNote"
                className={inputClass(!!errors.controlMarkNote)}
                placeholder="e.g. KF-03, 1.5 mm"
                {...register("controlMarkNote")}
              />
            </div>
          </>
        )}
        {box(
          "profileFits",
          "Right tolerance profile for the next operation",
          <>
            “{context.profileName}”: {context.operation}.
          </>,
        )}
      </fieldset>

      <div className="mt-4">
        {deviation ? (
          <div
            className="mb-2 rounded-plot border-l-4 border-stake bg-stake-pale p-3 text-sm"
            data-testid="deviation-note"
          >
            <p className="font-semibold">Accepting with deviation</p>
            <ul className="list-disc pl-5">
              {failed.map((c) => (
                <li key={c.id}>{c.text}</li>
              ))}
            </ul>
          </div>
        ) : null}
        <label htmlFor="comment" className="mb-1 block text-sm font-medium">
          {deviation ? "Why you accept it anyway (required)" : "Comment (optional)"}
        </label>
        <textarea
          id="comment"
          rows={3}
          className={inputClass(!!errors.comment)}
          {...register("comment")}
          aria-describedby={errors.comment ? "comment-error" : undefined}
        />
        {errors.comment ? (
          <p id="comment-error" className="mt-1 text-sm text-alarm" data-field-error="comment">
            {errors.comment.message}
          </p>
        ) : null}
      </div>

      <div className="mt-4">
        <label htmlFor="typedName" className="mb-1 block text-sm font-medium">
          Type your full name to sign ({viewerName})
        </label>
        <input
          id="typedName"
          autoComplete="off"
          className={`${inputClass(!!errors.typedName)} font-medium`}
          {...register("typedName")}
          aria-describedby={errors.typedName ? "typedName-error" : undefined}
        />
        {errors.typedName ? (
          <p id="typedName-error" className="mt-1 text-sm text-alarm" data-field-error="typedName">
            {errors.typedName.message}
          </p>
        ) : null}
      </div>
      <button type="submit" disabled={isSubmitting || tooFew} className={`${buttonClass.primary} mt-5`}>
        {isSubmitting ? "Signing…" : deviation ? "Sign off with deviation" : "Sign off"}
      </button>
    </form>
  );
}
