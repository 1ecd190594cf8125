/** Reasons a QA lead can give when returning an audit (our wording). Pure. */
export const RETURN_REASONS = {
  too_few_checkpoints: "Too few checkpoints for this profile",
  instrument: "Survey instrument not precise enough for the tolerance",
  control_mark: "Control mark not checked before the survey",
  wrong_profile: "Wrong tolerance profile for the next operation",
  wrong_files: "Wrong or incomplete files",
  other: "Something else (see the comment)",
} as const;

export type ReturnReason = keyof typeof RETURN_REASONS;
export const RETURN_REASON_CODES = Object.keys(RETURN_REASONS) as [ReturnReason, ...ReturnReason[]];
