import { z } from "zod";

const notes = z.string().trim().max(1000, "At most 1000 characters.").nullable();

/** A planting machine. Working width in metres (0 < w ≤ 50), tool arms a whole number 1–64. */
export const MachineInput = z.object({
  name: z.string().trim().min(1, "Give the machine a name.").max(80, "At most 80 characters."),
  workingWidthM: z
    .number({ message: "workingWidthM must be a number of metres" })
    .gt(0, "The working width must be above 0 m.")
    .max(50, "The working width must be at most 50 m."),
  toolArms: z
    .number({ message: "toolArms must be a whole number" })
    .int("The number of tool arms must be a whole number.")
    .min(1, "A machine has at least 1 tool arm.")
    .max(64, "At most 64 tool arms."),
  receiverNotes: notes.default(null),
  cameraNotes: notes.default(null),
});
export type MachineInput = z.infer<typeof MachineInput>;

export const MachinePatch = MachineInput.partial();
export type MachinePatch = z.infer<typeof MachinePatch>;

/** The alert thresholds; null switches a threshold off. */
export const AlertRulesInput = z.object({
  armCrossOffsetM: z
    .number({ message: "armCrossOffsetM must be a number of metres or null" })
    .gt(0, "The cross-row offset limit must be above 0 mm.")
    .max(1, "The cross-row offset limit must be at most 1000 mm.")
    .nullable(),
  rmseRise: z
    .number({ message: "rmseRise must be a share (0.3 = 30 %) or null" })
    .gt(0, "The RMSE rise must be above 0 %.")
    .max(100, "The RMSE rise must be at most 10000 %.")
    .nullable(),
  failedVerdict: z.boolean({ message: "failedVerdict must be true or false" }),
});
export type AlertRulesInput = z.infer<typeof AlertRulesInput>;

/** Acknowledge (or re-open) an alert. */
export const AlertPatch = z.object({ acknowledged: z.boolean({ message: "acknowledged must be true or false" }) });
