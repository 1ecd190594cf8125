import { z } from "zod";

const limit = z
  .number()
  .positive("Must be more than 0.")
  .max(1, "Limits are in metres; 1 m is the largest accepted.")
  .nullable();

/** A tolerance profile. Limits in metres (null = not checked), requiredShare 0–1. */
export const ProfileInput = z
  .object({
    name: z.string().trim().min(1, "Give the profile a name.").max(80),
    operation: z.string().trim().min(1, "Say which operation will use the records.").max(200),
    radialM: limit.default(null),
    crossM: limit.default(null),
    alongM: limit.default(null),
    requiredShare: z.number().gt(0, "Must be more than 0 %.").max(1, "At most 100 %."),
    confidence: z.number().min(0.5, "At least 50 %.").max(0.999, "At most 99.9 %.").default(0.95),
    minCheckpoints: z.number().int().min(1).max(100_000),
    note: z.string().trim().max(500).nullable().default(null),
  })
  .refine((p) => p.radialM !== null || p.crossM !== null || p.alongM !== null, {
    message: "Set at least one limit (radial, cross-row or along-row).",
    path: ["radialM"],
  });
export type ProfileInput = z.infer<typeof ProfileInput>;

export const ProfilePatch = z.object({
  name: z.string().trim().min(1).max(80).optional(),
  operation: z.string().trim().min(1).max(200).optional(),
  radialM: limit.optional(),
  crossM: limit.optional(),
  alongM: limit.optional(),
  requiredShare: z.number().gt(0).max(1).optional(),
  confidence: z.number().min(0.5).max(0.999).optional(),
  minCheckpoints: z.number().int().min(1).max(100_000).optional(),
  note: z.string().trim().max(500).nullable().optional(),
});
