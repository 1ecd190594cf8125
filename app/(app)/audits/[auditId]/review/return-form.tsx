"use client";
import { useState } from "react";
import { useForm } from "react-hook-form";
import { zodResolver } from "@hookform/resolvers/zod";
import { useSWRConfig } from "swr";
import { type ApiError, sendJson } from "@/lib/fetcher";
import { reviewKeys } from "@/lib/review/keys";
import { RETURN_REASONS, RETURN_REASON_CODES } from "@/lib/review/return-reasons";
import { ReturnInput } from "@/lib/review/validation";
import type { ReviewDto } from "@/lib/review/types";
import { FormError } from "@/app/_components/form";
import { inputClass } from "@/app/_components/field-form/controls";

/** Send the audit back to the technician with reasons. */
export function ReturnForm({ auditId }: { auditId: string }) {
  const { mutate } = useSWRConfig();
  const [formError, setFormError] = useState<string | null>(null);
  const {
    register,
    handleSubmit,
    formState: { errors, isSubmitting },
  } = useForm<ReturnInput>({
    resolver: zodResolver(ReturnInput),
    defaultValues: { reasons: [], comment: "" },
  });

  async function onSubmit(v: ReturnInput) {
    setFormError(null);
    try {
      const res = await sendJson<{ review: ReviewDto }>(`/api/audits/${auditId}/return`, "POST", v);
      await mutate(reviewKeys.review(auditId), res, { revalidate: false });
      await mutate(reviewKeys.audit(auditId));
      await mutate(reviewKeys.activity(auditId));
    } catch (err) {
      setFormError((err as ApiError).message);
    }
  }

  return (
    <form
      onSubmit={handleSubmit(onSubmit)}
      noValidate
      aria-label="Return for correction"
      className="rounded-plot border border-chalk-line bg-white p-5"
      data-testid="return-form"
    >
      <h2 className="text-base font-semibold">Return for correction</h2>
      <p className="mb-3 text-sm text-ink-soft">
        The technician and the growers get an e-mail with your reasons; the technician re-runs it as a new revision.
      </p>
      <FormError message={formError} />
      <fieldset className="mb-3">
        <legend className="mb-1 text-sm font-medium">Reasons</legend>
        {RETURN_REASON_CODES.map((code) => (
          <label key={code} className="flex items-center gap-2 py-0.5 text-sm">
            <input type="checkbox" value={code} className="h-4 w-4 accent-alarm" {...register("reasons")} />
            {RETURN_REASONS[code]}
          </label>
        ))}
        {errors.reasons ? (
          <p className="mt-1 text-sm text-alarm" data-field-error="reasons">
            {errors.reasons.message}
          </p>
        ) : null}
      </fieldset>
      <label htmlFor="returnComment" className="mb-1 block text-sm font-medium">
        What needs correcting
      </label>
      <textarea id="returnComment" rows={3} className={inputClass(!!errors.comment)} {...register("comment")} />
      {errors.comment ? (
        <p className="mt-1 text-sm text-alarm" data-field-error="returnComment">
          {errors.comment.message}
        </p>
      ) : null}
      <button
        type="submit"
        disabled={isSubmitting}
        className="mt-4 rounded-plot border border-alarm bg-white px-4 py-2 font-medium text-alarm hover:bg-alarm-pale disabled:opacity-60"
      >
        {isSubmitting ? "Returning…" : "Return for correction"}
      </button>
    </form>
  );
}
