/** zod schemas of the review API's bodies; the forms use the same ones. */
import { z } from "zod";
import { MATCH_MODES, maxDistanceMSchema, rowBearingDegSchema } from "@/lib/audit/settings";
import { RecordId } from "@/lib/validation/ids";
import { RETURN_REASON_CODES } from "./return-reasons";

export const SubmitInput = z.object({
  note: z.string().trim().max(1000, "Keep the note under 1,000 characters.").nullable().optional(),
});
export type SubmitInput = z.infer<typeof SubmitInput>;

export const SignoffInput = z.object({
  checklist: z.object({
    checkpoints: z.boolean(),
    instrument: z.boolean(),
    instrumentPrecisionMm: z
      .number()
      .positive("Must be more than 0 mm.")
      .max(1000, "At most 1000 mm.")
      .nullable()
      .optional(),
    controlMark: z.boolean(),
    controlMarkNote: z.string().trim().max(300, "Keep it under 300 characters.").nullable().optional(),
    profileFits: z.boolean(),
  }),
  comment: z.string().trim().max(2000, "Keep the comment under 2,000 characters.").nullable().optional(),
  typedName: z.string().trim().min(1, "Type your name to sign.").max(200),
});
export type SignoffInput = z.infer<typeof SignoffInput>;

/** A deviation (some criterion failed) needs a reason of at least this many characters. */
export const DEVIATION_COMMENT_MIN = 10;

export const ReturnInput = z.object({
  reasons: z.array(z.enum(RETURN_REASON_CODES)).min(1, "Pick at least one reason.").max(RETURN_REASON_CODES.length),
  comment: z
    .string()
    .trim()
    .min(10, "Say what needs correcting (at least 10 characters).")
    .max(2000, "Keep the comment under 2,000 characters."),
});
export type ReturnInput = z.infer<typeof ReturnInput>;

/** A corrected revision: what changes compared with the returned audit (anything left out stays). */
export const ReviseInput = z.object({
  plantedDatasetId: RecordId.optional(),
  surveyDatasetId: RecordId.optional(),
  profileId: RecordId.optional(),
  match: z.enum(MATCH_MODES).optional(),
  maxDistanceM: maxDistanceMSchema.optional(),
  rowBearingDeg: rowBearingDegSchema.optional(),
  title: z.string().trim().min(1).max(120).optional(),
});
export type ReviseInput = z.infer<typeof ReviseInput>;
