import { datumShiftBetween, listCrs, type CrsEntry } from "../crs/registry";
import { convertPoint, medianOf } from "../project";
import type { InputIssue, PointTable, ProjectedTable } from "../types";
import { IssueCollector } from "./issues";

/** Options of `validateFiles`. */
export interface FilesCheckOptions {
  /** Median positions of the two files farther apart than this (metres) is an error. Default 5000. */
  maxCentreDistance?: number;
  /** A point farther than this from its own file's median (metres) is a warning. Default 10 000. */
  strayDistance?: number;
  issueCap?: number;
}

/** A file as read (source CRS) and as projected into the work CRS. */
export interface FileInCrs {
  source: PointTable;
  crs: CrsEntry;
  projected: ProjectedTable;
}

/**
 * Checks the two projected files against each other. Any error means no result.
 *
 * - Positions that could not be projected (NaN) are errors with their lines.
 * - The files' median positions more than `maxCentreDistance` apart (default 5 km) is an error
 *   naming both files and the distance; each file is then re-tried with its axes swapped, its values
 *   divided by 1000 and every other bundled CRS, and a hypothesis that brings it within reach of the
 *   other file is named ("did you mean EPSG:25832?").
 * - A warning for points farther than `strayDistance` from their file's median (e.g. 0,0 fixes).
 * - A warning when the files' CRSs are on different datums (7-parameter shifts are good to about a metre).
 *
 * @example validateFiles(planted, survey) // [] when both lie on the same field
 */
export function validateFiles(planted: FileInCrs, survey: FileInCrs, options: FilesCheckOptions = {}): InputIssue[] {
  const issues = new IssueCollector(options.issueCap);
  const maxD = options.maxCentreDistance ?? 5000;
  const stray = options.strayDistance ?? 10_000;
  const work = planted.projected.crs;

  for (const f of [planted, survey]) {
    const p = f.projected;
    for (let i = 0; i < p.length; i++) {
      const x = p.x[i],
        y = p.y[i];
      if (!(x - x === 0) || !(y - y === 0)) {
        issues.add({
          severity: "error",
          code: "projection-failed",
          file: p.source,
          line: p.line[i],
          value: `${f.source.x[i]}, ${f.source.y[i]}`,
          message: `this position cannot be converted from ${f.crs.code} to ${work}`,
        });
      }
    }
  }
  if (issues.hasErrors()) return issues.finish();

  const cp = [medianOf(planted.projected.x), medianOf(planted.projected.y)];
  const cs = [medianOf(survey.projected.x), medianOf(survey.projected.y)];
  const d = Math.hypot(cp[0] - cs[0], cp[1] - cs[1]);
  if (d > maxD) {
    const hints = [diagnose(survey, cp, work, maxD), diagnose(planted, cs, work, maxD)].filter(Boolean);
    issues.add({
      severity: "error",
      code: "files-far-apart",
      file: survey.projected.source,
      message:
        `the survey points in ${survey.projected.source} (${survey.crs.code}) lie ${(d / 1000).toFixed(1)} km from the as-planted records in ` +
        `${planted.projected.source} (${planted.crs.code}); expected the same field. Check the CRS chosen for each file.` +
        (hints.length ? ` ${hints.join(" ")}` : ""),
    });
    return issues.finish();
  }

  for (const f of [planted, survey]) {
    const p = f.projected;
    const mx = medianOf(p.x),
      my = medianOf(p.y);
    let count = 0;
    const lines: number[] = [];
    const stray2 = stray * stray;
    for (let i = 0; i < p.length; i++) {
      const dx = p.x[i] - mx,
        dy = p.y[i] - my;
      if (dx * dx + dy * dy > stray2) {
        count++;
        if (lines.length < 20) lines.push(p.line[i]);
      }
    }
    if (count > 0) {
      issues.add({
        severity: "warning",
        code: "point-far-from-others",
        file: p.source,
        line: lines[0],
        message: `${count} point(s) lie more than ${(stray / 1000).toFixed(0)} km from the rest of the file (lines ${lines.join(", ")}${count > lines.length ? ", …" : ""}), e.g. positions recorded without a fix`,
      });
    }
  }

  if (datumShiftBetween(planted.crs.proj4, survey.crs.proj4)) {
    issues.add({
      severity: "warning",
      code: "datum-shift",
      file: survey.projected.source,
      message: `${planted.projected.source} is in ${planted.crs.code} (${planted.crs.name}) and ${survey.projected.source} in ${survey.crs.code} (${survey.crs.name}), on different datums; the datum shift between them is an approximation good to about a metre, which enters the audit as a bias. Use one datum for both files where possible`,
    });
  }
  return issues.finish();
}

/** Tries swapped axes, millimetres and other bundled CRSs for a file; returns a hint or "". */
function diagnose(f: FileInCrs, target: number[], work: string, maxD: number): string {
  const sx = medianOf(f.source.x),
    sy = medianOf(f.source.y);
  const near = (x: number, y: number, from: CrsEntry | string) => {
    try {
      const [e, n] = convertPoint(x, y, from, work);
      return Number.isFinite(e) && Math.hypot(e - target[0], n - target[1]) <= maxD;
    } catch {
      return false;
    }
  };
  const name = f.projected.source;
  if (near(sy, sx, f.crs)) return `In ${name} the two coordinate columns look swapped.`;
  if (f.crs.kind === "projected" && near(sx / 1000, sy / 1000, f.crs))
    return `The values in ${name} look like millimetres.`;
  const fits = listCrs()
    .filter((c) => c.code !== f.crs.code && near(sx, sy, c))
    .map((c) => `${c.code} (${c.name})`);
  if (fits.length) return `${name} fits the other file if its CRS is ${fits.slice(0, 3).join(" or ")}.`;
  return "";
}
