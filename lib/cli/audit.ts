/**
 * Command line audit: `npm run audit -- --planted FILE --survey FILE [options]`.
 * Prints the JSON summary (with the verdict) on stdout and the verdict as text on stderr; bad input
 * exits with code 2 and the messages on stderr.
 */
import { parseArgs } from "node:util";
import { z } from "zod";
import { formatIssue } from "@/geo";
import { GROUP_NAMES } from "@/lib/audit";
import { radialToleranceProfile, TOLERANCE_LIMIT_CEILING_M, type ToleranceProfile } from "@/lib/audit/profile";
import { DEFAULT_MAX_PAIR_DISTANCE_M, MATCH_MODES, MAX_PAIR_DISTANCE_CEILING_M } from "@/lib/audit/settings";
import { runPipeline } from "./pipeline";
import { readProfileFile, verdictText } from "./profile-file";

/** Exit code of a computed audit whose verdict failed, with --fail-on-verdict. */
const EXIT_VERDICT_FAILED = 3;

const USAGE = `usage: npm run audit -- --planted FILE --survey FILE [options]

  --planted FILE          as-planted records (CSV or GeoJSON)
  --survey FILE           survey points (CSV or GeoJSON)
  --planted-crs CRS       CRS of the planted file: EPSG:n or a proj string (default: EPSG:4326 for lat/lon columns)
  --survey-crs CRS        CRS of the survey file (required for easting/northing)
  --work-crs CRS|auto     projected CRS to compare in (default auto: WGS 84 UTM zone of the data)
  --match auto|id|nearest pairing (default auto: by plant id, by position for the rest)
  --max-distance M        largest distance for pairing by position, metres (default ${DEFAULT_MAX_PAIR_DISTANCE_M}, at most ${MAX_PAIR_DISTANCE_CEILING_M})
  --profile FILE.json     tolerance profile to judge the audit against: { "name", "radialM", "crossM", "alongM"
                          (metres or null; at least one set), "requiredShare" (0-1), "confidence" (default 0.95),
                          "minCheckpoints" }; a profile saved from GET /api/profiles works as it is
  --tolerance M           shortcut for a profile with only a radial limit of M metres: 95 % of radial errors
                          within M, the share within M at least 95 % at 95 % confidence, at least 20 checkpoints
  --fail-on-verdict       exit with code ${EXIT_VERDICT_FAILED} when the verdict fails (default: exit 0 for any computed audit)
  --row-bearing DEG       row direction, degrees clockwise from grid north (default: derived from the records)
  --group-by LIST         breakdowns, comma-separated: ${GROUP_NAMES.join(", ")}
  --timezone AREA/CITY    the field's time zone, for times without an offset and for grouping by day
  --out FILE              write the per-plant residuals CSV
  --timings               print stage timings (ms) on stderr
  --help                  this text

Output: the JSON summary on stdout, with "verdict" (null without --profile or --tolerance) and "run"
(the inputs and the profile used); with a profile, the verdict as text on stderr, one line per criterion.
Exit codes: 0 audit computed (whatever the verdict), 2 bad input, ${EXIT_VERDICT_FAILED} verdict failed with
--fail-on-verdict, 1 unexpected error.
`;

const positive = (name: string) =>
  z.coerce
    .number({ error: `${name} must be a number` })
    .refine((v) => Number.isFinite(v) && v > 0, `${name} must be a positive number of metres`);

const argsSchema = z.object({
  planted: z.string({ error: "--planted FILE is required" }).min(1),
  survey: z.string({ error: "--survey FILE is required" }).min(1),
  "planted-crs": z.string().min(1).optional(),
  "survey-crs": z.string().min(1).optional(),
  "work-crs": z.string().min(1).default("auto"),
  match: z.enum(MATCH_MODES, { error: "--match must be auto, id or nearest" }).default("auto"),
  "max-distance": positive("--max-distance")
    .refine((v) => v <= MAX_PAIR_DISTANCE_CEILING_M, `--max-distance must be at most ${MAX_PAIR_DISTANCE_CEILING_M} m`)
    .default(DEFAULT_MAX_PAIR_DISTANCE_M),
  tolerance: positive("--tolerance")
    .refine((v) => v <= TOLERANCE_LIMIT_CEILING_M, `--tolerance must be at most ${TOLERANCE_LIMIT_CEILING_M} m`)
    .optional(),
  profile: z.string().min(1).optional(),
  "fail-on-verdict": z.boolean().optional(),
  "row-bearing": z.coerce
    .number({ error: "--row-bearing must be a number of degrees" })
    .refine(Number.isFinite, "--row-bearing must be a number of degrees")
    .optional(),
  "group-by": z
    .string()
    .optional()
    .transform((s, ctx) => {
      const names = (s ?? "")
        .split(",")
        .map((x) => x.trim())
        .filter(Boolean);
      for (const n of names) {
        if (!(GROUP_NAMES as readonly string[]).includes(n)) {
          ctx.addIssue({
            code: "custom",
            message: `--group-by: unknown "${n}"; expected some of ${GROUP_NAMES.join(", ")}`,
          });
        }
      }
      return names as (typeof GROUP_NAMES)[number][];
    }),
  timezone: z.string().min(1).optional(),
  out: z.string().min(1).optional(),
  timings: z.boolean().optional(),
});

async function main(argv: string[]): Promise<number> {
  let values: Record<string, string | boolean | undefined>;
  try {
    ({ values } = parseArgs({
      args: argv,
      strict: true,
      allowPositionals: false,
      options: {
        planted: { type: "string" },
        survey: { type: "string" },
        "planted-crs": { type: "string" },
        "survey-crs": { type: "string" },
        "work-crs": { type: "string" },
        match: { type: "string" },
        "max-distance": { type: "string" },
        tolerance: { type: "string" },
        profile: { type: "string" },
        "fail-on-verdict": { type: "boolean" },
        "row-bearing": { type: "string" },
        "group-by": { type: "string" },
        timezone: { type: "string" },
        out: { type: "string" },
        timings: { type: "boolean" },
        help: { type: "boolean" },
      },
    }));
  } catch (e) {
    process.stderr.write(`error: ${(e as Error).message}\n\n${USAGE}`);
    return 2;
  }
  if (values.help) {
    process.stdout.write(USAGE);
    return 0;
  }
  const parsed = argsSchema.safeParse(values);
  if (!parsed.success) {
    for (const i of parsed.error.issues) process.stderr.write(`error: ${i.message}\n`);
    process.stderr.write(`\n${USAGE}`);
    return 2;
  }
  const a = parsed.data;
  if (a["group-by"].includes("day") && !a.timezone) {
    process.stderr.write("error: --group-by day needs --timezone (the field's time zone, e.g. Europe/Berlin)\n");
    return 2;
  }
  if (a.profile && a.tolerance !== undefined) {
    process.stderr.write("error: give either --profile or --tolerance, not both\n");
    return 2;
  }
  let profile: ToleranceProfile | null = null;
  try {
    if (a.profile) profile = readProfileFile(a.profile);
    else if (a.tolerance !== undefined) profile = radialToleranceProfile(a.tolerance);
  } catch (e) {
    process.stderr.write(`error: ${(e as Error).message}\n`);
    return 2;
  }
  const result = await runPipeline({
    planted: a.planted,
    survey: a.survey,
    plantedCrs: a["planted-crs"],
    surveyCrs: a["survey-crs"],
    workCrs: a["work-crs"],
    match: a.match,
    maxDistanceM: a["max-distance"],
    profile,
    rowBearing: a["row-bearing"],
    groupBy: a["group-by"],
    timeZone: a.timezone,
    out: a.out,
  });
  for (const issue of result.issues) process.stderr.write(`${formatIssue(issue)}\n`);
  if (a.timings)
    process.stderr.write(
      `timings (ms): ${JSON.stringify(result.timings, (_, v) => (typeof v === "number" ? Math.round(v) : v))}\n`,
    );
  if (result.exitCode !== 0 || !result.report) return result.exitCode;
  process.stdout.write(`${JSON.stringify(result.report, null, 2)}\n`);
  const verdict = result.report.verdict;
  if (verdict && profile) process.stderr.write(verdictText(verdict, profile));
  return verdict && !verdict.passed && a["fail-on-verdict"] ? EXIT_VERDICT_FAILED : 0;
}

main(process.argv.slice(2)).then(
  (code) => {
    process.exitCode = code;
  },
  (e: unknown) => {
    process.stderr.write(`error: ${e instanceof Error ? e.message : String(e)}\n`);
    process.exitCode = 1;
  },
);
