/**
 * Command line audit: `npm run audit -- --planted FILE --survey FILE [options]`.
 * Prints the JSON summary on stdout; bad input exits with code 2 and the messages on stderr.
 */
import { parseArgs } from "node:util";
import { z } from "zod";
import { formatIssue } from "@/geo";
import { GROUP_NAMES } from "@/lib/audit";
import { runPipeline } from "./pipeline";

const USAGE = `usage: npm run audit -- --planted FILE --survey FILE [options]

  --planted FILE          as-planted records (CSV or GeoJSON)
  --survey FILE           survey points (CSV or GeoJSON)
  --planted-crs CRS       CRS of the planted file: EPSG:n or a proj string (default: EPSG:4326 for lat/lon columns)
  --survey-crs CRS        CRS of the survey file (required for easting/northing)
  --work-crs CRS|auto     projected CRS to compare in (default auto: WGS 84 UTM zone of the data)
  --match auto|id|nearest pairing (default auto: by plant id, by position for the rest)
  --max-distance M        largest distance for pairing by position, metres (default 0.10)
  --tolerance M           radial tolerance, metres (share of plants within it)
  --row-bearing DEG       row direction, degrees clockwise from grid north (default: derived from the records)
  --group-by LIST         breakdowns, comma-separated: ${GROUP_NAMES.join(", ")}
  --timezone AREA/CITY    the field's time zone, for times without an offset and for grouping by day
  --out FILE              write the per-plant residuals CSV
  --timings               print stage timings (ms) on stderr
  --help                  this text
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
  match: z.enum(["auto", "id", "nearest"], { error: "--match must be auto, id or nearest" }).default("auto"),
  "max-distance": positive("--max-distance").default(0.1),
  tolerance: positive("--tolerance").optional(),
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
  const result = await runPipeline({
    planted: a.planted,
    survey: a.survey,
    plantedCrs: a["planted-crs"],
    surveyCrs: a["survey-crs"],
    workCrs: a["work-crs"],
    match: a.match,
    maxDistance: a["max-distance"],
    tolerance: a.tolerance,
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
  return 0;
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
