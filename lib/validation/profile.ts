import { z } from "zod";
import {
  confidenceSchema,
  hasAnyLimit,
  minCheckpointsSchema,
  NO_LIMIT_MESSAGE,
  profileNameSchema,
  requiredShareSchema,
  toleranceLimitSchema,
  toleranceProfileSchema,
} from "@/lib/audit/profile";

const operation = z.string().trim().min(1, "Say which operation will use the records.").max(200);
const note = z.string().trim().max(500).nullable();

/** A tolerance profile (lib/audit/profile.ts) with its bookkeeping. Limits in metres (null = not checked), requiredShare 0–1. */
export const ProfileInput = toleranceProfileSchema
  .extend({
    operation,
    note: note.default(null),
  })
  .refine(hasAnyLimit, { message: NO_LIMIT_MESSAGE, path: ["radialM"] });
export type ProfileInput = z.infer<typeof ProfileInput>;

/** Changes to a profile; the fields' rules are the profile's own. */
export const ProfilePatch = z.object({
  name: profileNameSchema.optional(),
  operation: operation.optional(),
  radialM: toleranceLimitSchema.optional(),
  crossM: toleranceLimitSchema.optional(),
  alongM: toleranceLimitSchema.optional(),
  requiredShare: requiredShareSchema.optional(),
  confidence: confidenceSchema.optional(),
  minCheckpoints: minCheckpointsSchema.optional(),
  note: note.optional(),
});
