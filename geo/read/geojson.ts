import { IssueCollector } from "../validate/issues";
import { MAX_FIELD_CHARS, type ReadOptions, type ReadResult } from "./csv";
import { planColumns, type ColumnGuess, type CoordinateKind } from "./columns";
import { RowSink, tallyIssues } from "./sink";
import { encodingIssue, NotTextError, readAllText, type TextInput, type TextReport } from "./text";

const FEATURE_ID = "@id";

/**
 * Reads a GeoJSON FeatureCollection of Point features; each feature's properties are its columns
 * (the same header names as CSV are recognised) and `line` is the 1-based feature number.
 *
 * The whole text is held and parsed with JSON.parse (GeoJSON is not streamed; large point sets are
 * expected as CSV). Coordinates are `[x, y]` = `[longitude, latitude]` per RFC 7946 §3.1.1, or
 * easting/northing when the file's legacy `crs` member names a projected EPSG code, the mapping says
 * `coordinates: "projected"`, or any |x| > 180 or |y| > 90. A feature's top-level `id` is used as the
 * plant id when no property is recognised as one.
 *
 * @example
 * await readGeoJson('{"type":"FeatureCollection","features":[{"type":"Feature","geometry":{"type":"Point","coordinates":[9.2,52.1]},"properties":{"plant_id":"P1"}}]}', { source: "p.geojson", role: "planted" })
 */
export async function readGeoJson(input: TextInput, options: ReadOptions): Promise<ReadResult> {
  const issues = new IssueCollector(options.issueCap);
  const file = options.source;
  const empty: ColumnGuess = { header: [], columns: {}, coordinates: null, rawCoordinates: null, unused: [] };
  let doc: unknown;
  const encoding: TextReport = { encoding: "utf-8", firstNonAsciiLine: -1, firstNonAsciiText: "" };
  try {
    const text = await readAllText(input, encoding);
    if (text.trim() === "") {
      issues.add({
        severity: "error",
        code: "file-empty",
        file,
        message: "the file is empty; expected a GeoJSON FeatureCollection of points",
      });
      return { table: null, issues: issues.finish(), columns: empty };
    }
    doc = JSON.parse(text);
  } catch (e) {
    issues.add({
      severity: "error",
      code: e instanceof NotTextError ? e.code : e instanceof SyntaxError ? "geojson-invalid" : "file-unreadable",
      file,
      line: e instanceof NotTextError ? e.line : undefined,
      message: e instanceof SyntaxError ? `not valid JSON: ${e.message}` : e instanceof Error ? e.message : String(e),
    });
    return { table: null, issues: issues.finish(), columns: empty };
  }
  const notUtf8 = encodingIssue(encoding, file);
  if (notUtf8) issues.add({ ...notUtf8, line: undefined });
  const fc = doc as { type?: unknown; features?: unknown; crs?: { properties?: { name?: unknown } } };
  if (!fc || typeof fc !== "object" || fc.type !== "FeatureCollection" || !Array.isArray(fc.features)) {
    issues.add({
      severity: "error",
      code: "geojson-not-feature-collection",
      file,
      message: 'expected a GeoJSON object with "type": "FeatureCollection" and a "features" array',
    });
    return { table: null, issues: issues.finish(), columns: empty };
  }
  const features = fc.features as {
    type?: unknown;
    id?: unknown;
    geometry?: { type?: unknown; coordinates?: unknown } | null;
    properties?: Record<string, unknown> | null;
  }[];

  // Header = union of property keys in first-seen order (+ the feature id as a pseudo column).
  const keys: string[] = [];
  const seen = new Set<string>();
  let anyFeatureId = false;
  for (const f of features) {
    if (f && f.id !== undefined && f.id !== null) anyFeatureId = true;
    const p = f?.properties;
    if (p && typeof p === "object")
      for (const k of Object.keys(p))
        if (!seen.has(k)) {
          seen.add(k);
          keys.push(k);
        }
  }
  let crsHint: string | undefined;
  const crsName = fc.crs?.properties?.name;
  if (typeof crsName === "string") {
    const m = /EPSG:{1,2}(?:[\d.]*:)?(\d+)/i.exec(crsName);
    if (m) crsHint = `EPSG:${m[1]}`;
    else if (/CRS84/i.test(crsName)) crsHint = "EPSG:4326";
  }

  let kind: CoordinateKind | undefined = options.mapping?.coordinates;
  if (!kind) {
    if (crsHint && crsHint !== "EPSG:4326" && crsHint !== "EPSG:4258")
      kind = /^EPSG:(4\d{3})$/.test(crsHint) ? "geographic" : "projected";
    else {
      kind = "geographic";
      for (const f of features) {
        const c = f?.geometry?.coordinates;
        if (
          Array.isArray(c) &&
          typeof c[0] === "number" &&
          typeof c[1] === "number" &&
          (Math.abs(c[0]) > 180 || Math.abs(c[1]) > 90)
        ) {
          kind = "projected";
          break;
        }
      }
    }
  }

  const header = [...keys];
  const mapping = { ...options.mapping };
  // "@id" in a mapping (as stored after a first read) names the features' own ids.
  const featureIdAsked = mapping.id === FEATURE_ID;
  if (featureIdAsked) delete mapping.id;
  const plan0 = planColumns(header, { ...mapping, coordinates: kind }, { role: options.role });
  if (featureIdAsked || (plan0.index.id < 0 && anyFeatureId && mapping.id === undefined)) {
    header.push(FEATURE_ID);
    mapping.id = FEATURE_ID;
  }
  // x/y come from the geometry: give them a pseudo column so planning does not report them missing.
  header.push("@x", "@y");
  const plan = planColumns(header, { ...mapping, x: "@x", y: "@y", coordinates: kind }, { role: options.role });
  for (const p of plan.problems) issues.add({ ...p, file });
  const columns: ColumnGuess = {
    ...plan.guess,
    header: header.filter((h) => h !== "@x" && h !== "@y"),
    coordinates: kind,
  };
  columns.columns = { ...columns.columns, x: "geometry", y: "geometry" };
  columns.unused = columns.unused.filter((h) => h !== "@x" && h !== "@y");
  if (issues.hasErrors()) return { table: null, issues: issues.finish(), columns, crsHint };

  const sink = new RowSink(
    plan,
    { source: file, role: options.role, timeZone: options.timeZone, decimalComma: false },
    issues,
  );
  const row: string[] = new Array(header.length).fill("");
  for (let i = 0; i < features.length; i++) {
    const f = features[i];
    const line = i + 1;
    const g = f?.geometry;
    if (f?.type !== "Feature") {
      issues.add({
        severity: "error",
        code: "geojson-not-feature",
        file,
        line,
        message: 'expected an object with "type": "Feature"',
      });
      continue;
    }
    if (g === null || g === undefined) {
      const p = f.properties ?? {};
      for (let k = 0; k < keys.length; k++) row[k] = cellText(p[keys[k]]);
      if (header[keys.length] === FEATURE_ID) row[keys.length] = cellText(f.id);
      if (sink.addWithoutPosition(row, line)) continue;
      issues.add({
        severity: "warning",
        code: "coordinate-missing",
        file,
        line,
        column: "geometry",
        message: "the feature has no geometry; it is left out",
      });
      continue;
    }
    if (g.type !== "Point") {
      issues.add({
        severity: "error",
        code: "geometry-not-point",
        file,
        line,
        column: "geometry",
        value: String(g.type),
        message: "expected a Point geometry (one plant per feature)",
      });
      continue;
    }
    const c = g.coordinates;
    if (!Array.isArray(c) || c.length < 2 || typeof c[0] !== "number" || typeof c[1] !== "number") {
      issues.add({
        severity: "error",
        code: "coordinate-not-numeric",
        file,
        line,
        column: "geometry",
        value: JSON.stringify(c)?.slice(0, 80) ?? "undefined",
        message: "expected coordinates [x, y] as two numbers",
      });
      continue;
    }
    const p = f.properties ?? {};
    for (let k = 0; k < keys.length; k++) row[k] = cellText(p[keys[k]]);
    if (header[keys.length] === FEATURE_ID) row[keys.length] = cellText(f.id);
    const long = row.findIndex((v) => v.length > MAX_FIELD_CHARS);
    if (long >= 0) {
      issues.add({
        severity: "error",
        code: "field-too-long",
        file,
        line,
        column: header[long],
        value: `${row[long].slice(0, 40)}…`,
        message: `the value is ${row[long].length.toLocaleString("en")} characters long; a value may be at most ${MAX_FIELD_CHARS.toLocaleString("en")}`,
      });
      continue;
    }
    sink.add(row, line, c[0], c[1]);
  }
  const table = sink.finish();
  issues.addAll(tallyIssues(sink.tally(), file));
  if (table.length === 0 && !issues.hasErrors()) {
    issues.add({
      severity: "error",
      code: "file-no-rows",
      file,
      message: "the FeatureCollection has no point features",
    });
  }
  const list = issues.finish();
  return {
    table: list.some((x) => x.severity === "error") ? null : table,
    issues: list,
    columns,
    crsHint,
    recordedMissing: sink.recorded(),
  };
}

function cellText(v: unknown): string {
  if (v === null || v === undefined) return "";
  if (typeof v === "string") return v;
  if (typeof v === "number" || typeof v === "boolean") return String(v);
  return JSON.stringify(v);
}
