/**
 * The command line's tolerance profile: a JSON file (`--profile FILE.json`) or the `--tolerance M`
 * shortcut, and the verdict as lines of text. Not pure (reads the file).
 */
import { readFileSync } from "node:fs";
import { z } from "zod";
import { hasAnyLimit, NO_LIMIT_MESSAGE, toleranceProfileSchema, type ToleranceProfile } from "@/lib/audit/profile";
import type { Verdict } from "@/lib/audit/verdict";

/**
 * A profile file: the profile's own keys (name, radialM, crossM, alongM, requiredShare, confidence,
 * minCheckpoints); the web app's bookkeeping keys are allowed, so a profile from `GET /api/profiles`
 * can be saved and used as it is. Any other key is refused, so a misspelt limit is never ignored.
 */
const profileFileSchema = toleranceProfileSchema
  .extend({
    id: z.string().optional(),
    operation: z.string().optional(),
    note: z.string().nullable().optional(),
    builtIn: z.boolean().optional(),
    updatedAt: z.string().optional(),
  })
  .strict()
  .refine(hasAnyLimit, { message: NO_LIMIT_MESSAGE, path: ["radialM"] });

/**
 * Reads and checks a profile file. Throws `--profile FILE: <field>: <message>` for a file that cannot
 * be read, is not JSON or does not describe a profile.
 */
export function readProfileFile(file: string): ToleranceProfile {
  let text: string;
  try {
    text = readFileSync(file, "utf8");
  } catch (e) {
    throw new Error(
      `--profile ${file}: cannot read the file (${(e as NodeJS.ErrnoException).code ?? (e as Error).message})`,
    );
  }
  let json: unknown;
  try {
    json = JSON.parse(text);
  } catch (e) {
    throw new Error(`--profile ${file}: not valid JSON (${(e as Error).message})`);
  }
  const parsed = profileFileSchema.safeParse(json);
  if (!parsed.success) {
    const text = parsed.error.issues
      .map((i) => {
        const where = i.path.join(".");
        if (i.code === "unrecognized_keys") return `unknown field${i.keys.length > 1 ? "s" : ""} ${i.keys.join(", ")}`;
        return where ? `${where}: ${i.message}` : i.message;
      })
      .join("; ");
    throw new Error(`--profile ${file}: ${text}`);
  }
  const { name, radialM, crossM, alongM, requiredShare, confidence, minCheckpoints } = parsed.data;
  return { name, radialM, crossM, alongM, requiredShare, confidence, minCheckpoints };
}

/**
 * The verdict as text: a headline, then one line per criterion.
 *
 * @example
 * verdict: FAILED against profile "In-row weeding"
 *   pass  checkpoints  89 checkpoints paired; the profile asks for at least 20
 *   FAIL  radial       95 % of radial errors within 11.2 mm; limit 10.0 mm
 */
export function verdictText(verdict: Verdict, profile: ToleranceProfile): string {
  const width = Math.max(...verdict.criteria.map((c) => c.id.length));
  const lines = [`verdict: ${verdict.passed ? "PASSED" : "FAILED"} against profile "${profile.name}"`];
  for (const c of verdict.criteria) lines.push(`  ${c.passed ? "pass" : "FAIL"}  ${c.id.padEnd(width)}  ${c.text}`);
  return `${lines.join("\n")}\n`;
}
